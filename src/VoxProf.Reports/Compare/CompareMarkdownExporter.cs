using System.Text;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Compare;

/// <summary>
/// compare.md: the gate's verdict and its rules first, then every metric with the most added work first. The verdict
/// (do the rules hold?) and the direction of each change (more or less work?) are stated apart: a change can add work
/// and still be within every rule.
/// </summary>
public sealed class CompareMarkdownExporter : ICompareExporter
{
    public string FileName => "compare.md";

    public void Write(CompareResult result, Stream output)
    {
        using var w = new StreamWriter(output, new UTF8Encoding(false), leaveOpen: true) { NewLine = "\n" };
        var cmp = result.Comparison;
        var verdict = result.Verdict;
        w.WriteLine("# VoxProf: traversal cost of the candidate against the base");
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

        w.WriteLine("## Gate");
        w.WriteLine();
        w.WriteLine(CompareText.GateSentence(verdict));
        w.WriteLine();
        w.WriteLine("| rule | holds | metrics checked | outside the limit |");
        w.WriteLine("|---|---|---:|---:|");
        foreach (var o in verdict.Outcomes)
            w.WriteLine($"| `{o.Rule.Text}` | {(o.Holds ? "yes" : "**no**")} | {o.Checks.Count} | {o.Broken.Count()} |");
        w.WriteLine();
        if (verdict.BrokenRules.Any())
        {
            w.WriteLine("Outside the limit:");
            w.WriteLine();
            foreach (var o in verdict.BrokenRules)
            {
                foreach (var c in o.Broken)
                    w.WriteLine($"- `{o.Rule.Text}`: {Cell(CompareText.Broken(o.Rule, c.Change))}");
            }
            w.WriteLine();
        }

        w.WriteLine("## Every metric, most added work first");
        w.WriteLine();
        w.WriteLine(CompareText.WorkLegend(name => $"`{name}`") + " Relative change is over the base value.");
        w.WriteLine();
        w.WriteLine("| strategy | metric | unit | base | candidate | change | relative | work |");
        w.WriteLine("|---|---|---|---:|---:|---:|---:|:---:|");
        foreach (var c in cmp.Changes)
        {
            w.WriteLine($"| {Cell(c.Strategy)} | {Cell(c.Metric.Name)} | {c.Metric.Unit} | {c.Metric.Format(c.Base)} | " +
                $"{c.Metric.Format(c.Candidate)} | {c.Metric.FormatChange(c.Change)} | {CompareText.Relative(c)} | {CompareText.WorkMark(c)} |");
        }
        if (result.DiffImages.Count > 0 || result.DiffNotes.Count > 0)
        {
            w.WriteLine();
            w.WriteLine("## Difference heatmaps (candidate minus base)");
            w.WriteLine();
            if (result.DiffImages.Count > 0)
            {
                w.WriteLine("Orange: the candidate costs more; blue: less; near-white: no change. All strategies of one counter " +
                    "share one symmetric scale. A black and white checker marks pixels whose hit changed.");
                w.WriteLine();
            }
            foreach (var note in result.DiffNotes)
                w.WriteLine($"- Note: {Cell(note)}");
            foreach (var image in result.DiffImages)
                w.WriteLine($"- [{image}]({ReportLinks.Href(result.LinkBase, image)})");
        }
        if (result.HtmlWritten)
        {
            w.WriteLine();
            w.WriteLine($"The same comparison with every difference heatmap inline: [{CompareHtmlName}]({ReportLinks.Href(result.LinkBase, CompareHtmlName)}).");
        }
    }

    /// <summary>The HTML page compare writes beside this file.</summary>
    public const string CompareHtmlName = "compare.html";

    // Names come from report files; a '|' would split a table cell.
    private static string Cell(string text) => text.Replace("|", "\\|", StringComparison.Ordinal);
}
