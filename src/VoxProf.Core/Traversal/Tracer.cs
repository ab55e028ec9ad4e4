using System.Diagnostics;
using System.Runtime.CompilerServices;
using VoxProf.Core.Memory;
using VoxProf.Core.Rays;
using VoxProf.Core.Scenes;
using VoxProf.Core.Strategies;
using VoxProf.Core.Trees;

namespace VoxProf.Core.Traversal;

/// <summary>
/// What to trace. <see cref="PrepassBlock"/> is 0 (off), 2, 4 or 8; <see cref="Threads"/> 0 means every processor.
/// <see cref="CountWork"/> false runs the kernels with counting compiled out (for timing; counters stay zero).
/// <see cref="Memory"/> turns the memory model on (docs/counters.md, "Memory traffic"); null leaves it off, and it
/// never runs without counting. <see cref="Tiles"/> traces only that share of the image's tiles (the rest of every
/// buffer stays zero); null traces them all. <see cref="Pixel"/> traces that one pixel alone (everything else stays
/// zero), for following one ray through a strategy. <see cref="Watch"/>, when given, is told when each tile starts and
/// ends.
/// </summary>
public sealed record TraceRequest(
    Scene Scene,
    BrickTree Tree,
    CameraSpec Camera,
    int Width,
    int Height,
    IReadOnlyList<StrategyDefinition> Strategies,
    int PrepassBlock = 0,
    int Threads = 0,
    bool CountWork = true,
    MemorySettings? Memory = null,
    TileShare? Tiles = null,
    TileWatch? Watch = null,
    (int X, int Y)? Pixel = null);

/// <summary>Runs every requested strategy over the same rays, in parallel over image tiles.</summary>
public static class Tracer
{
    /// <summary>Tile side in pixels: small enough to balance two cores, large enough to keep scheduling cheap.</summary>
    public const int TileSize = 16;

    /// <summary>Tile columns of an image <paramref name="width"/> pixels wide.</summary>
    public static int TilesX(int width) => (width + TileSize - 1) / TileSize;

    /// <summary>Tile rows of an image <paramref name="height"/> pixels high.</summary>
    public static int TilesY(int height) => (height + TileSize - 1) / TileSize;

    /// <summary>The pixels [x0, x1) × [y0, y1) of tile <paramref name="tile"/> (row-major over the tile grid).</summary>
    public static (int X0, int Y0, int X1, int Y1) TileBounds(int tile, int width, int height)
    {
        int tilesX = TilesX(width);
        int x0 = tile % tilesX * TileSize, y0 = tile / tilesX * TileSize;
        return (x0, y0, Math.Min(width, x0 + TileSize), Math.Min(height, y0 + TileSize));
    }

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
        if (request.PrepassBlock > 0 && request.Strategies.Any(s => s.UsesPrepass))
        {
            // The coarse grids belong to the tree, as its nodes do: built once, on its first prepass, outside the timing.
            _ = request.Tree.Coarse;
            var watch = Stopwatch.StartNew();
            prepass = PrepassMap.Compute(request.Tree, camera, request.PrepassBlock, options);
            prepassTime = watch.Elapsed;
        }

        var results = new List<StrategyResult>();
        bool modelsMemory = request.CountWork && request.Memory is not null;
        ResultBuffers[] buffers = ResultBuffers.For(request, prepass != null, options);
        long pixelsDone = 0;
        int[] tiles = request.Pixel is { } lone
            ? [lone.Y / TileSize * TilesX(request.Width) + lone.X / TileSize]
            : (request.Tiles ?? new TileShare(1, 1)).Tiles(request.Width, request.Height);
        // A lone pixel is its tile cut down to it: the same per-pixel counts, its rays' only.
        (int X0, int Y0, int X1, int Y1) Bounds(int tile) =>
            request.Pixel is { } p ? (p.X, p.Y, p.X + 1, p.Y + 1) : TileBounds(tile, request.Width, request.Height);
        long heldPixels = 0;
        foreach (int t in tiles)
        {
            var (x0, y0, x1, y1) = Bounds(t);
            heldPixels += (long)(x1 - x0) * (y1 - y0);
        }
        for (int s = 0; s < request.Strategies.Count; s++)
        {
            StrategyDefinition definition = request.Strategies[s];
            (uint[][] counters, PixelHit[] hits) = (buffers[s].Counters, buffers[s].Hits);
            var sw = Stopwatch.StartNew();
            PrepassMap? map = definition.UsesPrepass ? prepass : null;

            long before = pixelsDone;
            FrameMemory? memory = modelsMemory ? new FrameMemory(request.Memory!, NodeLayout.For(request.Tree.Branching), request.Width, request.Height) : null;
            var job = new TileJob(view, camera, map, counters, hits, request.CountWork, memory is not null);
            // A file's strategy that throws is the user's fault: every tile still runs, so the one reported (the first
            // in tile order) is the same whatever the thread count and the order tiles finish in.
            StrategyFault? fault = null;
            var faultLock = new Lock();
            // The memory model's pass over a tile is timed apart from the tile's tracing: a strategy's time is its
            // tracing, not the analysis of its reads, which costs more the more a strategy reads (TimedSplit).
            long tracingTicks = 0, modelTicks = 0;
            long[]? started = request.Watch?.Begin(definition, tiles, request.Width, request.Height);
            Parallel.For(0, tiles.Length, options, i =>
            {
                var (x0, y0, x1, y1) = Bounds(tiles[i]);
                if (started is not null)
                    TileWatch.Mark(started, i, running: true);
                try
                {
                    if (memory is not null)
                    {
                        // The memory model: the same kernels, with a counter that also records each node read.
                        TileReads reads = memory.BeginTile(x0, y0, x1, y1);
                        long begun = Stopwatch.GetTimestamp();
                        definition.TraceTile(job, x0, y0, x1, y1);
                        long traced = Stopwatch.GetTimestamp();
                        memory.EndTile(reads, counters[(int)Counter.CacheLines]);
                        Interlocked.Add(ref tracingTicks, traced - begun);
                        Interlocked.Add(ref modelTicks, Stopwatch.GetTimestamp() - traced);
                    }
                    else
                    {
                        definition.TraceTile(job, x0, y0, x1, y1);
                    }
                }
                catch (Exception ex) when (definition.Source is not null && ex is not OperationCanceledException)
                {
                    lock (faultLock)
                    {
                        if (fault is null || i < fault.Tile)
                            fault = StrategyFault.In(definition, i, (x0, y0, x1, y1), ex);
                    }
                }
                finally
                {
                    if (started is not null)
                        TileWatch.Mark(started, i, running: false);
                }
                long done = Interlocked.Add(ref pixelsDone, (long)(x1 - x0) * (y1 - y0));
                rowsDone?.Report((int)(done / request.Width));
            });
            request.Watch?.End();
            if (fault is not null)
                throw fault;
            pixelsDone = before + heldPixels;
            (TimeSpan tracing, TimeSpan model) = TimedSplit.Split(sw.Elapsed, tracingTicks, modelTicks);
            // Each strategy that uses the shared prepass is charged its full time, as it would pay it alone.
            TimeSpan elapsed = tracing + (map != null ? prepassTime : TimeSpan.Zero);
            results.Add(new StrategyResult(definition, request.Width, request.Height, counters, hits, elapsed)
            {
                Memory = memory?.Finish(),
                MemoryElapsed = model,
            });
        }
        var settings = new TraceSettings(request.Width, request.Height, request.Tree.Branching, request.PrepassBlock, options.MaxDegreeOfParallelism);
        return new TraceRun(request.Scene, request.Camera, settings, request.Tree.Stats, results);
    }

    /// <summary>The tile loop of one strategy, specialised per strategy, branching and counter type.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal static void TraceTile<TStrategy, TBranching, TCounters>(in TileJob job, int x0, int y0, int x1, int y1)
        where TStrategy : struct, IStrategy
        where TBranching : struct, IBranching
        where TCounters : struct, ICostCounters, ICountFlush
    {
        TreeView view = job.View;
        Camera camera = job.Camera;
        PrepassMap? prepass = job.Prepass;
        PixelHit[] hits = job.Hits;
        uint[][] buffers = job.Counters;
        // At least PathReads.Block long, so a short path's reads can be recorded again with one load.
        Span<NodeRef> path = stackalloc NodeRef[Math.Max(view.Depth + 1, PathReads.Block)];
        // The tile's counts, copied into the image's buffers when the tile is done (TileCounts says why).
        Span<uint> tile = typeof(TCounters) != typeof(NoCounters) ? stackalloc uint[buffers.Length * TileCounts.Slots] : default;
        int width = camera.Width;
        TileReads? reads = job.RecordsReads ? TileReads.Current : null;
        for (int y = y0; y < y1; y++)
        {
            for (int x = x0; x < x1; x++)
            {
                int pixel = y * width + x;
                int slot = (y - y0) * TileSize + (x - x0);
                RaySetup ray = camera.Ray(x, y);
                double tMin = prepass?.Start(x, y) ?? 0;
                // The buffers start cleared (ResultBuffers) and each pixel is traced once: a miss writes nothing.
                ref PixelHit hit = ref hits[pixel];
                TCounters counters = TStrategy.Trace<TBranching, TCounters>(view, ray, tMin, path, ref hit);
                // A type test on a struct type parameter is folded by the JIT: the timing build keeps none of this.
                if (typeof(TCounters) != typeof(NoCounters))
                {
                    // A ray whose reads outgrew the tile's recorder is traced again into a larger one
                    // (BoundedRoom); for other counters Flush is a constant true and this folds away.
                    if (!counters.Flush(tile, slot, reads))
                        TraceAgain<TStrategy, TBranching, TCounters>(view, ray, tMin, path, ref hit, tile, slot, reads!);
                    if (prepass != null)
                        tile[TileCounts.Index((int)Counter.PrepassSkip, slot)] = SkippedVoxels(view, ray, tMin);
                }
            }
        }
        if (typeof(TCounters) != typeof(NoCounters))
        {
            prepass?.FillShares(tile, x0, y0, x1, y1);
            TileCounts.CopyTo(tile, buffers, width, x0, y0, x1, y1);
        }
    }

    // Out of the tile loop, whose code it would otherwise crowd: a ray retraced makes the same reads, counts and hit.
    [MethodImpl(MethodImplOptions.NoInlining)]
    private static void TraceAgain<TStrategy, TBranching, TCounters>(in TreeView view, in RaySetup ray, double tMin, Span<NodeRef> path,
        ref PixelHit hit, Span<uint> tile, int slot, TileReads reads)
        where TStrategy : struct, IStrategy
        where TBranching : struct, IBranching
        where TCounters : struct, ICostCounters, ICountFlush
    {
        do
        {
            reads.Grow();
        }
        while (!TStrategy.Trace<TBranching, TCounters>(view, ray, tMin, path, ref hit).Flush(tile, slot, reads));
    }

    /// <summary>Whole voxels between where the ray would have entered the volume and where the prepass let it start.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static uint SkippedVoxels(in TreeView view, in RaySetup ray, double tMin)
    {
        // A block whose coarse ray could not advance skips nothing, whatever the slab test would say.
        if (tMin <= 0)
            return 0;
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
        if (r.Pixel is { } p && (p.X < 0 || p.Y < 0 || p.X >= r.Width || p.Y >= r.Height || r.Tiles is not null))
            throw new ArgumentOutOfRangeException(nameof(r), "a lone pixel must lie in the image, and not with a share of tiles");
        var names = new HashSet<string>(StringComparer.OrdinalIgnoreCase);
        foreach (StrategyDefinition s in r.Strategies)
        {
            if (!names.Add(s.Name))
                throw new ArgumentException($"strategy '{s.Name}' is requested twice", nameof(r));
        }
        if (r.Tree.ExtentX != r.Scene.ExtentX || r.Tree.ExtentY != r.Scene.ExtentY || r.Tree.ExtentZ != r.Scene.ExtentZ)
            throw new ArgumentException("the tree was not built from this scene", nameof(r));
    }
}

/// <summary>What every tile of one strategy's trace shares: the tree, the rays, the prepass and the result buffers.</summary>
/// <param name="RecordsReads">The memory model is on: count with <see cref="MemoryCounts{TCounts, TRoom}"/>, which records each node read.</param>
internal readonly record struct TileJob(TreeView View, Camera Camera, PrepassMap? Prepass, uint[][] Counters, PixelHit[] Hits, bool CountWork,
    bool RecordsReads);
