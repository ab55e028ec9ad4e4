using System.Globalization;
using System.Text;
using VoxProf.Reports.Metrics;
using VoxProf.Reports.Model;
using VoxProf.Reports.Tables;

namespace VoxProf.Reports.Views;

/// <summary>summary.md of a run of several views: each headline metric over the views, the worst views, and the views.</summary>
public static class RunMarkdown
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    /// <summary>The short tables' metrics (<see cref="MetricColumns.Summary"/>) that the run's reports hold.</summary>
    public static IReadOnlyList<MetricDescriptor> Headline(RunDocument run) =>
        MetricColumns.Summary.Where(c => !c.PrepassOnly)
            .Select(c => run.Metrics.FirstOrDefault(m => m.Name == c.Metric)).OfType<MetricDescriptor>().ToArray();

    public static string Render(RunDocument run, Uri? linkBase)
    {
        var sb = new StringBuilder();
        int held = run.Shard?.Views.Count ?? run.Views.Count;
        sb.Append(Inv, $"# VoxProf run: {Esc(run.Scene.Name)}, {run.Views.Count} {(run.Views.Count == 1 ? "view" : "views")}\n\n");
        if (run.Shard is { } shard)
            sb.Append(Inv, $"> Shard {shard.Index} of {shard.Count}: {held} of the run's {run.Views.Count} views. `voxprof merge` combines the shards into the whole run.\n\n");
        sb.Append(Inv, $"VoxProf {Esc(run.ToolVersion)} (commit {Esc(run.ToolCommit.Length > 12 ? run.ToolCommit[..12] : run.ToolCommit)}). ");
        sb.Append("Each metric is first taken per view (as each view's summary.md shows it), then summarised over the views: ");
        sb.Append("their mean, median (p50), 90th percentile (p90, Hyndman & Fan definition 7) and maximum. ");
        sb.Append("summary.csv has every metric over the views; views.csv every metric of every view.\n\n");

        foreach (MetricDescriptor m in Headline(run))
        {
            sb.Append(Inv, $"## `{m.Name}` over the views\n\n{Esc(m.Title)} ({Esc(m.Unit)}; {Direction(m.Better)}).\n\n");
            sb.Append("| strategy | mean | p50 | p90 | max | worst view |\n|---|---:|---:|---:|---:|---|\n");
            foreach (RunStrategy s in run.Strategies)
            {
                if (!s.Distribution.TryGetValue(m.Name, out ViewDistribution? d))
                    continue;
                string worst = run.Worst.FirstOrDefault(w => w.Metric == m.Name && w.Strategy == s.Name)?.Views.FirstOrDefault()?.View ?? "";
                sb.Append(Inv, $"| {Esc(s.Name)}{(s.Name == run.Baseline ? " (baseline)" : "")} | {m.Format(d.Mean)} | {m.Format(d.P50)} | {m.Format(d.P90)} | {m.Format(d.Max)} | {Link(run, worst, linkBase)} |\n");
            }
            sb.Append('\n');
        }

        if (run.ContactSheet is { } sheet)
        {
            sb.Append(Inv, $"## Worst views\n\n{Esc(sheet.Strategy)}'s `{sheet.Map}` heatmaps of the {sheet.Views.Count} views with the highest `{sheet.Metric}`, worst first, each at its own scale:\n\n");
            sb.Append(Inv, $"![worst views]({Href(ContactSheet.FileName, linkBase)})\n\n");
        }

        sb.Append("## Views\n\n| view | folder |\n|---|---|\n");
        var present = run.Shard is { } sh ? sh.Views.ToHashSet(StringComparer.Ordinal) : null;
        foreach (RunView v in run.Views)
        {
            if (present is null || present.Contains(v.Name))
                sb.Append(Inv, $"| {Esc(v.Name)} | [{Esc(v.Folder)}]({Href(v.Folder + "/" + OutputNames.SummaryMarkdown, linkBase)}) |\n");
        }
        return sb.ToString();
    }

    private static string Link(RunDocument run, string view, Uri? linkBase)
    {
        RunView? v = run.Views.FirstOrDefault(x => x.Name == view);
        return v is null ? Esc(view) : $"[{Esc(view)}]({Href(v.Folder + "/" + OutputNames.SummaryMarkdown, linkBase)})";
    }

    private static string Href(string relative, Uri? linkBase) =>
        linkBase is null ? relative : new Uri(linkBase, relative).AbsoluteUri;

    private static string Direction(Better b) => b switch
    {
        Better.Lower => "lower is better",
        Better.Higher => "higher is better",
        _ => "neither better nor worse",
    };

    // Names come from scene files: keep Markdown's table and emphasis characters literal.
    private static string Esc(string text)
    {
        var sb = new StringBuilder(text.Length);
        foreach (char c in text)
        {
            if (c is '|' or '*' or '_' or '`' or '[' or ']' or '<' or '>' or '#' or '\\')
                sb.Append('\\');
            sb.Append(c is '\n' or '\r' ? ' ' : c);
        }
        return sb.ToString();
    }
}
