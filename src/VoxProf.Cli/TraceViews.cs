using System.Diagnostics;
using System.Globalization;
using VoxProf.Cli.Commands;
using VoxProf.Core;
using VoxProf.Core.Limits;
using VoxProf.Core.Memory;
using VoxProf.Core.Scenes;
using VoxProf.Core.Scenes.Paths;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;
using VoxProf.Reports.Export;
using VoxProf.Reports.Model;
using VoxProf.Reports.Views;

namespace VoxProf.Cli;

/// <summary>Shard I of N of a run's views (--shard I/N), 1-based.</summary>
internal sealed record ShardChoice(int Index, int Count)
{
    public const int MaxCount = 10_000;

    public static ShardChoice Parse(string text)
    {
        string[] parts = text.Trim().Split('/');
        if (parts.Length == 2
            && int.TryParse(parts[0].Trim(), NumberStyles.None, CultureInfo.InvariantCulture, out int i)
            && int.TryParse(parts[1].Trim(), NumberStyles.None, CultureInfo.InvariantCulture, out int n)
            && n is >= 1 and <= MaxCount && i >= 1 && i <= n)
            return new ShardChoice(i, n);
        throw new InputException($"--shard: '{MessageText.Excerpt(text)}' is not valid, expected I/N with 1 <= I <= N <= {MaxCount} (e.g. 2/4)");
    }
}

/// <summary>
/// A trace of several views (docs/reports.md, "Runs of several views"): the tree built once, each view traced in
/// parallel tiles and written into its own folder, then the run level over the views, all in one output folder
/// swapped in whole.
/// </summary>
internal static class TraceViews
{
    /// <summary>Options that change no number and so are left out of the recorded command (and differ between shards).</summary>
    private static readonly string[] Unrecorded = ["--out", "-o", "--shard", "--threads", "--tile-limit"];

    private static readonly string[] UnrecordedFlags = ["--quiet", "-q"];

    /// <summary>The command's tokens without <see cref="Unrecorded"/> options and their values.</summary>
    public static IReadOnlyList<string> RecordedCommand(IReadOnlyList<string> tokens)
    {
        var kept = new List<string>();
        for (int i = 0; i < tokens.Count; i++)
        {
            string t = tokens[i];
            if (UnrecordedFlags.Contains(t) || Unrecorded.Any(o => t.StartsWith(o + "=", StringComparison.Ordinal)))
                continue;
            if (Unrecorded.Contains(t))
            {
                i++;
                continue;
            }
            kept.Add(t);
        }
        return kept;
    }

    public sealed record Request(Scene Scene, IReadOnlyList<CameraSpec> Views, ShardChoice? Shard, int Branching, int Width, int Height,
        IReadOnlyList<StrategyDefinition> Strategies, int PrepassBlock, int Threads, MemorySettings? Memory, ReportOptions Options,
        TileWatch? Watch = null);

    public static ReportResultSummary Run(Request r, OutputDirectory folder, TracePipeline pipeline, TextWriter error, bool showProgress)
    {
        IReadOnlyList<string> folders = ViewFolders.Assign(r.Views.Select(v => v.Name).ToArray());
        var runViews = r.Views.Select((v, i) => new RunView(v.Name, folders[i], ReportBuilder.CameraOf(v))).ToArray();
        IReadOnlyList<int> picked = r.Shard is { } s ? ViewSelection.Shard(r.Views.Count, s.Index, s.Count) : Enumerable.Range(0, r.Views.Count).ToArray();

        var clock = Stopwatch.StartNew();
        var buildProgress = showProgress ? new TraceProgress(error, r.Height, r.Strategies.Select(x => x.Name).ToArray()) : null;
        ((IProgress<string>?)buildProgress)?.Report($"building the tree of {r.Scene.Name} (branching {r.Branching})");
        // A shard of a run with fewer views than shards may hold none: it writes the run level alone, without a tree.
        BrickTree? tree = picked.Count > 0 ? pipeline.BuildTree(r.Scene, r.Branching, r.Threads) : null;
        buildProgress?.Finish();
        double buildSeconds = clock.Elapsed.TotalSeconds;

        var failures = new List<ExportFailure>();
        int done = 0;
        foreach (int v in picked)
        {
            done++;
            CameraSpec view = r.Views[v];
            var progress = showProgress
                ? new TraceProgress(error, r.Height, r.Strategies.Select(x => x.Name).ToArray(), $"view {done}/{picked.Count} {view.Name}: ")
                : null;
            var request = new TraceRequest(r.Scene, tree!, view, r.Width, r.Height, r.Strategies, r.PrepassBlock, r.Threads, Memory: r.Memory, Watch: r.Watch);
            TraceRun run = pipeline.Trace(request, progress);
            ReportResult written = ReportWriter.WriteFiles(run, r.Options, folder.Folder(folders[v]), progress);
            progress?.Finish();
            failures.AddRange(written.Failures.Select(f => f with { Exporter = $"{view.Name}: {f.Exporter}" }));
        }

        var held = picked.Select(i => runViews[i]).ToArray();
        IReadOnlyList<ViewReport> reports = RunWriter.ReadViews(folder, held);
        var header = new RunHeader(r.Options.ToolVersion, r.Options.ToolCommit, ReportBuilder.SceneOf(r.Scene), r.Options.CommandLine,
            runViews, r.Options.Html, r.Options.Environment)
        {
            LinkBase = r.Options.LinkBase,
        };
        RunShard? shard = r.Shard is { } sh ? new RunShard(sh.Index, sh.Count, held.Select(h => h.Name).ToArray()) : null;
        var timings = new RunTimings(buildSeconds, clock.Elapsed.TotalSeconds - buildSeconds, r.Options.Threads);
        RunDocument document = RunWriter.Build(header, reports, shard, timings);
        failures.AddRange(RunWriter.Write(folder, document, reports));
        int files = folder.Written.Count;
        folder.Commit();
        return new ReportResultSummary(folder.FullPath, document, files, failures);
    }
}

/// <summary>What a run of several views wrote.</summary>
internal sealed record ReportResultSummary(string Directory, RunDocument Document, int Files, IReadOnlyList<ExportFailure> Failures);
