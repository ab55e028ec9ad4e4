using VoxProf.Core;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;

namespace VoxProf.Reports.Pixels;

/// <summary>One strategy's per-pixel counters and hits as read back from a pixels-STRATEGY.bin.gz file.</summary>
public sealed class PixelData
{
    public PixelData(string strategy, int width, int height, IReadOnlyList<string> counterNames, uint[][] counters, PixelHit[] hits)
    {
        Strategy = strategy;
        Width = width;
        Height = height;
        CounterNames = counterNames;
        Counters = counters;
        Hits = hits;
    }

    public string Strategy { get; }
    public int Width { get; }
    public int Height { get; }

    /// <summary>Counter names as stored, in file order; <see cref="Counters"/> follows the same order.</summary>
    public IReadOnlyList<string> CounterNames { get; }

    /// <summary>Per counter, per pixel y * Width + x (row 0 at the top).</summary>
    public uint[][] Counters { get; }

    public PixelHit[] Hits { get; }

    /// <summary>Null (file from a version without this counter) instead of an error.</summary>
    public uint[]? Find(string counterName)
    {
        for (int i = 0; i < CounterNames.Count; i++)
        {
            if (string.Equals(CounterNames[i], counterName, StringComparison.OrdinalIgnoreCase))
                return Counters[i];
        }
        return null;
    }

    public uint[] Get(Counter counter) =>
        Find(counter.Name()) ?? throw new InputException($"pixel data of {Strategy}: no counter {counter.Name()}, found: {string.Join(", ", CounterNames)}");

    public static PixelData From(StrategyResult result) =>
        new(result.Strategy.Name, result.Width, result.Height, [.. result.CounterNames], result.Counters, result.Hits);
}
