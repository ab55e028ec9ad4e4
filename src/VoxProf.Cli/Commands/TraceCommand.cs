using System.CommandLine;
using System.Globalization;
using VoxProf.Core;
using VoxProf.Core.Limits;
using VoxProf.Core.Memory;
using VoxProf.Core.Scenes;
using VoxProf.Core.Statistics;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;
using VoxProf.Reports.Calibration;
using VoxProf.Reports.Export;
using VoxProf.Reports.Images;
using VoxProf.Reports.Shards;
using VoxProf.Reports.Tables;
using VoxProf.Reports.Views;

namespace VoxProf.Cli.Commands;

/// <summary>The steps of a trace that are not the command's own, replaceable in tests.</summary>
internal sealed record TracePipeline(
    Func<string, SceneLoadOptions, Scene> LoadScene,
    Func<Scene, int, int, BrickTree> BuildTree,
    Func<TraceRequest, IProgress<int>?, TraceRun> Trace,
    Func<bool> StderrIsTerminal,
    Func<MemoryLimit>? AvailableMemory = null,
    Action<int>? Exit = null)
{
    public static TracePipeline Default { get; } = new(
        SceneLoader.Load, (scene, branching, threads) => TreeBuilder.Build(scene, branching, threads),
        (request, progress) => Tracer.Run(request, progress), () => !Console.IsErrorRedirected);
}

public static class TraceCommand
{
    public const int DefaultWidth = 1280;
    public const int DefaultHeight = 720;
    public const float DefaultFov = 60;

    public static Command Create(TextWriter output, TextWriter error) => Create(output, error, TracePipeline.Default);

    internal static Command Create(TextWriter output, TextWriter error, TracePipeline pipeline)
    {
        var scene = new Argument<string>("scene") { Description = "Scene file (JSON)." };
        var camera = new Option<string?>("--camera", "-c") { Description = "Cameras, camera paths or frames (walk#007) of the scene, comma-separated, or all (default: the first the scene lists)." };
        var shard = new Option<string?>("--shard") { Description = "Trace share I of N of the views, or of one view's image tiles (I/N, e.g. 2/4); `voxprof merge` combines the shards." };
        var eye = new Option<string?>("--eye") { Description = "Custom camera position X,Y,Z in voxels (with --target)." };
        var target = new Option<string?>("--target") { Description = "Point the custom camera looks at, X,Y,Z." };
        var up = new Option<string?>("--up") { Description = "Camera up direction X,Y,Z (default 0,1,0)." };
        var fov = new Option<float?>("--fov") { Description = $"Vertical field of view in degrees, {CameraChecks.MinFovDegrees} to {CameraChecks.MaxFovDegrees} (custom camera default 60)." };
        var size = new Option<string>("--size") { Description = "Image size WxH.", DefaultValueFactory = _ => $"{DefaultWidth}x{DefaultHeight}" };
        var strategy = new Option<string?>("--strategy", "-s") { Description = $"Comma-separated strategies (default all): {new StrategyCatalog().ValidList}, and those of --strategy-file and --strategy-assembly." };
        var strategyFile = new Option<string[]>("--strategy-file") { Description = "C# file of strategies of your own, compiled before the trace (docs/writing-a-strategy.md); repeatable. Its code runs as yours." };
        var strategyAssembly = new Option<string[]>("--strategy-assembly") { Description = "Built .NET library of strategies of your own; repeatable. Its code runs as yours." };
        var prepass = new Option<int?>("--prepass") { Description = "Coarse prepass block size K: 2, 4 or 8 (default off)." };
        var branching = new Option<int>("--branching") { Description = "Cells per node side: 2, 4 or 8.", DefaultValueFactory = _ => 4 };
        var counters = new Option<string?>("--counters") { Description = $"Heatmaps to draw (default {string.Join(",", HeatmapNames.Default)}): {HeatmapNames.ValidList}." };
        var scale = new Option<string>("--scale") { Description = "Heatmap scale: linear or log.", DefaultValueFactory = _ => "linear" };
        var range = new Option<string?>("--range") { Description = "Fixed heatmap range MIN:MAX, so two runs compare." };
        var outDir = new Option<string?>("--out", "-o") { Description = "Output directory (default voxprof-out/SCENE-CAMERA)." };
        var threads = new Option<int>("--threads") { Description = "Worker threads; 0 means every processor.", DefaultValueFactory = _ => 0 };
        var quiet = new Option<bool>("--quiet", "-q") { Description = "No progress line on stderr." };
        var perPixel = new Option<bool>("--per-pixel") { Description = "Also write pixels-STRATEGY.csv." };
        var noPixels = new Option<bool>("--no-pixels") { Description = "Skip pixels-STRATEGY.bin.gz (compare then draws no difference heatmaps)." };
        var noHtml = new Option<bool>("--no-html") { Description = "Skip report.html." };
        var baseline = new Option<string?>("--baseline", "-b") { Description = "Strategy the ratios in summary.md and report.html are relative to (default: the first tree strategy traced)." };
        var linkBase = new Option<string?>("--link-base") { Description = "Absolute URL the report files will be served from; summary.md's image links then start with it, so they still work once pasted into a pull request." };
        var pixelOpt = new Option<string?>("--pixel") { Description = "Trace pixel X,Y alone with each strategy and print its ray, hits and counts; writes nothing (for following one ray through a strategy of your own)." };
        var calibration = new Option<string?>("--calibration") { Description = "calibration.json from `voxprof calibrate`: adds predicted-ms and a predicted-cost heatmap." };

        var cmd = new Command("trace", "Trace a scene with each strategy and write heatmaps, summaries, report.json and report.html.")
        {
            scene, camera, eye, target, up, fov, size, strategy, strategyFile, strategyAssembly, prepass, branching, counters, scale, range, outDir, threads,
            quiet, perPixel, noPixels, noHtml, baseline, linkBase, calibration, shard, pixelOpt,
        };
        var sceneOptions = new SceneOptions();
        sceneOptions.AddTo(cmd);
        var memoryOptions = new MemoryOptions();
        memoryOptions.AddTo(cmd);
        var tileLimit = new TileLimit();
        tileLimit.AddTo(cmd);
        cmd.SetAction(parse =>
        {
            return Guard.Run(error, () =>
            {
                // Option values first: a mistake is reported before any slow work starts.
                var (width, height) = OptionParsing.Size(parse.GetValue(size)!);
                (int X, int Y)? lone = parse.GetValue(pixelOpt) is { } pixelText ? PixelProbe.Parse(pixelText, width, height) : null;
                StrategyCatalog catalog = LoadStrategies(parse.GetValue(strategyFile) ?? [], parse.GetValue(strategyAssembly) ?? []);
                List<StrategyDefinition> strategies = parse.GetValue(strategy) is { } s
                    ? OptionParsing.List<StrategyDefinition>(s, "--strategy", "strategy", catalog.TryParse, catalog.ValidList)
                    : [.. catalog.All];
                IReadOnlyList<string> mapNames = HeatmapNames.For(strategies);
                List<string> heatmaps = parse.GetValue(counters) is { } c
                    ? OptionParsing.List<string>(c, "--counters", "counter", (string text, out string name) =>
                    {
                        name = mapNames.FirstOrDefault(n => string.Equals(n, text, StringComparison.OrdinalIgnoreCase)) ?? "";
                        return name.Length > 0;
                    }, string.Join(", ", mapNames))
                    : [.. HeatmapNames.Default];
                int prepassBlock = parse.GetValue(prepass) ?? 0;
                if (parse.GetValue(prepass) is { } k && k is not (2 or 4 or 8))
                    throw new InputException($"--prepass: {k} is not valid, expected 2, 4 or 8");
                int branch = parse.GetValue(branching);
                if (!BrickTree.Branchings.Contains(branch))
                    throw new InputException($"--branching: {branch} is not valid, expected 2, 4 or 8");
                int threadCount = parse.GetValue(threads);
                if (threadCount < 0)
                    throw new InputException($"--threads: {threadCount} is not valid, expected 0 (every processor) or more");
                ScaleKind scaleKind = OptionParsing.Choice(parse.GetValue(scale)!, "--scale", "linear", "log") == "log" ? ScaleKind.Log : ScaleKind.Linear;
                (double Min, double Max)? fixedRange = parse.GetValue(range) is { } r ? OptionParsing.Range(r) : null;
                StrategyDefinition? baselineStrategy = null;
                if (parse.GetValue(baseline) is { } b)
                {
                    if (!catalog.TryParse(b.Trim(), out StrategyDefinition bs))
                        throw new InputException($"--baseline: unknown strategy '{b}'; expected one of: {catalog.ValidList}");
                    if (!strategies.Contains(bs))
                        throw new InputException($"--baseline: {bs.Name} is not among the traced strategies ({string.Join(", ", strategies.Select(x => x.Name))})");
                    baselineStrategy = bs;
                }
                var view = new CameraChoice(parse.GetValue(camera), parse.GetValue(eye), parse.GetValue(target), parse.GetValue(up), parse.GetValue(fov));
                view.Validate();
                ShardChoice? shardChoice = parse.GetValue(shard) is { } sc ? ShardChoice.Parse(sc) : null;
                Uri? links = parse.GetValue(linkBase) is { } lb ? OptionParsing.LinkBase(lb) : null;
                AppliedCalibration? calibrated = parse.GetValue(calibration) is { } cf ? CalibrationFile.Read(cf) : null;
                if (calibrated is not null)
                {
                    if (calibrated.Model.ScopeWarning(branch, width, height) is { } w)
                        error.WriteLine($"voxprof: warning: {w}");
                    heatmaps.Add(HeatmapNames.PredictedCost);
                }
                MemorySettings? memory = memoryOptions.Settings(parse, heatmaps, calibrated?.Model);
                string? outOption = parse.GetValue(outDir);
                OutputDirectory.CheckPath(outOption, "--out");
                double maxWork = sceneOptions.MaxWork(parse);
                TileWatch? watch = tileLimit.Watch(parse);

                // Scene, camera, estimates, output directory (proved writable before the trace), tree, trace.
                Scene loaded = pipeline.LoadScene(parse.GetValue(scene)!, sceneOptions.LoadOptions(parse));
                IReadOnlyList<CameraSpec> views = view.ResolveAll(loaded);
                // --shard of a single view splits its image's tiles instead of the views (docs/reports.md).
                bool tileShard = shardChoice is not null && views.Count == 1 && !view.NamesSeveral;
                bool severalViews = !tileShard && (shardChoice is not null || views.Count > 1 || view.NamesSeveral);
                if (tileShard && parse.GetValue(noPixels))
                    throw new InputException("--shard: a shard of one view's tiles is its pixel data, which --no-pixels turns off; trace the shard without --no-pixels");
                MemoryLimit available = (pipeline.AvailableMemory ?? MemoryLimit.Probe)();
                foreach (CameraSpec v in views)
                    RunChecks.BeforeTrace(loaded, v, branch, width, height, strategies, heatmaps, maxWork, available);
                CameraSpec cam = views[0];
                Action<int> exit = pipeline.Exit ?? Environment.Exit;
                if (lone is not null)
                {
                    if (severalViews || tileShard)
                        throw new InputException("--pixel: follows one ray of one view; give one camera and no --shard");
                    BrickTree probeTree = pipeline.BuildTree(loaded, branch, threadCount);
                    using IDisposable probeCheck = TileLimit.Guard(watch, TileLimit.Ender(error, false, null, exit));
                    return PixelProbe.Run(output, pipeline, new TraceRequest(loaded, probeTree, cam, width, height, strategies, prepassBlock,
                        threadCount, Memory: memory, Watch: watch, Pixel: lone));
                }
                string shardSuffix = shardChoice is { } sh ? $"-shard{sh.Index}of{sh.Count}" : "";
                string dir = outOption ?? Path.Combine("voxprof-out", severalViews
                    ? $"{SafeName(loaded.Name)}-{SafeName(view.Name ?? cam.Name.Split('#')[0])}{shardSuffix}"
                    : $"{SafeName(loaded.Name)}-{SafeName(cam.Name)}{shardSuffix}");
                using OutputDirectory folder = OutputDirectory.Open(dir);
                bool showProgress = !parse.GetValue(quiet) && pipeline.StderrIsTerminal();
                using IDisposable stallCheck = TileLimit.Guard(watch, TileLimit.Ender(error, showProgress, folder.Dispose, exit));
                var options = new ReportOptions
                {
                    Scale = scaleKind,
                    RangeMin = fixedRange?.Min,
                    RangeMax = fixedRange?.Max,
                    Heatmaps = heatmaps,
                    PerPixel = parse.GetValue(perPixel),
                    Baseline = baselineStrategy,
                    PixelData = !parse.GetValue(noPixels),
                    Html = !parse.GetValue(noHtml),
                    LinkBase = links,
                    Threads = threadCount == 0 ? Environment.ProcessorCount : threadCount,
                    CommandLine = TraceViews.RecordedCommand(parse.Tokens.Select(t => t.Value).ToArray()),
                    Calibration = calibrated,
                };
                if (severalViews)
                {
                    var request = new TraceViews.Request(loaded, views, shardChoice, branch, width, height, strategies, prepassBlock, threadCount, memory, options, watch);
                    ReportResultSummary written = TraceViews.Run(request, folder, pipeline, error, showProgress);
                    return Finish(output, error, options, written.Document.Views.Count, written.Files, written.Directory, written.Failures,
                        () => RunConsole.Write(output, written.Document));
                }
                var progress = showProgress ? new TraceProgress(error, height, strategies.Select(x => x.Name).ToArray()) : null;
                TileShare? tiles = tileShard ? new TileShare(shardChoice!.Index, shardChoice.Count) : null;
                ((IProgress<string>?)progress)?.Report($"building the tree of {loaded.Name} (branching {branch})");
                BrickTree tree = pipeline.BuildTree(loaded, branch, threadCount);
                var traceRequest = new TraceRequest(loaded, tree, cam, width, height, strategies, prepassBlock, threadCount, Memory: memory, Tiles: tiles, Watch: watch);
                TraceRun run = pipeline.Trace(traceRequest, progress);
                if (tiles is not null)
                {
                    progress?.Finish();
                    TileShard.Write(folder, run, options, tiles);
                    int written = folder.Written.Count;
                    folder.Commit();
                    output.WriteLine($"shard {tiles.Index.ToString(CultureInfo.InvariantCulture)} of {tiles.Count.ToString(CultureInfo.InvariantCulture)} of {cam.Name}: "
                        + $"{tiles.Tiles(width, height).Length.ToString(CultureInfo.InvariantCulture)} of {(Tracer.TilesX(width) * Tracer.TilesY(height)).ToString(CultureInfo.InvariantCulture)} tiles; "
                        + $"wrote {written.ToString(CultureInfo.InvariantCulture)} files to {folder.FullPath} (`voxprof merge` makes the view's report)");
                    return ExitCodes.Ok;
                }
                ReportResult result = ReportWriter.WriteAll(run, options, folder, progress);
                progress?.Finish();
                return Finish(output, error, options, 1, result.Files.Count, result.Directory, result.Failures,
                    () =>
                    {
                        SummaryConsole.Write(output, result.Document);
                        foreach (string line in MismatchLines.For(run))
                            output.WriteLine(line);
                    });
            });
        });
        return cmd;
    }

    /// <summary>The built-in strategies plus those of every file and library named, in the order given.</summary>
    private static StrategyCatalog LoadStrategies(IEnumerable<string> files, IEnumerable<string> assemblies)
    {
        var catalog = new StrategyCatalog();
        foreach (string file in files)
            catalog.Add(StrategyFiles.Compile(file));
        foreach (string assembly in assemblies)
            catalog.Add(StrategyFiles.LoadAssembly(assembly));
        return catalog;
    }

    private static int Finish(TextWriter output, TextWriter error, ReportOptions options, int views, int files, string directory,
        IReadOnlyList<ExportFailure> failures, Action summary)
    {
        if (ToolInfo.IsDebug(options.Environment))
            error.WriteLine($"voxprof: warning: {ToolInfo.DebugWarning}");
        summary();
        string of = views == 1 ? "" : $" ({views.ToString(CultureInfo.InvariantCulture)} views)";
        output.WriteLine($"wrote {files.ToString(CultureInfo.InvariantCulture)} files to {directory}{of}");
        if (failures.Count > 0)
            Guard.WriteError(error, "could not write " + string.Join("; ", failures.Select(f => f.Message)));
        if (failures.Count == 0)
            return ExitCodes.Ok;
        return failures.All(f => f.Error is IOException or UnauthorizedAccessException or InputException)
            ? ExitCodes.BadInput
            : ExitCodes.InternalError;
    }

    private static string SafeName(string name)
    {
        var chars = name.Select(ch => char.IsLetterOrDigit(ch) || ch is '-' or '_' or '.' ? ch : '_').ToArray();
        string safe = new string(chars).Trim('.');
        return safe.Length == 0 ? "scene" : safe;
    }
}
