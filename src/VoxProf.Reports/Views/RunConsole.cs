using VoxProf.Reports.Metrics;

namespace VoxProf.Reports.Views;

/// <summary>What `voxprof trace` and `voxprof merge` print for a run of several views: the lead metric over the views.</summary>
public static class RunConsole
{
    public static void Write(TextWriter output, RunDocument run)
    {
        MetricDescriptor? m = MetricColumns.Console.Select(c => run.Metrics.FirstOrDefault(x => x.Name == c.Metric))
            .OfType<MetricDescriptor>().FirstOrDefault(x => run.Strategies.Any(s => s.Distribution.ContainsKey(x.Name)));
        int held = run.Shard?.Views.Count ?? run.Views.Count;
        output.WriteLine(run.Shard is { } shard
            ? $"shard {shard.Index} of {shard.Count}: {held} of {run.Views.Count} views"
            : $"{run.Views.Count} views");
        if (m is null)
            return;
        string[] head = ["strategy", .. RunWriter.Statistics.Select(s => $"{m.Name} {s.Name}"), "worst view"];
        var lines = new List<string[]> { head };
        foreach (RunStrategy s in run.Strategies)
        {
            if (!s.Distribution.TryGetValue(m.Name, out ViewDistribution? d))
                continue;
            string worst = run.Worst.FirstOrDefault(w => w.Metric == m.Name && w.Strategy == s.Name)?.Views.FirstOrDefault()?.View ?? "";
            lines.Add([s.Name, .. RunWriter.Statistics.Select(x => m.Format(x.Pick(d))), worst]);
        }
        int[] widths = Enumerable.Range(0, lines[0].Length).Select(i => lines.Max(l => l[i].Length)).ToArray();
        foreach (string[] line in lines)
        {
            var cells = line.Select((cell, i) => i == 0 || i == line.Length - 1 ? cell.PadRight(widths[i]) : cell.PadLeft(widths[i]));
            output.WriteLine(string.Join("  ", cells).TrimEnd());
        }
    }
}
