using System.CommandLine;

namespace VoxProf.Cli.Commands;

public static class InspectCommand
{
    public static Command Create(TextWriter output, TextWriter error)
    {
        var cmd = new Command("inspect", "Not yet available.");
        cmd.SetAction(_ =>
        {
            error.WriteLine("voxprof: inspect is not available yet");
            return ExitCodes.BadInput;
        });
        return cmd;
    }
}
