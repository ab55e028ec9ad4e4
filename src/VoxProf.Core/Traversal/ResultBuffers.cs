namespace VoxProf.Core.Traversal;

/// <summary>
/// The per-pixel buffers one strategy's result fills: a <c>uint</c> per counter and a hit record per pixel. All of a
/// trace's buffers are allocated, and their pages written once, before any strategy's timed region, so a strategy's
/// time is its tracing alone and not the operating system's first touch of some 50 MB (at 1280×720).
/// </summary>
internal sealed class ResultBuffers
{
    private ResultBuffers(uint[][] counters, PixelHit[] hits)
    {
        Counters = counters;
        Hits = hits;
    }

    public uint[][] Counters { get; }
    public PixelHit[] Hits { get; }

    /// <param name="counters">Per strategy, the number of its counters.</param>
    /// <param name="produces">Whether strategy s can make counter c non-zero in this trace. The counters it cannot
    /// (the prepass's three without the prepass, the cache lines without the memory model, and those a built-in
    /// strategy never counts, <see cref="Strategies.StrategyDefinition.NeverCounts"/>) share one buffer of zeros per
    /// trace: up to 32 of a strategy's 72 bytes a pixel, memory this virtual machine is slow to hand out
    /// (docs/performance.md). Nothing writes to it: a tile copies only the counters it made non-zero.</param>
    public static ResultBuffers[] Allocate(IReadOnlyList<int> counters, Func<int, int, bool> produces, int pixels, ParallelOptions options)
    {
        bool[][] kept = [.. counters.Select((n, s) => Enumerable.Range(0, n).Select(c => produces(s, c)).ToArray())];
        int live = kept.Sum(k => k.Count(c => c));
        bool shared = kept.Any(k => k.Contains(false));
        // Uninitialised, in runs offered to huge pages together (LargeArrays.Run): the one clearing below is then the
        // only pass over the memory, and mostly faults 2 MiB at a time.
        uint[][] run = LargeArrays.Run<uint>(live + (shared ? 1 : 0), pixels, pinned: false);
        PixelHit[][] hits = LargeArrays.Run<PixelHit>(counters.Count, pixels, pinned: true);
        uint[]? zeros = shared ? run[^1] : null;
        int next = 0;
        var buffers = new ResultBuffers[counters.Count];
        for (int s = 0; s < buffers.Length; s++)
            buffers[s] = new ResultBuffers([.. kept[s].Select(k => k ? run[next++] : zeros!)], hits[s]);
        Array[] arrays = [.. run, .. hits];
        // Clearing writes every page: the memory is committed here rather than inside the kernels.
        Parallel.For(0, arrays.Length, options, i => Array.Clear(arrays[i]));
        return buffers;
    }
}
