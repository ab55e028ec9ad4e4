namespace VoxProf.Core.Traversal;

/// <summary>
/// The per-pixel buffers one strategy's result fills: a <c>uint</c> per counter and a hit record per pixel. All of a
/// trace's buffers are allocated, and their pages written once, before any strategy's timed region, so a strategy's
/// time is its tracing alone and not the operating system's first touch of some 50 MB (at 1280×720).
/// </summary>
public sealed class ResultBuffers
{
    private ResultBuffers(uint[][] counters, PixelHit[] hits, bool[] produced)
    {
        Counters = counters;
        Hits = hits;
        Produced = produced;
    }

    public uint[][] Counters { get; }
    public PixelHit[] Hits { get; }

    /// <summary>Per counter, whether the trace can make it non-zero; those it cannot share one buffer of zeros, which nothing may write.</summary>
    public IReadOnlyList<bool> Produced { get; }

    /// <summary>
    /// The buffers a trace of <paramref name="request"/> fills, one set per strategy, as <see cref="Tracer.Run"/>
    /// allocates them: for code that lays results together instead of tracing (a merge of tile shards), which then
    /// pays for the same memory a trace does and no more.
    /// </summary>
    public static ResultBuffers[] For(TraceRequest request) =>
        For(request, request.PrepassBlock > 0 && request.Strategies.Any(s => s.UsesPrepass), new ParallelOptions
        {
            MaxDegreeOfParallelism = request.Threads > 0 ? request.Threads : Environment.ProcessorCount,
        });

    /// <param name="prepass">Whether the trace runs the prepass (for the strategies that use it).</param>
    internal static ResultBuffers[] For(TraceRequest request, bool prepass, ParallelOptions options)
    {
        bool modelsMemory = request.CountWork && request.Memory is not null;
        return Allocate(request.Strategies.Select(d => d.CounterNames.Count).ToArray(),
            (s, c) => (Counter)c switch
            {
                Counter.PrepassIterations or Counter.PrepassNodeFetches or Counter.PrepassSkip => prepass && request.Strategies[s].UsesPrepass,
                Counter.CacheLines => modelsMemory,
                var counter => !request.Strategies[s].NeverCounts.Contains(counter),
            },
            request.Width * request.Height, options);
    }

    /// <param name="counters">Per strategy, the number of its counters.</param>
    /// <param name="produces">Whether strategy s can make counter c non-zero in this trace. The counters it cannot
    /// (the prepass's three without the prepass, the cache lines without the memory model, and those a built-in
    /// strategy never counts, <see cref="Strategies.StrategyDefinition.NeverCounts"/>) share one buffer of zeros per
    /// trace: up to 32 of a strategy's 72 bytes a pixel, memory this virtual machine is slow to hand out
    /// (docs/performance.md). Nothing writes to it: a tile copies only the counters it made non-zero.</param>
    private static ResultBuffers[] Allocate(IReadOnlyList<int> counters, Func<int, int, bool> produces, int pixels, ParallelOptions options)
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
            buffers[s] = new ResultBuffers([.. kept[s].Select(k => k ? run[next++] : zeros!)], hits[s], kept[s]);
        Array[] arrays = [.. run, .. hits];
        // Clearing writes every page: the memory is committed here rather than inside the kernels.
        Parallel.For(0, arrays.Length, options, i => Array.Clear(arrays[i]));
        return buffers;
    }
}
