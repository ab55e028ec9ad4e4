using System.Diagnostics;
using System.Globalization;
using VoxProf.Core.Strategies;

namespace VoxProf.Core.Traversal;

/// <summary>
/// Which image tiles are being traced and since when, for a check from another thread that a strategy still makes
/// progress. A strategy file's loop that never ends (a step that does not advance the ray) would otherwise hang the
/// trace, and a CI job with it, without a word of where. The tracer marks each tile's start and end, two stores a tile;
/// nothing here interrupts a thread (.NET cannot stop one safely), so the caller decides what a stall means: the
/// command reports it and exits.
/// </summary>
public sealed class TileWatch
{
    private sealed record Pass(StrategyDefinition Strategy, int[] Tiles, int Width, int Height, long[] Started);

    private volatile Pass? _pass;

    /// <param name="limit">How long one tile of one strategy may run before <see cref="Check"/> reports it.</param>
    public TileWatch(TimeSpan limit)
    {
        if (limit <= TimeSpan.Zero)
            throw new ArgumentOutOfRangeException(nameof(limit), "the tile limit must be positive");
        Limit = limit;
    }

    public TimeSpan Limit { get; }

    /// <summary>Starts watching one strategy's pass over <paramref name="tiles"/>; the array the tracer marks tiles in.</summary>
    internal long[] Begin(StrategyDefinition strategy, int[] tiles, int width, int height)
    {
        var pass = new Pass(strategy, tiles, width, height, new long[tiles.Length]);
        _pass = pass;
        return pass.Started;
    }

    /// <summary>Marks tile <paramref name="index"/> (into the pass's tile list) as started now; 0 marks it finished.</summary>
    internal static void Mark(long[] started, int index, bool running) =>
        Volatile.Write(ref started[index], running ? Math.Max(1, Stopwatch.GetTimestamp()) : 0);

    internal void End() => _pass = null;

    /// <summary>
    /// The first tile, in the pass's tile order, that has run longer than <see cref="Limit"/>; null while every tile
    /// in flight is younger. Safe to call from any thread at any time.
    /// </summary>
    public TileStall? Check()
    {
        if (_pass is not { } pass)
            return null;
        long now = Stopwatch.GetTimestamp();
        long limit = (long)(Limit.TotalSeconds * Stopwatch.Frequency);
        for (int i = 0; i < pass.Started.Length; i++)
        {
            long started = Volatile.Read(ref pass.Started[i]);
            if (started != 0 && now - started > limit)
            {
                var (x0, y0, x1, y1) = Tracer.TileBounds(pass.Tiles[i], pass.Width, pass.Height);
                return new TileStall(pass.Strategy, x0, y0, x1 - 1, y1 - 1, TimeSpan.FromSeconds((double)(now - started) / Stopwatch.Frequency));
            }
        }
        return null;
    }
}

/// <summary>A tile that has run past the watch's limit: the strategy, its first and last pixel, and for how long.</summary>
public sealed record TileStall(StrategyDefinition Strategy, int X0, int Y0, int X1, int Y1, TimeSpan Elapsed)
{
    /// <summary>"strategy 'my-walk' has traced the pixels (0, 0) to (15, 15) for 31 s without finishing".</summary>
    public string Describe() => string.Create(CultureInfo.InvariantCulture,
        $"strategy '{Strategy.Name}' has traced the pixels ({X0}, {Y0}) to ({X1}, {Y1}) for {Elapsed.TotalSeconds:0.#} s without finishing");
}
