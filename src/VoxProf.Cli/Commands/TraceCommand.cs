using System.CommandLine;
using System.Globalization;
using System.Numerics;
using VoxProf.Core;
using VoxProf.Core.Limits;
using VoxProf.Core.Memory;
using VoxProf.Core.Scenes;
using VoxProf.Core.Statistics;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;
using VoxProf.Reports.Calibration;
using VoxProf.Reports.Export;
using VoxProf.Reports.Images;
using VoxProf.Reports.Tables;

namespace VoxProf.Cli.Commands;

/// <summary>The steps of a trace that are not the command's own, replaceable in tests.</summary>
internal sealed record TracePipeline(
    Func<string, SceneLoadOptions, Scene> LoadScene,
    Func<Scene, int, int, BrickTree> BuildTree,
    Func<TraceRequest, IProgress<int>?, TraceRun> Trace,
    Func<bool> StderrIsTerminal,
    Func<MemoryLimit>? AvailableMemory = null)
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
        var camera = new Option<string?>("--camera", "-c") { Description = "Named camera of the scene (default: the first)." };
        var eye = new Option<string?>("--eye") { Description = "Custom camera position X,Y,Z in voxels (with --target)." };
        var target = new Option<string?>("--target") { Description = "Point the custom camera looks at, X,Y,Z." };
        var up = new Option<string?>("--up") { Description = "Camera up direction X,Y,Z (default 0,1,0)." };
        var fov = new Option<float?>("--fov") { Description = $"Vertical field of view in degrees, {CameraChecks.MinFovDegrees} to {CameraChecks.MaxFovDegrees} (custom camera default 60)." };
        var size = new Option<string>("--size") { Description = "Image size WxH.", DefaultValueFactory = _ => $"{DefaultWidth}x{DefaultHeight}" };
        var strategy = new Option<string?>("--strategy", "-s") { Description = $"Comma-separated strategies (default all): {StrategyNames.ValidList}." };
        var prepass = new Option<int?>("--prepass") { Description = "Coarse prepass block size K: 2, 4 or 8 (default off)." };
        var branching = new Option<int>("--branching") { Description = "Tree branching factor: 2 or 4.", DefaultValueFactory = _ => 4 };
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
        var calibration = new Option<string?>("--calibration") { Description = "calibration.json from `voxprof calibrate`: adds predicted-ms and a predicted-cost heatmap." };

        var cmd = new Command("trace", "Trace a scene with each strategy and write heatmaps, summaries, report.json and report.html.")
        {
            scene, camera, eye, target, up, fov, size, strategy, prepass, branching, counters, scale, range, outDir, threads,
            quiet, perPixel, noPixels, noHtml, baseline, linkBase, calibration,
        };
        var sceneOptions = new SceneOptions();
        sceneOptions.AddTo(cmd);
        var memoryOptions = new MemoryOptions();
        memoryOptions.AddTo(cmd);
        cmd.SetAction(parse =>
        {
            return Guard.Run(error, () =>
            {
                // Option values first: a mistake is reported before any slow work starts.
                var (width, height) = OptionParsing.Size(parse.GetValue(size)!);
                List<Strategy> strategies = parse.GetValue(strategy) is { } s
                    ? OptionParsing.List<Strategy>(s, "--strategy", "strategy", StrategyNames.TryParse, StrategyNames.ValidList)
                    : [.. StrategyNames.All];
                List<string> heatmaps = parse.GetValue(counters) is { } c
                    ? OptionParsing.List<string>(c, "--counters", "counter", HeatmapNames.TryParse, HeatmapNames.ValidList)
                    : [.. HeatmapNames.Default];
                int prepassBlock = parse.GetValue(prepass) ?? 0;
                if (parse.GetValue(prepass) is { } k && k is not (2 or 4 or 8))
                    throw new InputException($"--prepass: {k} is not valid, expected 2, 4 or 8");
                int branch = parse.GetValue(branching);
                if (branch is not (2 or 4))
                    throw new InputException($"--branching: {branch} is not valid, expected 2 or 4");
                int threadCount = parse.GetValue(threads);
                if (threadCount < 0)
                    throw new InputException($"--threads: {threadCount} is not valid, expected 0 (every processor) or more");
                ScaleKind scaleKind = OptionParsing.Choice(parse.GetValue(scale)!, "--scale", "linear", "log") == "log" ? ScaleKind.Log : ScaleKind.Linear;
                (double Min, double Max)? fixedRange = parse.GetValue(range) is { } r ? OptionParsing.Range(r) : null;
                Strategy? baselineStrategy = null;
                if (parse.GetValue(baseline) is { } b)
                {
                    if (!StrategyNames.TryParse(b.Trim(), out Strategy bs))
                        throw new InputException($"--baseline: unknown strategy '{b}'; expected one of: {StrategyNames.ValidList}");
                    if (!strategies.Contains(bs))
                        throw new InputException($"--baseline: {bs.Name()} is not among the traced strategies ({string.Join(", ", strategies.Select(x => x.Name()))})");
                    baselineStrategy = bs;
                }
                var view = new CameraChoice(parse.GetValue(camera), parse.GetValue(eye), parse.GetValue(target), parse.GetValue(up), parse.GetValue(fov));
                view.Validate();
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

                // Scene, camera, estimates, output directory (proved writable before the trace), tree, trace.
                Scene loaded = pipeline.LoadScene(parse.GetValue(scene)!, sceneOptions.LoadOptions(parse));
                CameraSpec cam = view.Resolve(loaded);
                RunChecks.BeforeTrace(loaded, cam, branch, width, height, strategies, heatmaps, maxWork,
                    (pipeline.AvailableMemory ?? MemoryLimit.Probe)());
                string dir = outOption ?? Path.Combine("voxprof-out", $"{SafeName(loaded.Name)}-{SafeName(cam.Name)}");
                using OutputDirectory folder = OutputDirectory.Open(dir);
                bool showProgress = !parse.GetValue(quiet) && pipeline.StderrIsTerminal();
                var progress = showProgress ? new TraceProgress(error, height, strategies.Select(x => x.Name()).ToArray()) : null;
                ((IProgress<string>?)progress)?.Report($"building the tree of {loaded.Name} (branching {branch})");
                BrickTree tree = pipeline.BuildTree(loaded, branch, threadCount);
                var request = new TraceRequest(loaded, tree, cam, width, height, strategies, prepassBlock, threadCount, Memory: memory);
                TraceRun run = pipeline.Trace(request, progress);

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
                    CommandLine = parse.Tokens.Select(t => t.Value).ToArray(),
                    Calibration = calibrated,
                };
                ReportResult result = ReportWriter.WriteAll(run, options, folder, progress);
                progress?.Finish();
                if (ToolInfo.IsDebug(options.Environment))
                    error.WriteLine($"voxprof: warning: {ToolInfo.DebugWarning}");
                SummaryConsole.Write(output, result.Document);
                output.WriteLine($"wrote {result.Files.Count.ToString(CultureInfo.InvariantCulture)} files to {result.Directory}");
                if (result.Failures.Count > 0)
                    Guard.WriteError(error, "could not write " + string.Join("; ", result.Failures.Select(f => f.Message)));
                if (result.Failures.Count == 0)
                    return ExitCodes.Ok;
                return result.Failures.All(f => f.Error is IOException or UnauthorizedAccessException or InputException)
                    ? ExitCodes.BadInput
                    : ExitCodes.InternalError;
            });
        });
        return cmd;
    }

    private static string SafeName(string name)
    {
        var chars = name.Select(ch => char.IsLetterOrDigit(ch) || ch is '-' or '_' or '.' ? ch : '_').ToArray();
        string safe = new string(chars).Trim('.');
        return safe.Length == 0 ? "scene" : safe;
    }

    /// <summary>--camera, or a custom view from --eye/--target; --up and --fov adjust either.</summary>
    private sealed record CameraChoice(string? Name, string? Eye, string? Target, string? Up, float? Fov)
    {
        public void Validate()
        {
            if (Name is not null && (Eye is not null || Target is not null))
                throw new InputException("--camera: give either --camera NAME or --eye and --target, not both");
            if ((Eye is null) != (Target is null))
                throw new InputException($"{(Eye is null ? "--eye" : "--target")}: missing; a custom camera needs both --eye and --target");
            if (Fov is { } f && !(f >= CameraChecks.MinFovDegrees && f <= CameraChecks.MaxFovDegrees))
                throw new InputException($"--fov: {f.ToString(CultureInfo.InvariantCulture)} is not valid, expected {CameraChecks.FovRange}");
            if (Eye is not null)
                OptionParsing.Vector(Eye, "--eye");
            if (Target is not null)
                OptionParsing.Vector(Target, "--target");
            if (Up is not null)
                OptionParsing.Vector(Up, "--up");
        }

        public CameraSpec Resolve(Scene scene)
        {
            Vector3? up = Up is null ? null : OptionParsing.Vector(Up, "--up");
            if (Eye is not null && Target is not null)
            {
                var custom = new CameraSpec("custom", OptionParsing.Vector(Eye, "--eye"), OptionParsing.Vector(Target, "--target"),
                    up ?? Vector3.UnitY, Fov ?? DefaultFov);
                Check(custom, up is null, "");
                return custom;
            }
            string valid = scene.Cameras.Count == 0 ? "none" : string.Join(", ", scene.Cameras.Select(c => c.Name));
            CameraSpec chosen;
            if (Name is null)
            {
                chosen = scene.Cameras.Count > 0
                    ? scene.Cameras[0]
                    : throw new InputException($"{scene.SourcePath ?? scene.Name}: the scene has no cameras; give --eye and --target");
            }
            else
            {
                chosen = scene.Cameras.FirstOrDefault(c => string.Equals(c.Name, Name, StringComparison.OrdinalIgnoreCase))
                    ?? throw new InputException($"--camera: no camera '{Name}' in {scene.SourcePath ?? scene.Name}; cameras: {valid}");
            }
            CameraSpec adjusted = chosen with { Up = up ?? chosen.Up, FovYDegrees = Fov ?? chosen.FovYDegrees };
            // The scene loader checked the camera as written; --up can still turn it into one that looks along up.
            Check(adjusted, upIsDefault: false, $" (camera '{chosen.Name}' of {scene.SourcePath ?? scene.Name})");
            return adjusted;
        }

        /// <summary>The scene files' camera checks (<see cref="CameraChecks"/>), naming the option at fault.</summary>
        private void Check(CameraSpec camera, bool upIsDefault, string which)
        {
            if (CameraChecks.Check(camera.Eye, camera.Target, camera.Up, camera.FovYDegrees, upIsDefault) is not { } problem)
                return;
            string option = problem.Part switch
            {
                CameraPart.Up => $"--up {Up}",
                CameraPart.Fov => $"--fov {Fov?.ToString(CultureInfo.InvariantCulture)}",
                _ => Target is null ? "--camera" : $"--target {Target}",
            };
            throw new InputException($"{option}: {problem.Message}{which}");
        }
    }
}
