namespace VoxProf.Core.Traversal;

/// <summary>
/// The per-pixel buffers one strategy's result fills: a <c>uint</c> per counter and a hit record per pixel. All of a
/// trace's buffers are allocated, and their pages written once, before any strategy's timed region, so a strategy's
/// time is its tracing alone and not the operating system's first touch of some 50 MB (at 1280×720).
/// </summary>
internal sealed class ResultBuffers
{
    private ResultBuffers(int counters, int pixels, Func<int, bool> produces, ref uint[]? zeros)
    {
        Counters = new uint[counters][];
        // Uninitialised: the one clearing below is then the only pass over the memory (on huge pages where the
        // system offers them: LargeArrays).
        for (int c = 0; c < Counters.Length; c++)
            Counters[c] = produces(c) ? LargeArrays.Uninitialized<uint>(pixels) : zeros ??= LargeArrays.Uninitialized<uint>(pixels);
        Hits = LargeArrays.Uninitialized<PixelHit>(pixels);
    }

    public uint[][] Counters { get; }
    public PixelHit[] Hits { get; }

    /// <param name="counters">Per strategy, the number of its counters.</param>
    /// <param name="produces">Whether strategy s can make counter c non-zero in this trace. The counters it cannot
    /// (the prepass's three without the prepass, the cache lines without the memory model) share one buffer of zeros
    /// per trace: up to 16 of a strategy's 72 bytes a pixel, memory this virtual machine is slow to hand out
    /// (docs/performance.md). Nothing writes to it: a tile copies only the counters it made non-zero.</param>
    public static ResultBuffers[] Allocate(IReadOnlyList<int> counters, Func<int, int, bool> produces, int pixels, ParallelOptions options)
    {
        uint[]? zeros = null;
        var buffers = new ResultBuffers[counters.Count];
        for (int s = 0; s < buffers.Length; s++)
        {
            int strategy = s;
            buffers[s] = new ResultBuffers(counters[s], pixels, c => produces(strategy, c), ref zeros);
        }
        var arrays = buffers.SelectMany(b => b.Counters.Select(c => (Array)c).Append(b.Hits)).Distinct(ReferenceEqualityComparer.Instance).Cast<Array>().ToArray();
        // Clearing writes every page: the memory is committed here rather than inside the kernels.
        Parallel.For(0, arrays.Length, options, i => Array.Clear(arrays[i]));
        return buffers;
    }
}
