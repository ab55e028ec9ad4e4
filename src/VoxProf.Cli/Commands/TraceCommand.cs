using System.CommandLine;

namespace VoxProf.Cli.Commands;

public static class TraceCommand
{
    public static Command Create(TextWriter output, TextWriter error)
    {
        var cmd = new Command("trace", "Not yet available.");
        cmd.SetAction(_ =>
        {
            error.WriteLine("voxprof: trace is not available yet");
            return ExitCodes.BadInput;
        });
        return cmd;
    }
}
