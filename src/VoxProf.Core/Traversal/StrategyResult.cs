using VoxProf.Core.Memory;
using VoxProf.Core.Strategies;

namespace VoxProf.Core.Traversal;

/// <summary>
/// Everything one strategy produced for one image: a plain <c>uint[]</c> per counter (row-major, row 0 at the top)
/// and a hit record per pixel. Normalising and colouring belong to the report writers.
/// </summary>
public sealed class StrategyResult
{
    public StrategyResult(StrategyDefinition strategy, int width, int height, uint[][] counters, PixelHit[] hits, TimeSpan elapsed)
    {
        if (counters.Length != strategy.CounterNames.Count)
            throw new ArgumentException($"expected {strategy.CounterNames.Count} counter buffers", nameof(counters));
        Strategy = strategy;
        Width = width;
        Height = height;
        Counters = counters;
        Hits = hits;
        Elapsed = elapsed;
    }

    public StrategyDefinition Strategy { get; }

    /// <summary>The name of each buffer of <see cref="Counters"/>: the built-in counters, then the strategy's own.</summary>
    public IReadOnlyList<string> CounterNames => Strategy.CounterNames;
    public int Width { get; }
    public int Height { get; }

    /// <summary>Indexed by <see cref="Counter"/> (then the strategy's own counters), then by pixel y * Width + x.</summary>
    public uint[][] Counters { get; }

    public PixelHit[] Hits { get; }

    /// <summary>Wall time of this strategy's tracing (not deterministic; keep it apart from counts). With the memory
    /// model on it includes recording each node read, not the model's pass over the reads: that is
    /// <see cref="MemoryElapsed"/>.</summary>
    public TimeSpan Elapsed { get; }

    /// <summary>Wall time of the memory model's passes over this strategy's reads; zero with the model off.</summary>
    public TimeSpan MemoryElapsed { get; init; }

    /// <summary>What the memory model found; null when the trace ran with the model off.</summary>
    public MemoryResult? Memory { get; init; }

    public ReadOnlySpan<uint> Get(Counter c) => Counters[(int)c];

    /// <summary>The buffer of the counter called <paramref name="name"/> (case-insensitive), or null when this
    /// strategy has no such counter.</summary>
    public uint[]? Find(string name)
    {
        for (int i = 0; i < Counters.Length; i++)
        {
            if (string.Equals(CounterNames[i], name, StringComparison.OrdinalIgnoreCase))
                return Counters[i];
        }
        return null;
    }
}
