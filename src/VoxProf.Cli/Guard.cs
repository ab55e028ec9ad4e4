using VoxProf.Core;

namespace VoxProf.Cli;

/// <summary>The one place where exceptions turn into a one-line message and an exit code.</summary>
public static class Guard
{
    public static int Run(TextWriter error, Func<int> body)
    {
        try
        {
            return body();
        }
        catch (InputException ex)
        {
            error.WriteLine($"voxprof: error: {ex.Message}");
            return ExitCodes.BadInput;
        }
        catch (IOException ex)
        {
            error.WriteLine($"voxprof: error: {ex.Message}");
            return ExitCodes.BadInput;
        }
        catch (UnauthorizedAccessException ex)
        {
            error.WriteLine($"voxprof: error: {ex.Message}");
            return ExitCodes.BadInput;
        }
        catch (Exception ex)
        {
            error.WriteLine($"voxprof: internal error: {ex.GetType().Name}: {ex.Message}");
            if (Environment.GetEnvironmentVariable("VOXPROF_DEBUG") is { Length: > 0 })
                error.WriteLine(ex);
            return ExitCodes.InternalError;
        }
    }
}
