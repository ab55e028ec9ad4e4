using BenchmarkDotNet.Running;
using VoxProf.Benchmarks;
using VoxProf.Core.Scenes;

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
    int w = 1280, h = 720;
    if (args.Length > 2)
    {
        string[] parts = args[2].Split('x');
        w = int.Parse(parts[0]);
        h = int.Parse(parts[1]);
    }
    int branching = args.Length > 3 ? int.Parse(args[3]) : 4;
    int prepass = args.Length > 4 ? int.Parse(args[4]) : 0;
    QuickTiming.Run(scene, w, h, branching, prepass, Console.Out);
    return 0;
}
if (args.Length > 2 && args[0] == "views")
{
    int w = 1280, h = 720;
    if (args.Length > 3)
    {
        string[] parts = args[3].Split('x');
        w = int.Parse(parts[0]);
        h = int.Parse(parts[1]);
    }
    ViewsTiming.Run(SceneLoader.Load(args[1]), args[2], w, h, Console.Out);
    return 0;
}
if (args.Length > 1 && args[0] == "png")
{
    PngTiming.Run(args[1], args.Length > 2 ? int.Parse(args[2]) : 5, Console.Out);
    return 0;
}
BenchmarkSwitcher.FromAssembly(typeof(QuickTiming).Assembly).Run(args);
return 0;
