using System.Diagnostics;
using VoxProf.Tests.Fuzz;

namespace VoxProf.Sweeps.Fuzz;

/// <summary>Runs the built command line as its own process, as CI runs it, and kills it (by its id) at the time limit.</summary>
internal static class ProcessRunner
{
    public static string Program => Path.Combine(AppContext.BaseDirectory, "voxprof.dll");

    public static Process Start(string[] args)
    {
        var info = new ProcessStartInfo("dotnet") { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        info.ArgumentList.Add(Program);
        foreach (string a in args)
            info.ArgumentList.Add(a);
        return Process.Start(info) ?? throw new InvalidOperationException("dotnet did not start");
    }

    public static RunOutcome Run(string[] args)
    {
        var clock = Stopwatch.StartNew();
        using Process p = Start(args);
        Task<string> error = p.StandardError.ReadToEndAsync();
        Task<string> output = p.StandardOutput.ReadToEndAsync();
        bool done = p.WaitForExit(FuzzHarness.Limit);
        if (!done)
        {
            p.Kill(entireProcessTree: true);
            p.WaitForExit();
        }
        Task.WaitAll(error, output);
        return new RunOutcome(done ? p.ExitCode : -1, error.Result, clock.Elapsed, !done);
    }
}
