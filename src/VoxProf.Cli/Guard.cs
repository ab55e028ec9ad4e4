using VoxProf.Core;
using VoxProf.Core.Limits;
using VoxProf.Core.Strategies;

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
        catch (LimitException ex)
        {
            WriteError(error, ex.Message + SceneOptions.Hint(ex.Kind));
            return ExitCodes.BadInput;
        }
        catch (StrategyCompileException ex)
        {
            // The compiler's own lines, which editors and CI logs link to the place, then one line of ours.
            foreach (string line in ex.Errors)
                error.WriteLine(MessageText.ForDisplay(line));
            WriteError(error, ex.Message);
            return ExitCodes.BadInput;
        }
        catch (Exception ex) when (ex is InputException or IOException or UnauthorizedAccessException)
        {
            WriteError(error, ex.Message);
            return ExitCodes.BadInput;
        }
        catch (OutOfMemoryException)
        {
            // The estimates refuse runs that cannot fit before they start (docs/reports.md); this is the last resort
            // when the machine's memory ran out anyway, which the input's size, not a bug, usually explains.
            WriteError(error, "out of memory: the run needs more memory than is available; trace a smaller --size or fewer strategies, or build a smaller scene");
            return ExitCodes.BadInput;
        }
        catch (Exception ex)
        {
            error.WriteLine($"voxprof: internal error: {ex.GetType().Name}: {MessageText.ForDisplay(ex.Message)}");
            if (Environment.GetEnvironmentVariable("VOXPROF_DEBUG") is { Length: > 0 })
                error.WriteLine(ex);
            return ExitCodes.InternalError;
        }
    }

    /// <summary>Writes "voxprof: error: MESSAGE" as one line, whatever the message holds (newlines in a path, an echo of the input).</summary>
    public static void WriteError(TextWriter error, string message) =>
        error.WriteLine($"voxprof: error: {MessageText.ForDisplay(message)}");
}
