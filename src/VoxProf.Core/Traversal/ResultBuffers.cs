namespace VoxProf.Core.Traversal;

/// <summary>
/// The per-pixel buffers one strategy's result fills: a <c>uint</c> per counter and a hit record per pixel. All of a
/// trace's buffers are allocated, and their pages written once, before any strategy's timed region, so a strategy's
/// time is its tracing alone and not the operating system's first touch of some 50 MB (at 1280×720).
/// </summary>
internal sealed class ResultBuffers
{
    private ResultBuffers(int counters, int pixels)
    {
        Counters = new uint[counters][];
        // Uninitialised: the one clearing below is then the only pass over the memory (on huge pages where the
        // system offers them: LargeArrays).
        for (int c = 0; c < Counters.Length; c++)
            Counters[c] = LargeArrays.Uninitialized<uint>(pixels);
        Hits = LargeArrays.Uninitialized<PixelHit>(pixels);
    }

    public uint[][] Counters { get; }
    public PixelHit[] Hits { get; }

    /// <param name="counters">Per strategy, the number of its counters.</param>
    public static ResultBuffers[] Allocate(IReadOnlyList<int> counters, int pixels, ParallelOptions options)
    {
        var buffers = counters.Select(n => new ResultBuffers(n, pixels)).ToArray();
        var arrays = buffers.SelectMany(b => b.Counters.Select(c => (Array)c).Append(b.Hits)).ToArray();
        // Clearing writes every page: the memory is committed here rather than inside the kernels.
        Parallel.For(0, arrays.Length, options, i => Array.Clear(arrays[i]));
        return buffers;
    }
}
