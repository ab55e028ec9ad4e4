namespace VoxProf.Core.Traversal;

/// <summary>
/// The per-pixel buffers one strategy's result fills: a <c>uint</c> per counter and a hit record per pixel. All of a
/// trace's buffers are allocated, and their pages written once, before any strategy's timed region, so a strategy's
/// time is its tracing alone and not the operating system's first touch of some 50 MB (at 1280×720).
/// </summary>
internal sealed class ResultBuffers
{
    private ResultBuffers(int pixels)
    {
        Counters = new uint[CounterNames.Count][];
        // Uninitialised: the one clearing below is then the only pass over the memory.
        for (int c = 0; c < Counters.Length; c++)
            Counters[c] = GC.AllocateUninitializedArray<uint>(pixels);
        Hits = GC.AllocateUninitializedArray<PixelHit>(pixels);
    }

    public uint[][] Counters { get; }
    public PixelHit[] Hits { get; }

    public static ResultBuffers[] Allocate(int strategies, int pixels, ParallelOptions options)
    {
        var buffers = new ResultBuffers[strategies];
        for (int s = 0; s < strategies; s++)
            buffers[s] = new ResultBuffers(pixels);
        // Clearing writes every page: the memory is committed here rather than inside the kernels.
        Parallel.For(0, strategies * (CounterNames.Count + 1), options, i =>
        {
            ResultBuffers b = buffers[i / (CounterNames.Count + 1)];
            int c = i % (CounterNames.Count + 1);
            if (c < CounterNames.Count)
                Array.Clear(b.Counters[c]);
            else
                Array.Clear(b.Hits);
        });
        return buffers;
    }
}
