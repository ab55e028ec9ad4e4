using System.Text;

namespace VoxProf.Reports.Compare;

/// <summary>compare.md: the verdict, the rules, then every metric with the largest regressions first.</summary>
public sealed class CompareMarkdownExporter : ICompareExporter
{
    public string FileName => "compare.md";

    public void Write(CompareResult result, Stream output)
    {
        using var w = new StreamWriter(output, new UTF8Encoding(false), leaveOpen: true) { NewLine = "\n" };
        var cmp = result.Comparison;
        var verdict = result.Verdict;
        w.WriteLine("# VoxProf comparison");
        w.WriteLine();
        if (cmp.SceneChanged)
        {
            w.WriteLine($"> **Scene content differs** between the runs (base sha256 `{cmp.Base.Document.Scene.Sha256 ?? "none"}`, " +
                $"candidate sha256 `{cmp.Candidate.Document.Scene.Sha256 ?? "none"}`): the changes below include the content change.");
            w.WriteLine();
        }
        w.WriteLine($"- Base: `{cmp.Base.File}` (scene {cmp.Base.Document.Scene.Name}, voxprof {cmp.Base.Document.ToolVersion})");
        w.WriteLine($"- Candidate: `{cmp.Candidate.File}` (scene {cmp.Candidate.Document.Scene.Name}, voxprof {cmp.Candidate.Document.ToolVersion})");
        w.WriteLine($"- View: {cmp.Base.Document.Run.Width}x{cmp.Base.Document.Run.Height}, camera {ReportComparison.Describe(cmp.Base.Document.Camera)}");
        foreach (var note in cmp.Notes.Skip(cmp.SceneChanged ? 1 : 0))
            w.WriteLine($"- Note: {note}");
        w.WriteLine();

        var broken = verdict.BrokenRules.Count();
        w.WriteLine($"## Verdict: {CompareText.Verdict(verdict).ToUpperInvariant()}");
        w.WriteLine();
        w.WriteLine(verdict.Passed
            ? $"Every rule holds ({verdict.Outcomes.Count} {(verdict.UsedDefaultRules ? "default " : "")}rules)."
            : $"{broken} of {verdict.Outcomes.Count} {(verdict.UsedDefaultRules ? "default " : "")}rules broken.");
        w.WriteLine();
        w.WriteLine("| rule | result | metrics checked | broken |");
        w.WriteLine("|---|---|---:|---:|");
        foreach (var o in verdict.Outcomes)
            w.WriteLine($"| `{o.Rule.Text}` | {(o.Holds ? "holds" : "**broken**")} | {o.Checks.Count} | {o.Broken.Count()} |");
        w.WriteLine();
        if (broken > 0)
        {
            w.WriteLine("### Broken rules");
            w.WriteLine();
            foreach (var o in verdict.BrokenRules)
            {
                foreach (var c in o.Broken)
                    w.WriteLine($"- `{o.Rule.Text}`: {Cell(CompareText.Broken(o.Rule, c.Change))}");
            }
            w.WriteLine();
        }

        w.WriteLine("## Changes, largest regressions first");
        w.WriteLine();
        w.WriteLine("Worse means higher for costs and lower for SIMD efficiency; a change of hit rate is neither; relative change is over the base value.");
        w.WriteLine();
        w.WriteLine("| strategy | metric | unit | base | candidate | change | relative |");
        w.WriteLine("|---|---|---|---:|---:|---:|---:|");
        foreach (var c in cmp.Changes)
        {
            var mark = c.IsRegression ? " ▲" : c.IsImprovement ? " ▼" : "";
            w.WriteLine($"| {Cell(c.Strategy)} | {Cell(c.Metric.Name)} | {c.Metric.Unit} | {c.Metric.Format(c.Base)} | " +
                $"{c.Metric.Format(c.Candidate)} | {c.Metric.FormatChange(c.Change)} | {CompareText.Relative(c)}{mark} |");
        }
        if (result.DiffImages.Count > 0 || result.DiffNotes.Count > 0)
        {
            w.WriteLine();
            w.WriteLine("## Difference heatmaps (candidate minus base)");
            w.WriteLine();
            w.WriteLine("Orange: the candidate costs more; blue: less; near-white: no change. All strategies of one counter " +
                "share one symmetric scale. A black and white checker marks pixels whose hit changed.");
            w.WriteLine();
            foreach (var note in result.DiffNotes)
                w.WriteLine($"- Note: {Cell(note)}");
            foreach (var image in result.DiffImages)
                w.WriteLine($"- [{image}]({Uri.EscapeDataString(image)})");
        }
    }

    // Names come from report files; a '|' would split a table cell.
    private static string Cell(string text) => text.Replace("|", "\\|", StringComparison.Ordinal);
}
