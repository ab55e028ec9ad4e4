using BenchmarkDotNet.Running;
using VoxProf.Benchmarks;
using VoxProf.Core.Scenes;
using VoxProf.Core.Strategies;

if (args.Length > 1 && args[0] == "build")
{
    // One load and build per process, so the peak working set belongs to this scene and branching alone.
    int branching = args.Length > 2 ? int.Parse(args[2]) : 4;
    BuildTiming.Run(args[1], branching, Console.Out);
    return 0;
}
if (args.Length > 1 && args[0] == "mesh-scene")
{
    MeshScene.Write(args[1], args.Length > 2 ? int.Parse(args[2]) : 1_000_000, Console.Out);
    return 0;
}
if (args.Length > 0 && args[0] == "quick")
{
    Scene scene = args.Length > 1 ? SceneLoader.Load(args[1]) : SampleScenes.Demo();
    (int w, int h) = args.Length > 2 ? Size(args[2]) : (1280, 720);
    int branching = args.Length > 3 ? int.Parse(args[3]) : 4;
    int prepass = args.Length > 4 ? int.Parse(args[4]) : 0;
    QuickTiming.Run(scene, w, h, branching, prepass, Console.Out);
    return 0;
}
if (args.Length > 2 && args[0] == "views")
{
    (int w, int h) = args.Length > 3 ? Size(args[3]) : (1280, 720);
    ViewsTiming.Run(SceneLoader.Load(args[1]), args[2], w, h, Console.Out);
    return 0;
}
if (args.Length > 1 && args[0] == "prepass")
{
    // prepass SCENE [WxH] [K] [STRATEGY] [ROUNDS] [CAMERA|all] [THREADS]: see PrepassTiming.
    Scene scene = SceneLoader.Load(args[1]);
    (int w, int h) = args.Length > 2 ? Size(args[2]) : (1280, 720);
    int block = args.Length > 3 ? int.Parse(args[3]) : 4;
    StrategyDefinition strategy = args.Length > 4
        ? BuiltInStrategies.All.FirstOrDefault(d => d.Name == args[4]) ?? throw new ArgumentException($"unknown strategy {args[4]}")
        : BuiltInStrategies.Dda;
    int rounds = args.Length > 5 ? int.Parse(args[5]) : 3;
    string? only = args.Length > 6 && args[6] != "all" ? args[6] : null;
    int threads = args.Length > 7 ? int.Parse(args[7]) : 0;
    PrepassTiming.Run(scene, w, h, block, strategy, rounds, only, threads, Console.Out);
    return 0;
}
if (args.Length > 5 && args[0] == "side")
{
    // side REFBRICK SCENE CAMERA WxH ROUNDS [SHARE_WxH]: see SideBySide (scripts/side-by-side.sh runs it).
    (int sw, int sh) = Size(args[4]);
    return SideBySide.Run(args[1], args[2], args[3], sw, sh, int.Parse(args[5]), args.Length > 6 ? Size(args[6]) : null, Console.Out);
}
if (args.Length > 4 && args[0] == "kernels")
{
    // kernels SCENE CAMERA WxH REPS [BRANCHING [nocount]]: see KernelTiming.
    (int kw, int kh) = Size(args[3]);
    KernelTiming.Run(SceneLoader.Load(args[1]), args[2], kw, kh, int.Parse(args[4]), args.Length > 5 ? int.Parse(args[5]) : 4,
        count: !(args.Length > 6 && args[6] == "nocount"), Console.Out);
    return 0;
}
if (args.Length > 4 && args[0] == "memory")
{
    // memory SCENE CAMERA WxH REPS [STRATEGY ...]: see MemoryTiming.
    (int mw, int mh) = Size(args[3]);
    MemoryTiming.Run(SceneLoader.Load(args[1]), args[2], mw, mh, int.Parse(args[4]), args[5..], Console.Out);
    return 0;
}
if (args.Length > 4 && args[0] == "loop")
{
    // loop SCENE CAMERA WxH REPS: the C reference's loop in C# (ReferenceLoop), both modes, fastest CPU time of REPS.
    (int lw, int lh) = Size(args[3]);
    Scene scene = SceneLoader.Load(args[1]);
    var tree = VoxProf.Core.Trees.TreeBuilder.Build(scene, 4);
    var image = new VoxProf.Core.Rays.Camera(scene.Cameras.First(c => c.Name == args[2]), lw, lh);
    foreach (bool mask in new[] { false, true })
    {
        var runs = Enumerable.Range(0, int.Parse(args[4])).Select(_ => ReferenceLoop.Run(tree, image, mask)).ToList();
        Console.WriteLine(FormattableString.Invariant(
            $"loop {(mask ? "mask" : "dda "),-4} fastest {runs.Min(r => r.Cpu):F3} s cpu  iterations {runs[0].Iterations}  hits {runs[0].Hits}"));
    }
    return 0;
}
if (args.Length > 4 && args[0] == "lanes")
{
    // lanes SCENE CAMERA WxH REPS: the reference's loop with eight rays in lockstep (LaneLoop), against one ray at a time.
    if (!LaneLoop.IsSupported)
    {
        Console.Error.WriteLine("lanes: this processor lacks AVX-512 (F and DQ) or AVX2");
        return 2;
    }
    (int lw, int lh) = Size(args[3]);
    Scene scene = SceneLoader.Load(args[1]);
    var tree = VoxProf.Core.Trees.TreeBuilder.Build(scene, 4);
    var image = new VoxProf.Core.Rays.Camera(scene.Cameras.First(c => c.Name == args[2]), lw, lh);
    foreach (bool mask in new[] { false, true })
    {
        var scalar = Enumerable.Range(0, int.Parse(args[4])).Select(_ => ReferenceLoop.Run(tree, image, mask)).ToList();
        var lanes = Enumerable.Range(0, int.Parse(args[4])).Select(_ => LaneLoop.Run(tree, image, mask)).ToList();
        string mode = mask ? "mask" : "dda ";
        Console.WriteLine(FormattableString.Invariant(
            $"{mode} one ray at a time  fastest {scalar.Min(r => r.Cpu):F3} s cpu  iterations {scalar[0].Iterations}  hits {scalar[0].Hits}"));
        Console.WriteLine(FormattableString.Invariant(
            $"{mode} eight in lockstep  fastest {lanes.Min(r => r.Cpu):F3} s cpu  iterations {lanes[0].Iterations}  hits {lanes[0].Hits}"));
    }
    return 0;
}
if (args.Length > 1 && args[0] == "png")
{
    PngTiming.Run(args[1], args.Length > 2 ? int.Parse(args[2]) : 5, Console.Out);
    return 0;
}
BenchmarkSwitcher.FromAssembly(typeof(QuickTiming).Assembly).Run(args);
return 0;

static (int Width, int Height) Size(string text)
{
    string[] parts = text.Split('x');
    return (int.Parse(parts[0]), int.Parse(parts[1]));
}
