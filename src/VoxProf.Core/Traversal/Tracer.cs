using System.Diagnostics;
using System.Runtime.CompilerServices;
using VoxProf.Core.Memory;
using VoxProf.Core.Rays;
using VoxProf.Core.Scenes;
using VoxProf.Core.Trees;

namespace VoxProf.Core.Traversal;

/// <summary>
/// What to trace. <see cref="PrepassBlock"/> is 0 (off), 2, 4 or 8; <see cref="Threads"/> 0 means every processor.
/// <see cref="CountWork"/> false runs the kernels with counting compiled out (for timing; counters stay zero).
/// <see cref="Memory"/> turns the memory model on (docs/counters.md, "Memory traffic"); null leaves it off, and it
/// never runs without counting.
/// </summary>
public sealed record TraceRequest(
    Scene Scene,
    BrickTree Tree,
    CameraSpec Camera,
    int Width,
    int Height,
    IReadOnlyList<Strategy> Strategies,
    int PrepassBlock = 0,
    int Threads = 0,
    bool CountWork = true,
    MemorySettings? Memory = null);

/// <summary>Runs every requested strategy over the same rays, in parallel over image tiles.</summary>
public static class Tracer
{
    /// <summary>Tile side in pixels: small enough to balance two cores, large enough to keep scheduling cheap.</summary>
    public const int TileSize = 16;

    /// <param name="rowsDone">Reports image rows finished so far, summed over strategies (0 .. Height × Strategies.Count);
    /// called from worker threads.</param>
    public static TraceRun Run(TraceRequest request, IProgress<int>? rowsDone = null, CancellationToken cancel = default)
    {
        Validate(request);
        var options = new ParallelOptions
        {
            MaxDegreeOfParallelism = request.Threads > 0 ? request.Threads : Environment.ProcessorCount,
            CancellationToken = cancel,
        };
        var view = new TreeView(request.Tree);
        var camera = new Camera(request.Camera, request.Width, request.Height);

        // The prepass depends only on geometry and camera, so every strategy that uses it shares one map.
        PrepassMap? prepass = null;
        TimeSpan prepassTime = TimeSpan.Zero;
        if (request.PrepassBlock > 0 && request.Strategies.Any(s => s != Strategy.Grid))
        {
            // The coarse grids belong to the tree, as its nodes do: built once, on its first prepass, outside the timing.
            _ = request.Tree.Coarse;
            var watch = Stopwatch.StartNew();
            prepass = PrepassMap.Compute(request.Tree, camera, request.PrepassBlock, options);
            prepassTime = watch.Elapsed;
        }

        var results = new List<StrategyResult>();
        ResultBuffers[] buffers = ResultBuffers.Allocate(request.Strategies.Count, request.Width * request.Height, options);
        long pixelsDone = 0;
        for (int s = 0; s < request.Strategies.Count; s++)
        {
            Strategy strategy = request.Strategies[s];
            (uint[][] counters, PixelHit[] hits) = (buffers[s].Counters, buffers[s].Hits);
            var sw = Stopwatch.StartNew();
            PrepassMap? map = strategy == Strategy.Grid ? null : prepass;

            int tilesX = (request.Width + TileSize - 1) / TileSize, tilesY = (request.Height + TileSize - 1) / TileSize;
            long before = pixelsDone;
            FrameMemory? memory = request.CountWork && request.Memory is { } ms ? new FrameMemory(ms, request.Width, request.Height) : null;
            Parallel.For(0, tilesX * tilesY, options, tile =>
            {
                int x0 = tile % tilesX * TileSize, y0 = tile / tilesX * TileSize;
                int x1 = Math.Min(request.Width, x0 + TileSize), y1 = Math.Min(request.Height, y0 + TileSize);
                if (memory is not null)
                {
                    // The memory model: the same kernels, with a counter that also records each node read.
                    TileReads reads = memory.BeginTile(x0, y0, x1, y1);
                    TraceTile<MemoryCounts>(view, camera, strategy, map, x0, y0, x1, y1, counters, hits);
                    memory.EndTile(reads, counters[(int)Counter.CacheLines]);
                }
                else if (request.CountWork)
                {
                    TraceTile<CostCounts>(view, camera, strategy, map, x0, y0, x1, y1, counters, hits);
                }
                else
                {
                    TraceTile<NoCounters>(view, camera, strategy, map, x0, y0, x1, y1, counters, hits);
                }
                long done = Interlocked.Add(ref pixelsDone, (long)(x1 - x0) * (y1 - y0));
                rowsDone?.Report((int)(done / request.Width));
            });
            pixelsDone = before + (long)request.Width * request.Height;
            // Each strategy that uses the shared prepass is charged its full time, as it would pay it alone.
            TimeSpan elapsed = sw.Elapsed + (map != null ? prepassTime : TimeSpan.Zero);
            results.Add(new StrategyResult(strategy, request.Width, request.Height, counters, hits, elapsed) { Memory = memory?.Finish() });
        }
        var settings = new TraceSettings(request.Width, request.Height, request.Tree.Branching, request.PrepassBlock, options.MaxDegreeOfParallelism);
        return new TraceRun(request.Scene, request.Camera, settings, request.Tree.Stats, results);
    }

    private static void TraceTile<TCounters>(in TreeView view, Camera camera, Strategy strategy, PrepassMap? prepass,
        int x0, int y0, int x1, int y1, uint[][] buffers, PixelHit[] hits)
        where TCounters : struct, ICostCounters
    {
        Span<WalkFrame> stack = stackalloc WalkFrame[view.Depth + 1];
        int width = camera.Width;
        for (int y = y0; y < y1; y++)
        {
            for (int x = x0; x < x1; x++)
            {
                int pixel = y * width + x;
                RaySetup ray = camera.Ray(x, y);
                double tMin = prepass?.Start(x, y) ?? 0;
                TCounters counters = default;
                ref PixelHit hit = ref hits[pixel];
                switch (strategy)
                {
                    case Strategy.Grid: GridKernel.Trace(view, ray, tMin, ref counters, ref hit); break;
                    case Strategy.Slab: StackWalkKernel.Trace<SlabMode, TCounters>(view, ray, tMin, stack, ref counters, ref hit); break;
                    case Strategy.Dda: StackWalkKernel.Trace<DdaMode, TCounters>(view, ray, tMin, stack, ref counters, ref hit); break;
                    case Strategy.DdaMask: StackWalkKernel.Trace<MaskedDdaMode, TCounters>(view, ray, tMin, stack, ref counters, ref hit); break;
                    case Strategy.Hdda: HddaKernel.Trace(view, ray, tMin, stack, ref counters, ref hit); break;
                }
                // A type test on a struct type parameter is folded by the JIT: the timing build keeps none of this.
                if (typeof(TCounters) == typeof(CostCounts) || typeof(TCounters) == typeof(MemoryCounts))
                {
                    if (typeof(TCounters) == typeof(MemoryCounts))
                        Unsafe.As<TCounters, MemoryCounts>(ref counters).Flush(buffers, pixel);
                    else
                        Unsafe.As<TCounters, CostCounts>(ref counters).Flush(buffers, pixel);
                    if (prepass != null)
                    {
                        buffers[(int)Counter.PrepassIterations][pixel] = prepass.IterationShare(x, y, width, camera.Height);
                        buffers[(int)Counter.PrepassNodeFetches][pixel] = prepass.NodeFetchShare(x, y, width, camera.Height);
                        buffers[(int)Counter.PrepassSkip][pixel] = SkippedVoxels(view, ray, tMin);
                    }
                }
            }
        }
    }

    /// <summary>Whole voxels between where the ray would have entered the volume and where the prepass let it start.</summary>
    private static uint SkippedVoxels(in TreeView view, in RaySetup ray, double tMin)
    {
        if (!SlabTest.Intersect(ray, 0, 0, 0, view.ExtentX, view.ExtentY, view.ExtentZ, 0, double.PositiveInfinity, out SlabHit box))
            return 0;
        double skipped = Math.Min(tMin, box.Far) - box.Near;
        return skipped > 0 ? (uint)Math.Floor(skipped) : 0;
    }

    private static void Validate(TraceRequest r)
    {
        if (r.Width <= 0 || r.Height <= 0)
            throw new ArgumentOutOfRangeException(nameof(r), "image size must be positive");
        if (r.PrepassBlock is not (0 or 2 or 4 or 8))
            throw new ArgumentOutOfRangeException(nameof(r), "prepass block must be 0, 2, 4 or 8");
        if (r.Tree.ExtentX != r.Scene.ExtentX || r.Tree.ExtentY != r.Scene.ExtentY || r.Tree.ExtentZ != r.Scene.ExtentZ)
            throw new ArgumentException("the tree was not built from this scene", nameof(r));
    }
}
