using System.CommandLine;
using VoxProf.Cli.Commands;

namespace VoxProf.Cli;

/// <summary>Builds the command tree; tests call <see cref="Run"/> with their own writers.</summary>
public static class Cli
{
    public static RootCommand BuildRoot(TextWriter output, TextWriter error)
    {
        var root = new RootCommand("VoxProf: deterministic per-pixel cost profiles of ray traversal in sparse voxel trees.");
        root.Subcommands.Add(InspectCommand.Create(output, error));
        root.Subcommands.Add(TraceCommand.Create(output, error));
        root.Subcommands.Add(CompareCommand.Create(output, error));
        return root;
    }

    public static int Run(string[] args, TextWriter output, TextWriter error)
    {
        var root = BuildRoot(output, error);
        var parse = root.Parse(args);
        int code = parse.Invoke(new InvocationConfiguration { Output = output, Error = error });
        // The library reports its own parse errors with exit code 1, which this tool reserves for broken compare rules.
        return parse.Errors.Count > 0 && code == 1 ? ExitCodes.BadInput : code;
    }
}
