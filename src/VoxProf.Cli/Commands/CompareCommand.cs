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
        var candidateArg = new Argument<string?>("candidate") { Description = "The candidate report, compared against the base (none with --within).", Arity = ArgumentArity.ZeroOrOne };
        var pairOpt = new Option<string[]>("--pair")
        {
            Description = "Compare a strategy of the base with another of the candidate, BASE=CANDIDATE (e.g. dda=dda-mask); repeat or separate with commas for several.",
        };
        var withinOpt = new Option<string?>("--within") { Description = "Compare two strategies of one run, BASE,CANDIDATE (e.g. dda,dda-mask); give one report." };
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
        var noHtmlOpt = new Option<bool>("--no-html") { Description = "Skip compare.html." };
        var linkBaseOpt = new Option<string?>("--link-base")
        {
            Description = "Absolute URL the compare files will be served from; compare.md's image links then start with it, so they still work once pasted into a pull request.",
        };

        var cmd = new Command("compare", "Compare two trace reports, or two strategies (--pair, --within); exit 1 when a gate rule is broken.")
        {
            baseArg, candidateArg, outOpt, failOnOpt, quietOpt, noHtmlOpt, linkBaseOpt, pairOpt, withinOpt,
        };
        cmd.SetAction(parse =>
        {
            return Guard.Run(error, () =>
            {
                var settings = new Settings(parse.GetValue(outOpt) ?? DefaultOut, parse.GetValue(quietOpt), !parse.GetValue(noHtmlOpt),
                    parse.GetValue(linkBaseOpt) is { } lb ? OptionParsing.LinkBase(lb) : null);
                string basePath = parse.GetValue(baseArg)!;
                string? candidatePath = parse.GetValue(candidateArg);
                IReadOnlyList<StrategyPair> pairs = StrategyPair.Parse(parse.GetValue(pairOpt) ?? []);
                if (parse.GetValue(withinOpt) is { } within)
                {
                    if (candidatePath is not null)
                        throw new InputException($"--within: compares two strategies of one run; give one report, not also '{MessageText.Excerpt(candidatePath)}'");
                    if (pairs.Count > 0)
                        throw new InputException("--within: give either --within or --pair, not both");
                    pairs = [StrategyPair.Within(within)];
                    candidatePath = basePath;
                }
                if (candidatePath is null)
                    throw new InputException("candidate: missing; give BASE CANDIDATE, or one run with --within BASE,CANDIDATE");
                return Execute(basePath, candidatePath, pairs, parse.GetValue(failOnOpt) ?? [], settings, output, error);
            });
        });
        return cmd;
    }

    private sealed record Settings(string OutDir, bool Quiet, bool Html, Uri? LinkBase);

    private static int Execute(string basePath, string candidatePath, IReadOnlyList<StrategyPair> pairs, string[] ruleTexts, Settings settings, TextWriter output, TextWriter error)
    {
        // Rule syntax and the output path first: a typo should not wait for two reports to load.
        var rules = GateRules.Parse(ruleTexts);
        OutputDirectory.CheckPath(settings.OutDir, "--out");
        var comparison = ReportComparison.Create(ReportLoader.Load(basePath), ReportLoader.Load(candidatePath), pairs);
        var verdict = GateRules.Evaluate(comparison, rules);
        string outDir = settings.OutDir;
        bool quiet = settings.Quiet;
        using var directory = OutputDirectory.Open(outDir);
        var result = new CompareResult(comparison, verdict)
        {
            Directory = directory.WorkingPath,
            LinkBase = settings.LinkBase,
            HtmlWritten = settings.Html,
        };

        var failures = new List<string>();
        if (comparison.Base.Views is not null)
        {
            result = result with
            {
                DiffNotes = ["each metric is its mean over the run's views; difference heatmaps are drawn per view: compare a view folder of each run (RUN/views/NAME)"],
            };
        }
        else if (WithoutPixels(comparison) is { } unavailable)
        {
            result = result with { DiffNotes = [unavailable] };
        }
        else
        {
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
        }
        var exporters = CompareOutputs.Chosen(settings.Html);
        failures.AddRange(CompareOutputs.WriteAll(directory, result, exporters));
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
            output.WriteLine($"wrote {string.Join(", ", exporters.Select(e => e.FileName))}{images} to {outDir}");
        }

        if (failures.Count > 0)
        {
            Guard.WriteError(error, string.Join("; ", failures));
            return ExitCodes.BadInput;
        }
        return verdict.Passed ? ExitCodes.Ok : ExitCodes.RuleBroken;
    }

    /// <summary>Why per-pixel differences cannot be drawn, when a side was traced with --no-pixels; else null.</summary>
    private static string? WithoutPixels(ReportComparison cmp)
    {
        var sides = new[] { ("base", cmp.Base), ("candidate", cmp.Candidate) }.Where(s => !s.Item2.Document.Run.PixelData).Select(s => s.Item1).ToArray();
        if (sides.Length == 0)
            return null;
        string which = sides.Length == 2 ? "both reports were" : $"the {sides[0]} report was";
        return $"per-pixel differences are unavailable: {which} traced with --no-pixels, so there are no pixels-STRATEGY.bin.gz files " +
            "and no difference heatmaps; every metric above is still compared";
    }
}
