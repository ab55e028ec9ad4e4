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
        root.Subcommands.Add(CalibrateCommand.Create(output, error));
        return root;
    }

    public static int Run(string[] args, TextWriter output, TextWriter error)
    {
        var root = BuildRoot(output, error);
        if (args.Length == 0)
        {
            // No command is a usage mistake (a script that lost its arguments must not pass): the usage on stderr, exit 2.
            root.Parse(["--help"]).Invoke(new InvocationConfiguration { Output = error, Error = error });
            return ExitCodes.BadInput;
        }
        var parse = root.Parse(args);
        // The parser's own exit code for a bad option is 1, which compare uses for "a rule is broken";
        // bad usage is 2 everywhere (ExitCodes).
        if (parse.Errors.Count > 0)
        {
            foreach (var e in parse.Errors)
                error.WriteLine($"voxprof: error: {e.Message}");
            return ExitCodes.BadInput;
        }
        return parse.Invoke(new InvocationConfiguration { Output = output, Error = error });
    }
}
