using System.Numerics;
using FluentAssertions;
using VoxProf.Core.Memory;
using VoxProf.Core.Scenes;
using VoxProf.Core.Statistics;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;
using VoxProf.Tests.Trees;
using Xunit;

namespace VoxProf.Tests.Memory;

/// <summary>The memory model inside real traces: it watches, and never changes what it watches.</summary>
public sealed class TracedMemoryTests
{
    private static readonly CameraSpec Camera = new("c", new Vector3(-10, 60, -30), new Vector3(24, 12, 24), Vector3.UnitY, 60);

    private static (Scene Scene, BrickTree Tree) World(int seed, int branching)
    {
        Scene scene = TestScenes.Random(seed, 48);
        return (scene, TreeBuilder.Build(scene, branching, threads: 1));
    }

    [Theory]
    [InlineData(5, 2, 0)]
    [InlineData(6, 4, 4)]
    public void Turning_the_model_on_changes_no_count_and_no_hit(int seed, int branching, int prepass)
    {
        (Scene scene, BrickTree tree) = World(seed, branching);
        var request = new TraceRequest(scene, tree, Camera, 40, 28, BuiltInStrategies.All, prepass, Threads: 2);
        TraceRun off = Tracer.Run(request);
        TraceRun on = Tracer.Run(request with { Memory = MemorySettings.Default });
        for (int i = 0; i < off.Results.Count; i++)
        {
            StrategyResult a = off.Results[i], b = on.Results[i];
            a.Memory.Should().BeNull();
            b.Memory.Should().NotBeNull();
            b.Hits.Should().Equal(a.Hits, a.Strategy.Name);
            foreach (Counter c in CounterNames.All.Where(c => !c.NeedsMemoryModel()))
                b.Get(c).ToArray().Should().Equal(a.Get(c).ToArray(), $"{a.Strategy.Name} {c.Name()}");
            a.Get(Counter.CacheLines).ToArray().Should().OnlyContain(v => v == 0, "the model was off");
        }
    }

    [Fact]
    public void The_model_gives_the_same_numbers_on_one_thread_and_on_two()
    {
        (Scene scene, BrickTree tree) = World(7, 4);
        var request = new TraceRequest(scene, tree, Camera, 50, 34, BuiltInStrategies.All, Memory: new MemorySettings(128, 8192, 2));
        TraceRun one = Tracer.Run(request with { Threads = 1 });
        TraceRun two = Tracer.Run(request with { Threads = 2 });
        for (int i = 0; i < one.Results.Count; i++)
        {
            MemoryResult a = one.Results[i].Memory!, b = two.Results[i].Memory!;
            (b.Accesses, b.Hits).Should().Be((a.Accesses, a.Hits));
            for (int g = 0; g < a.Groups.Count; g++)
                b.Groups[g].Lines.Should().Equal(a.Groups[g].Lines);
            two.Results[i].Get(Counter.CacheLines).ToArray().Should().Equal(one.Results[i].Get(Counter.CacheLines).ToArray());
        }
    }

    [Fact]
    public void Lines_are_bounded_by_the_reads_and_a_group_touches_at_least_what_each_of_its_lanes_does()
    {
        (Scene scene, BrickTree tree) = World(8, 4);
        TraceRun run = Tracer.Run(new TraceRequest(scene, tree, Camera, 40, 24, BuiltInStrategies.All, Memory: MemorySettings.Default));
        foreach (StrategyResult r in run.Results)
        {
            uint[] lines = r.Counters[(int)Counter.CacheLines], fetches = r.Counters[(int)Counter.NodeFetches];
            for (int p = 0; p < lines.Length; p++)
            {
                // A record lies in one or two lines; the root's read makes every ray that reads anything touch one.
                lines[p].Should().BeLessThanOrEqualTo(2 * fetches[p]);
                (lines[p] > 0).Should().Be(fetches[p] > 0);
            }
            lines.Max().Should().BeGreaterThan(1, $"{r.Strategy.Name} should read more than the root somewhere");
            foreach (SubgroupShape s in SubgroupShape.Standard)
            {
                var tileMax = new uint[s.TilesX(r.Width) * s.TilesY(r.Height)];
                SubgroupModel.TileMax(lines, r.Width, r.Height, s, tileMax);
                uint[] groups = r.Memory!.Of(s)!.Lines;
                for (int g = 0; g < groups.Length; g++)
                    groups[g].Should().BeGreaterThanOrEqualTo(tileMax[g], $"{r.Strategy.Name} {s.Name} group {g}");
            }
            r.Memory!.Accesses.Should().BeGreaterThan(0);
            r.Memory.HitRate.Should().BeInRange(0, 1);
        }
    }
}
