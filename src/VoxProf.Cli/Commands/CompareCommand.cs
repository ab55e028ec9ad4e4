using System.CommandLine;
using VoxProf.Core;
using VoxProf.Reports.Compare;
using VoxProf.Reports.Export;

namespace VoxProf.Cli.Commands;

/// <summary><c>voxprof compare BASE CANDIDATE</c>: diff two reports and gate a CI job (docs/ci.md).</summary>
public static class CompareCommand
{
    public const string DefaultOut = "voxprof-out/compare";

    public static Command Create(TextWriter output, TextWriter error)
    {
        var baseArg = new Argument<string>("base") { Description = "The base report: a directory written by `voxprof trace`, or its report.json." };
        var candidateArg = new Argument<string>("candidate") { Description = "The candidate report, compared against the base." };
        var outOpt = new Option<string>("--out", "-o")
        {
            Description = "Directory for compare.md, compare.csv, compare.json and the difference heatmaps.",
            DefaultValueFactory = _ => DefaultOut,
        };
        var failOnOpt = new Option<string[]>("--fail-on")
        {
            Description = "A gate rule STRATEGY.METRIC:LIMIT, METRIC as summary.csv names it, e.g. all.iterations.mean:5% (repeat for several). " +
                $"Default: {string.Join(" ", GateRules.Default)}.",
        };
        var quietOpt = new Option<bool>("--quiet", "-q") { Description = "Print only broken rules and the verdict." };

        var cmd = new Command("compare", "Compare two trace reports; exit 1 when a gate rule is broken.")
        {
            baseArg, candidateArg, outOpt, failOnOpt, quietOpt,
        };
        cmd.SetAction(parse =>
        {
            return Guard.Run(error, () => Execute(
                parse.GetValue(baseArg)!, parse.GetValue(candidateArg)!, parse.GetValue(outOpt) ?? DefaultOut,
                parse.GetValue(failOnOpt) ?? [], parse.GetValue(quietOpt), output, error));
        });
        return cmd;
    }

    private static int Execute(string basePath, string candidatePath, string outDir, string[] ruleTexts, bool quiet,
        TextWriter output, TextWriter error)
    {
        // Rule syntax and the output path first: a typo should not wait for two reports to load.
        var rules = GateRules.Parse(ruleTexts);
        OutputDirectory.CheckPath(outDir, "--out");
        var comparison = ReportComparison.Create(ReportLoader.Load(basePath), ReportLoader.Load(candidatePath));
        var verdict = GateRules.Evaluate(comparison, rules);
        var result = new CompareResult(comparison, verdict);

        using var directory = OutputDirectory.Open(outDir);
        var failures = new List<string>();
        try
        {
            var images = CompareDiffImages.Write(comparison, directory, ToolInfo.Version);
            result = result with { DiffImages = images.Written, DiffNotes = images.Notes };
        }
        catch (Exception ex) when (ex is InputException or IOException or UnauthorizedAccessException)
        {
            // The tables and the verdict do not need the images: write them anyway, then report the failure.
            failures.Add($"difference heatmaps: {ex.Message}");
        }
        failures.AddRange(CompareOutputs.WriteAll(directory, result, CompareOutputs.All));
        directory.Commit();

        if (!quiet)
        {
            CompareConsole.WriteHeader(output, result);
            CompareConsole.WriteTable(output, comparison);
        }
        CompareConsole.WriteVerdict(output, verdict);
        if (!quiet && failures.Count == 0)
        {
            var images = result.DiffImages.Count > 0 ? $" and {result.DiffImages.Count} difference heatmaps" : "";
            output.WriteLine($"wrote {string.Join(", ", CompareOutputs.All.Select(e => e.FileName))}{images} to {outDir}");
        }

        if (failures.Count > 0)
        {
            Guard.WriteError(error, string.Join("; ", failures));
            return ExitCodes.BadInput;
        }
        return verdict.Passed ? ExitCodes.Ok : ExitCodes.RuleBroken;
    }
}
