using System.CommandLine;
using VoxProf.Cli.Commands;

namespace VoxProf.Cli;

/// <summary>Builds the command tree; tests call <see cref="Run"/> with their own writers.</summary>
public static partial class Cli
{
    public static RootCommand BuildRoot(TextWriter output, TextWriter error)
    {
        var root = new RootCommand("VoxProf: deterministic per-pixel cost profiles of ray traversal in sparse voxel trees.");
        root.Subcommands.Add(InspectCommand.Create(output, error));
        root.Subcommands.Add(TraceCommand.Create(output, error));
        root.Subcommands.Add(CompareCommand.Create(output, error));
        root.Subcommands.Add(CalibrateCommand.Create(output, error));
        root.Subcommands.Add(MergeCommand.Create(output, error));
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
        // bad usage is 2 everywhere (ExitCodes). Several problems share one line, so a CI log shows one error.
        if (parse.Errors.Count > 0)
        {
            Guard.WriteError(error, string.Join("; ", parse.Errors.Select(e => Plain(e.Message).TrimEnd('.')).Distinct()));
            return ExitCodes.BadInput;
        }
        return parse.Invoke(new InvocationConfiguration { Output = output, Error = error });
    }

    // The parser names .NET types ("as expected type 'System.Nullable`1[System.Int32]'"); say what to type instead.
    private static string Plain(string message) => TypeName().Replace(message, m => m.Groups[1].Value switch
    {
        "Int32" => "; expected a whole number up to 2147483647",
        "Int64" => "; expected a whole number",
        "Single" or "Double" => "; expected a number",
        "Boolean" => "; expected true or false",
        _ => "",
    });

    [System.Text.RegularExpressions.GeneratedRegex(@" as expected type '(?:System\.Nullable`1\[)?System\.(\w+)\]?'")]
    private static partial System.Text.RegularExpressions.Regex TypeName();
}
