using VoxProf.Core.Scenes;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;
using VoxProf.Tests.Traversal;

namespace VoxProf.Tests.Strategies;

/// <summary>The strategy files in samples/strategies, compiled as a user's would be and traced on the demo scene.</summary>
public class SampleStrategyTests
{
    private static readonly string Samples = Path.Combine(AppContext.BaseDirectory, "samples");

    internal static readonly Lazy<StrategyDefinition> HddaAgain = new(() =>
        StrategyFiles.Compile(Path.Combine(Samples, "strategies", "hdda-again.cs")).Single());

    internal static readonly Lazy<StrategyDefinition> BoxSkip = new(() =>
        StrategyFiles.Compile(Path.Combine(Samples, "strategies", "box-skip.cs")).Single());

    [Theory]
    [InlineData(2)]
    [InlineData(4)]
    [InlineData(8)]
    public void The_sample_that_writes_hdda_again_counts_exactly_what_hdda_counts(int branching)
    {
        BrickTree tree = DemoTrees.Tree(branching);
        foreach (CameraSpec cam in DemoTrees.Scene.Cameras)
        {
            TraceRun run = Tracer.Run(new TraceRequest(DemoTrees.Scene, tree, cam, 48, 27, [BuiltInStrategies.Hdda, HddaAgain.Value], 0, 2));
            StrategyResult hdda = run.Results[0], again = run.Results[1];
            again.Strategy.Source.Should().EndWith("hdda-again.cs");
            again.CounterNames.Should().Equal(hdda.CounterNames);
            for (int c = 0; c < hdda.Counters.Length; c++)
                again.Counters[c].Should().Equal(hdda.Counters[c], $"{hdda.CounterNames[c]} of camera {cam.Name}");
            again.Hits.Should().Equal(hdda.Hits);
            hdda.Get(Counter.Iterations).ToArray().Sum(v => (long)v).Should().BeGreaterThan(0);
        }
    }

    [Theory]
    [InlineData(2)]
    [InlineData(4)]
    public void The_box_skip_sample_hits_what_grid_hits_on_every_pixel_of_the_demo_and_skips_children(int branching)
    {
        BrickTree tree = DemoTrees.Tree(branching);
        long skips = 0, tests = 0;
        foreach (CameraSpec cam in DemoTrees.Scene.Cameras)
        {
            foreach (int prepass in new[] { 0, 4 })
            {
                TraceRun run = Tracer.Run(new TraceRequest(DemoTrees.Scene, tree, cam, 48, 27,
                    [BuiltInStrategies.Grid, BoxSkip.Value], prepass, 2));
                KernelAgreementTests.Mismatches(run, BoxSkip.Value).Should().Be(0, $"camera {cam.Name}, prepass {prepass}");
                StrategyResult r = run.Results[1];
                r.CounterNames.Should().EndWith(["box-tests", "box-skips"]);
                tests += r.Find("box-tests")!.Sum(v => (long)v);
                skips += r.Find("box-skips")!.Sum(v => (long)v);
            }
        }
        skips.Should().BeGreaterThan(0, "the demo has children whose occupied box the rays pass beside");
        skips.Should().BeLessThan(tests);
    }

    [Fact]
    public void The_box_skip_sample_agrees_with_grid_on_seeded_random_scenes_and_cameras()
    {
        // The same differential check as the built-in kernels' (KernelAgreementTests), including cameras inside.
        int bad = 0;
        for (int seed = 1; seed <= 3; seed++)
        {
            foreach (int branching in new[] { 2, 4, 8 })
            {
                const int size = 40;
                BrickTree tree = DenseTree.Build(size, size - 7, size + 5, KernelAgreementTests.RandomBlobs(seed, size, 12), branching);
                Scene scene = DenseTree.SceneOf(size, size - 7, size + 5);
                var rng = new Random(seed * 53);
                for (int c = 0; c < 6; c++)
                {
                    CameraSpec cam = KernelAgreementTests.RandomCamera(rng, size, inside: c % 3 == 0);
                    TraceRun run = Tracer.Run(new TraceRequest(scene, tree, cam, 40, 28, [BuiltInStrategies.Grid, BoxSkip.Value], 0, 2));
                    bad += KernelAgreementTests.Mismatches(run, BoxSkip.Value);
                }
            }
        }
        bad.Should().Be(0);
    }
}
