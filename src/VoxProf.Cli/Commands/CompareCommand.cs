using System.CommandLine;

namespace VoxProf.Cli.Commands;

public static class CompareCommand
{
    public static Command Create(TextWriter output, TextWriter error)
    {
        var cmd = new Command("compare", "Not yet available.");
        cmd.SetAction(_ =>
        {
            error.WriteLine("voxprof: compare is not available yet");
            return ExitCodes.BadInput;
        });
        return cmd;
    }
}
