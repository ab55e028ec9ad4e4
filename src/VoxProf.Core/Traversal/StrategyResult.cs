using VoxProf.Core.Memory;

namespace VoxProf.Core.Traversal;

/// <summary>
/// Everything one strategy produced for one image: a plain <c>uint[]</c> per counter (row-major, row 0 at the top)
/// and a hit record per pixel. Normalising and colouring belong to the report writers.
/// </summary>
public sealed class StrategyResult
{
    public StrategyResult(Strategy strategy, int width, int height, uint[][] counters, PixelHit[] hits, TimeSpan elapsed)
    {
        if (counters.Length != CounterNames.Count)
            throw new ArgumentException($"expected {CounterNames.Count} counter buffers", nameof(counters));
        Strategy = strategy;
        Width = width;
        Height = height;
        Counters = counters;
        Hits = hits;
        Elapsed = elapsed;
    }

    public Strategy Strategy { get; }
    public int Width { get; }
    public int Height { get; }

    /// <summary>Indexed by <see cref="Counter"/>, then by pixel y * Width + x.</summary>
    public uint[][] Counters { get; }

    public PixelHit[] Hits { get; }

    /// <summary>Wall time of this strategy's trace (not deterministic; keep it apart from counts).</summary>
    public TimeSpan Elapsed { get; }

    /// <summary>What the memory model found; null when the trace ran with the model off.</summary>
    public MemoryResult? Memory { get; init; }

    public ReadOnlySpan<uint> Get(Counter c) => Counters[(int)c];
}
