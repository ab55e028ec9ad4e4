using VoxProf.Core.Traversal;

namespace VoxProf.Core.Strategies;

/// <summary>The strategies VoxProf ships, built from the same public blocks a strategy file uses.</summary>
public static class BuiltInStrategies
{
    /// <summary>The reference every other strategy is checked against, pixel by pixel.</summary>
    public static StrategyDefinition Grid { get; } = StrategyDefinition.Of<GridStrategy>();
    public static StrategyDefinition Slab { get; } = StrategyDefinition.Of<SlabStrategy>();
    public static StrategyDefinition Dda { get; } = StrategyDefinition.Of<DdaStrategy>();
    public static StrategyDefinition DdaMask { get; } = StrategyDefinition.Of<DdaMaskStrategy>();
    public static StrategyDefinition Hdda { get; } = StrategyDefinition.Of<HddaStrategy>();

    public static IReadOnlyList<StrategyDefinition> All { get; } = [Grid, Slab, Dda, DdaMask, Hdda];
}
