using VoxProf.Core.Strategies;

namespace VoxProf.Core.Traversal;

/// <summary>
/// A strategy from a file or library threw while tracing: a fault in the user's code, reported as bad input (one line
/// naming the file, the strategy and the pixels of the tile it failed in) rather than as an internal error of VoxProf.
/// </summary>
public sealed class StrategyFault : InputException
{
    private StrategyFault(string message, int tile, Exception inner) : base(message, inner) => Tile = tile;

    /// <summary>The tile it failed in, in the trace's tile order: when several did, the tracer reports the first.</summary>
    public int Tile { get; }

    internal static StrategyFault In(StrategyDefinition strategy, int tile, (int X0, int Y0, int X1, int Y1) pixels, Exception ex) =>
        new($"{strategy.Source}: strategy '{strategy.Name}' failed while tracing the pixels ({pixels.X0}, {pixels.Y0}) to " +
            $"({pixels.X1 - 1}, {pixels.Y1 - 1}): {ex.GetType().Name}: {ex.Message}", tile, ex);
}
