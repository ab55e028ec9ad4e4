using System.Globalization;
using VoxProf.Reports.Metrics;

namespace VoxProf.Reports.Compare;

/// <summary>Everything the compare outputs render: the comparison, the verdict, and the diff images written.</summary>
public sealed record CompareResult(ReportComparison Comparison, GateVerdict Verdict)
{
    /// <summary>Difference heatmap file names (relative to the out directory), filled in once they are written.</summary>
    public IReadOnlyList<string> DiffImages { get; init; } = [];

    /// <summary>What the difference heatmaps left out or found (pixels whose hit changed).</summary>
    public IReadOnlyList<string> DiffNotes { get; init; } = [];

    /// <summary>The directory the outputs and difference heatmaps are written to (compare.html reads the images from it).</summary>
    public string? Directory { get; init; }

    /// <summary>Absolute URL compare.md's links start with (--link-base); null for links relative to the file.</summary>
    public Uri? LinkBase { get; init; }

    /// <summary>Whether compare.html is written beside compare.md (compare.md then links to it).</summary>
    public bool HtmlWritten { get; init; }
}

/// <summary>Number formatting shared by the console, Markdown and CSV renderings (invariant culture throughout).</summary>
public static class CompareText
{
    /// <summary>"+5.25%", "-0.5%", "0%", or "from 0" when the base is zero and the candidate is not.</summary>
    public static string Relative(MetricChange change) => change.RelativeChange is { } r
        ? (r * 100).ToString("+0.##;-0.##;0", CultureInfo.InvariantCulture) + "%"
        : "from 0";

    public static string Verdict(GateVerdict verdict) => verdict.Passed ? "pass" : "fail";

    /// <summary>The mark of a change that adds work (a worsening in the metric's own direction).</summary>
    public const string MoreWork = "↑";

    /// <summary>The mark of a change that saves work.</summary>
    public const string LessWork = "↓";

    /// <summary>
    /// What the marks mean, said once in each compare output; <paramref name="code"/> renders a metric name in the
    /// output's own markup.
    /// </summary>
    public static string WorkLegend(Func<string, string> code) =>
        $"{MoreWork} marks more work and {LessWork} less work, whichever way the number moves: a rise of a cost is more work, " +
        $"and so is a fall of SIMD efficiency (more idle lane slots) or of {code("prepass-skip")} (less distance skipped). " +
        $"A change of {code("hit-rate")} has no mark: what the camera sees is neither. The marks do not decide the gate; only its rules do.";

    /// <summary><see cref="MoreWork"/>, <see cref="LessWork"/>, or empty for no change or a neutral metric.</summary>
    public static string WorkMark(MetricChange change) =>
        change.IsRegression ? MoreWork : change.IsImprovement ? LessWork : "";

    /// <summary>The gate's verdict in one sentence (Markdown emphasis on the verdict itself).</summary>
    public static string GateSentence(GateVerdict verdict)
    {
        int total = verdict.Outcomes.Count, broken = verdict.BrokenRules.Count();
        string rules = $"{(verdict.UsedDefaultRules ? "default " : "")}rule{(total == 1 ? "" : "s")}";
        return verdict.Passed
            ? $"**The gate holds**: {total} of {total} {rules} hold{(total == 1 ? "s" : "")}."
            : $"**The gate fails**: {broken} of {total} {rules} {(broken == 1 ? "does" : "do")} not hold (exit code 1).";
    }

    /// <summary>One line per broken check: "dda iterations.mean: 12 -> 13.5 (+1.5, +12.5%), may rise at most 5%".</summary>
    public static string Broken(GateRule rule, MetricChange c) =>
        $"{c.Strategy} {c.Metric.Name}: {c.Metric.Format(c.Base)} -> {c.Metric.Format(c.Candidate)} " +
        $"({c.Metric.FormatChange(c.Change)}, {Relative(c)}), {Allowed(c.Metric.Better)} at most {rule.LimitText}";

    private static string Allowed(Better better) => better switch
    {
        Better.Lower => "may rise",
        Better.Higher => "may fall",
        _ => "may change",
    };

    /// <summary>"lower", "higher" or "neutral", as report.json writes it.</summary>
    public static string BetterText(Better better) => better switch
    {
        Better.Lower => "lower",
        Better.Higher => "higher",
        _ => "neutral",
    };
}
