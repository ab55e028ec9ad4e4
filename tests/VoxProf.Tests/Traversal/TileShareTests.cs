using System.Numerics;
using FluentAssertions;
using VoxProf.Core.Memory;
using VoxProf.Core.Scenes;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;
using VoxProf.Tests.Trees;
using Xunit;

namespace VoxProf.Tests.Traversal;

/// <summary>Shares of one view's tiles: together they are the whole trace, pixel for pixel.</summary>
public sealed class TileShareTests
{
    private static readonly CameraSpec Camera = new("c", new Vector3(-10, 60, -30), new Vector3(24, 12, 24), Vector3.UnitY, 60);

    [Fact]
    public void The_shares_split_the_tiles_round_robin_with_none_left_over_or_twice()
    {
        // 50 × 34 pixels is 4 × 3 tiles of 16, the last column and row cut short.
        int[][] shares = [.. Enumerable.Range(1, 5).Select(i => new TileShare(i, 5).Tiles(50, 34))];
        shares.SelectMany(s => s).Order().Should().Equal(Enumerable.Range(0, 12));
        shares[1].Should().Equal(1, 6, 11);
        shares[4].Should().Equal(4, 9);
        new TileShare(3, 20).Tiles(50, 34).Should().Equal(2);
        new TileShare(13, 20).Tiles(50, 34).Should().BeEmpty("more shares than tiles leaves some with none");
    }

    [Fact]
    public void Three_shares_together_equal_the_whole_trace_counters_hits_and_memory_model()
    {
        Scene scene = TestScenes.Random(11, 48);
        BrickTree tree = TreeBuilder.Build(scene, 4, threads: 1);
        var request = new TraceRequest(scene, tree, Camera, 50, 34, BuiltInStrategies.All, PrepassBlock: 4, Threads: 2,
            Memory: new MemorySettings(128, 8192, 2));
        TraceRun whole = Tracer.Run(request);
        TraceRun[] parts = [.. Enumerable.Range(1, 3).Select(i => Tracer.Run(request with { Tiles = new TileShare(i, 3), Threads = i % 2 + 1 }))];

        for (int s = 0; s < whole.Results.Count; s++)
        {
            StrategyResult w = whole.Results[s];
            for (int tile = 0; tile < 12; tile++)
            {
                var (x0, y0, x1, y1) = Tracer.TileBounds(tile, 50, 34);
                for (int y = y0; y < y1; y++)
                {
                    for (int x = x0; x < x1; x++)
                    {
                        int p = y * 50 + x;
                        for (int k = 0; k < 3; k++)
                        {
                            StrategyResult r = parts[k].Results[s];
                            bool owner = tile % 3 == k;
                            r.Hits[p].Should().Be(owner ? w.Hits[p] : default, $"{w.Strategy.Name} pixel {x},{y} share {k + 1}");
                            for (int c = 0; c < w.Counters.Length; c++)
                                r.Counters[c][p].Should().Be(owner ? w.Counters[c][p] : 0u, $"{w.Strategy.Name} {w.CounterNames[c]} pixel {x},{y} share {k + 1}");
                        }
                    }
                }
            }

            // Each lockstep group lies inside one tracer tile and each tile's cache replay starts empty, so the
            // model's totals are sums over the shares.
            MemoryResult m = w.Memory!;
            parts.Sum(p => p.Results[s].Memory!.Accesses).Should().Be(m.Accesses);
            parts.Sum(p => p.Results[s].Memory!.Hits).Should().Be(m.Hits);
            for (int g = 0; g < m.Groups.Count; g++)
            {
                uint[] summed = new uint[m.Groups[g].Lines.Length];
                foreach (TraceRun p in parts)
                {
                    for (int i = 0; i < summed.Length; i++)
                        summed[i] += p.Results[s].Memory!.Groups[g].Lines[i];
                }
                summed.Should().Equal(m.Groups[g].Lines, $"{w.Strategy.Name} group {m.Groups[g].Shape.Name}");
            }
        }
    }
}
