using System.Globalization;
using VoxProf.Core;
using VoxProf.Reports.Metrics;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Compare;

/// <summary>A metric of a strategy left out of a comparison, and why ("not checked in base": a null value).</summary>
public sealed record NotCompared(string Strategy, string Metric, string Reason);

/// <summary>Two reports of the same view, metric by metric. Build with <see cref="Create"/>.</summary>
public sealed class ReportComparison
{
    private ReportComparison(LoadedReport @base, LoadedReport candidate, IReadOnlyList<string> notes,
        IReadOnlyList<string> strategies, IReadOnlyList<MetricChange> changes, IReadOnlyList<NotCompared> notCompared)
    {
        NotComparedMetrics = notCompared;
        Base = @base;
        Candidate = candidate;
        Notes = notes;
        Strategies = strategies;
        Changes = changes;
    }

    public LoadedReport Base { get; }
    public LoadedReport Candidate { get; }

    /// <summary>True when the scene files' hashes differ: allowed (content changes are what users compare), but stated.</summary>
    public bool SceneChanged => !string.Equals(Base.Document.Scene.Sha256, Candidate.Document.Scene.Sha256, StringComparison.OrdinalIgnoreCase);

    /// <summary>Differences a reader should know before trusting the numbers; the scene change comes first.</summary>
    public IReadOnlyList<string> Notes { get; }

    /// <summary>Strategies present in both reports, in the base report's order.</summary>
    public IReadOnlyList<string> Strategies { get; }

    /// <summary>Every metric present in both reports, largest regressions first.</summary>
    public IReadOnlyList<MetricChange> Changes { get; }

    /// <summary>Metrics of a strategy in both reports that have no value in one of them, so they were left out.</summary>
    public IReadOnlyList<NotCompared> NotComparedMetrics { get; }

    /// <summary>
    /// The pairs compared when strategies were paired (--pair, --within), by label; empty when each strategy is
    /// compared with itself.
    /// </summary>
    public IReadOnlyDictionary<string, StrategyPair> Pairs { get; private set; } = new Dictionary<string, StrategyPair>();

    /// <summary>The name a compared strategy has in the base report (its pair's base, or itself).</summary>
    public string BaseName(string strategy) => Pairs.TryGetValue(strategy, out var p) ? p.Base : strategy;

    /// <summary>The name a compared strategy has in the candidate report.</summary>
    public string CandidateName(string strategy) => Pairs.TryGetValue(strategy, out var p) ? p.Candidate : strategy;

    /// <summary>Compares strategy with strategy as <paramref name="pairs"/> say, e.g. dda of the base with dda-mask of the candidate.</summary>
    public static ReportComparison Create(LoadedReport @base, LoadedReport candidate, IReadOnlyList<StrategyPair> pairs)
    {
        if (pairs.Count == 0)
            return Create(@base, candidate);
        var (b, c) = StrategyPair.Apply(@base, candidate, pairs);
        ReportComparison cmp = Create(b, c);
        cmp.Pairs = pairs.ToDictionary(p => p.Label, StringComparer.OrdinalIgnoreCase);
        var notes = new List<string> { $"strategies paired: {string.Join(", ", pairs.Select(p => $"base {p.Base} against candidate {p.Candidate}"))}" };
        notes.AddRange(cmp.Notes);
        return new ReportComparison(cmp.Base, cmp.Candidate, notes, cmp.Strategies, cmp.Changes, cmp.NotComparedMetrics) { Pairs = cmp.Pairs };
    }

    /// <summary>Refuses (with <see cref="InputException"/>) reports of different image sizes or cameras.</summary>
    public static ReportComparison Create(LoadedReport @base, LoadedReport candidate)
    {
        RequireSameView(@base, candidate);
        var b = @base.Document;
        var c = candidate.Document;
        var notes = new List<string>();
        if (!string.Equals(b.Scene.Sha256, c.Scene.Sha256, StringComparison.OrdinalIgnoreCase))
            notes.Add($"scene content differs: base sha256 {Short(b.Scene.Sha256)}, candidate sha256 {Short(c.Scene.Sha256)}");
        if (b.Camera.Name != c.Camera.Name)
            notes.Add($"camera renamed from '{b.Camera.Name}' to '{c.Camera.Name}' (same position and field of view)");
        if (b.Tree.Branching != c.Tree.Branching)
            notes.Add($"tree branching differs: base {b.Tree.Branching}, candidate {c.Tree.Branching}");
        if (b.Run.PrepassBlock != c.Run.PrepassBlock)
            notes.Add($"prepass block differs: base {b.Run.PrepassBlock}, candidate {c.Run.PrepassBlock}");
        if (b.Run.Memory != c.Run.Memory)
            notes.Add($"memory model differs: base {b.Run.Memory?.Describe() ?? "off"}, candidate {c.Run.Memory?.Describe() ?? "off"}");
        if (b.ToolVersion != c.ToolVersion)
            notes.Add($"voxprof version differs: base {b.ToolVersion}, candidate {c.ToolVersion}");
        notes.AddRange(Calibration.CalibrationNotes.Compare(b, c));

        var candidateByName = c.Strategies.ToDictionary(s => s.Name, StringComparer.OrdinalIgnoreCase);
        var common = b.Strategies.Where(s => candidateByName.ContainsKey(s.Name)).Select(s => s.Name).ToArray();
        AddOnlyIn(notes, "strategies", b.Strategies.Select(s => s.Name), c.Strategies.Select(s => s.Name));

        var changes = new List<MetricChange>();
        var notCompared = new List<NotCompared>();
        var candidateMetrics = c.Metrics.ToDictionary(m => m.Name, StringComparer.Ordinal);
        var baseMetrics = b.Metrics.Select(m => m.Name).ToHashSet(StringComparer.Ordinal);
        var comparable = new List<MetricDescriptor>();
        var missingMetrics = new List<string>();
        foreach (var m in b.Metrics)
        {
            if (!candidateMetrics.TryGetValue(m.Name, out var cm))
                missingMetrics.Add($"{m.Name} (base only)");
            else if (cm.Unit != m.Unit || cm.Better != m.Better)
                notes.Add($"{m.Name} not compared: base measures it in {m.Unit} ({m.Better.ToString().ToLowerInvariant()} is better), candidate in {cm.Unit} ({cm.Better.ToString().ToLowerInvariant()} is better)");
            else
                comparable.Add(m);
        }
        missingMetrics.AddRange(c.Metrics.Where(m => !baseMetrics.Contains(m.Name)).Select(m => $"{m.Name} (candidate only)"));
        if (missingMetrics.Count > 0)
            notes.Add($"not compared, present in one report only: {string.Join(", ", missingMetrics)}");

        foreach (var bs in b.Strategies.Where(s => candidateByName.ContainsKey(s.Name)))
        {
            var cs = candidateByName[bs.Name];
            foreach (var m in comparable)
            {
                // A counter of another strategy's own: neither side measures it for this strategy.
                if (!bs.Values.ContainsKey(m.Name) && !cs.Values.ContainsKey(m.Name))
                    continue;
                // A null value was not measured (mismatch without the grid reference): not a 0, so not comparable.
                if (bs.Value(m.Name) is { } bv && cs.Value(m.Name) is { } cv)
                    changes.Add(new MetricChange(bs.Name, m, bv, cv));
                else
                    notCompared.Add(new NotCompared(bs.Name, m.Name, Missing(bs, m, "base") ?? Missing(cs, m, "candidate")!));
            }
        }
        foreach (var group in notCompared.GroupBy(n => (n.Metric, n.Reason)))
            notes.Add($"{group.Key.Metric} not compared for {string.Join(", ", group.Select(n => n.Strategy))}: {group.Key.Reason}");
        notes.AddRange(b.Warnings.Select(w => $"base report warns: {w}"));
        notes.AddRange(c.Warnings.Select(w => $"candidate report warns: {w}"));
        if (b.Environment.Configuration != "Release" || c.Environment.Configuration != "Release")
            notes.Add($"build configuration: base {b.Environment.Configuration}, candidate {c.Environment.Configuration} (counts do not depend on it; timings do)");

        if (changes.Count == 0)
            throw new InputException(NothingToCompare(@base, candidate, common, comparable));
        return new ReportComparison(@base, candidate, notes, common, RegressionOrder.Sort(changes), notCompared);
    }

    // A comparison of nothing would pass every rule: refuse it, naming what each side holds.
    private static string NothingToCompare(LoadedReport @base, LoadedReport candidate, IReadOnlyList<string> common,
        IReadOnlyList<MetricDescriptor> comparable)
    {
        static string Names(IEnumerable<string> names) => names.Any() ? string.Join(", ", names) : "none";
        var b = @base.Document;
        var c = candidate.Document;
        if (common.Count == 0)
        {
            return $"nothing to compare: no strategy is in both reports (base {@base.File} holds {Names(b.Strategies.Select(s => s.Name))}; " +
                $"candidate {candidate.File} holds {Names(c.Strategies.Select(s => s.Name))}); trace both with a strategy in common";
        }
        return comparable.Count == 0
            ? $"nothing to compare: no metric is in both reports (base {@base.File} lists {b.Metrics.Count}, candidate {candidate.File} lists {c.Metrics.Count}, none with the same name, unit and direction)"
            : $"nothing to compare: no metric of {Names(common)} has a value in both reports ({@base.File}, {candidate.File})";
    }

    private static string? Missing(StrategyReport s, MetricDescriptor m, string side) =>
        !s.Values.ContainsKey(m.Name) ? $"no value in {side}" : s.Value(m.Name) is null ? $"not checked in {side}" : null;

    private static void RequireSameView(LoadedReport @base, LoadedReport candidate)
    {
        var b = @base.Document;
        var c = candidate.Document;
        if (b.Run.Width != c.Run.Width || b.Run.Height != c.Run.Height)
        {
            throw new InputException(
                $"cannot compare runs of different image sizes: base {b.Run.Width}x{b.Run.Height} ({@base.File}), candidate {c.Run.Width}x{c.Run.Height} ({candidate.File})");
        }
        if ((@base.Views is null) != (candidate.Views is null))
        {
            var (run, single) = @base.Views is null ? (candidate, @base) : (@base, candidate);
            throw new InputException($"cannot compare a run of {run.Views!.Count} views ({run.File}) with the report of one view ({single.File}); compare two runs, or a view folder of the run (RUN/views/NAME) with the single view");
        }
        if (@base.Views is { } bv && candidate.Views is { } cv && !SameViews(bv, cv))
        {
            throw new InputException(
                $"cannot compare runs of different views: base {bv.Count} views ({@base.File}), candidate {cv.Count} views ({candidate.File}); trace both with the same --camera and scene cameras");
        }
        // Exact float equality: both runs read the camera from the same text, so any difference is a real move.
        if (!b.Camera.Eye.SequenceEqual(c.Camera.Eye) || !b.Camera.Target.SequenceEqual(c.Camera.Target)
            || !b.Camera.Up.SequenceEqual(c.Camera.Up) || b.Camera.FovDegrees != c.Camera.FovDegrees)
        {
            throw new InputException(
                $"cannot compare runs of different cameras: base {Describe(b.Camera)} ({@base.File}), candidate {Describe(c.Camera)} ({candidate.File})");
        }
    }

    private static bool SameViews(IReadOnlyList<Views.RunView> a, IReadOnlyList<Views.RunView> b) =>
        a.Count == b.Count && a.Zip(b).All(p => p.First.Name == p.Second.Name && p.First.Camera.Eye.SequenceEqual(p.Second.Camera.Eye)
            && p.First.Camera.Target.SequenceEqual(p.Second.Camera.Target) && p.First.Camera.Up.SequenceEqual(p.Second.Camera.Up)
            && p.First.Camera.FovDegrees == p.Second.Camera.FovDegrees);

    private static void AddOnlyIn(List<string> notes, string what, IEnumerable<string> inBase, IEnumerable<string> inCandidate)
    {
        var b = inBase.ToArray();
        var c = inCandidate.ToArray();
        var onlyBase = b.Except(c, StringComparer.OrdinalIgnoreCase).ToArray();
        var onlyCandidate = c.Except(b, StringComparer.OrdinalIgnoreCase).ToArray();
        if (onlyBase.Length > 0)
            notes.Add($"{what} only in base, not compared: {string.Join(", ", onlyBase)}");
        if (onlyCandidate.Length > 0)
            notes.Add($"{what} only in candidate, not compared: {string.Join(", ", onlyCandidate)}");
    }

    public static string Describe(CameraInfo camera) => camera.FovDegrees == 0 ? $"'{camera.Name}'" :
        $"'{camera.Name}' eye {Vec(camera.Eye)} target {Vec(camera.Target)} up {Vec(camera.Up)} fov {camera.FovDegrees.ToString("R", CultureInfo.InvariantCulture)}";

    private static string Vec(float[] v) => string.Join(",", v.Select(x => x.ToString("R", CultureInfo.InvariantCulture)));

    private static string Short(string? hash) => hash is null ? "(none)" : hash.Length > 12 ? hash[..12] : hash;
}
