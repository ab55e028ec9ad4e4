using System.Globalization;

namespace VoxProf.Reports.Compare;

/// <summary>The console rendering: header and notes, the largest changes as an aligned table, then the verdict.</summary>
public static class CompareConsole
{
    /// <summary>Rows shown on the console; compare.md has them all.</summary>
    public const int MaxRows = 20;

    public static void WriteHeader(TextWriter w, CompareResult result)
    {
        var cmp = result.Comparison;
        w.WriteLine($"base:      {cmp.Base.File}");
        w.WriteLine($"candidate: {cmp.Candidate.File}");
        foreach (var note in cmp.Notes.Concat(result.DiffNotes))
            w.WriteLine($"note: {note}");
    }

    public static void WriteTable(TextWriter w, ReportComparison cmp)
    {
        var changed = cmp.Changes.Where(c => c.Change != 0).ToArray();
        if (changed.Length == 0)
        {
            w.WriteLine($"no change in any of {cmp.Changes.Count} metrics");
            return;
        }
        var rows = new List<string[]> { new[] { "strategy", "metric", "base", "candidate", "change", "relative" } };
        rows.AddRange(changed.Take(MaxRows).Select(c => new[]
        {
            c.Strategy, c.Metric.Name, c.Metric.Format(c.Base), c.Metric.Format(c.Candidate),
            c.Metric.FormatChange(c.Change), CompareText.Relative(c) + (c.IsRegression ? " worse" : c.IsImprovement ? " better" : ""),
        }));
        var widths = Enumerable.Range(0, rows[0].Length).Select(i => rows.Max(r => r[i].Length)).ToArray();
        foreach (var row in rows)
        {
            // Names left-aligned, numbers right-aligned.
            var cells = row.Select((cell, i) => i < 2 ? cell.PadRight(widths[i]) : cell.PadLeft(widths[i]));
            w.WriteLine(string.Join("  ", cells).TrimEnd());
        }
        var more = changed.Length - Math.Min(changed.Length, MaxRows);
        var unchanged = cmp.Changes.Count - changed.Length;
        if (more > 0 || unchanged > 0)
            w.WriteLine(string.Create(CultureInfo.InvariantCulture, $"({more} more changed, {unchanged} unchanged: see compare.md)"));
    }

    public static void WriteVerdict(TextWriter w, GateVerdict verdict)
    {
        foreach (var o in verdict.BrokenRules)
        {
            foreach (var c in o.Broken)
                w.WriteLine($"broken: {o.Rule.Text}: {CompareText.Broken(o.Rule, c.Change)}");
        }
        var kind = verdict.UsedDefaultRules ? "default rules" : "rules";
        w.WriteLine(verdict.Passed
            ? $"verdict: pass ({verdict.Outcomes.Count} {kind} hold: {string.Join(" ", verdict.Outcomes.Select(o => o.Rule.Text))})"
            : $"verdict: fail ({verdict.BrokenRules.Count()} of {verdict.Outcomes.Count} {kind} broken)");
    }
}
