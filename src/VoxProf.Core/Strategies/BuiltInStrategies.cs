using VoxProf.Core.Traversal;

namespace VoxProf.Core.Strategies;

/// <summary>The strategies VoxProf ships, built from the same public blocks a strategy file uses.</summary>
public static class BuiltInStrategies
{
    // Only the masked walk culls (StackWalk calls MaskAdmits only when its mode culls); grid looks each voxel up from
    // the root and never descends or ascends as a walk does. A counter listed here shares the trace's zero buffer.
    private static readonly Counter[] MaskCounters = [Counter.MaskCulledCells, Counter.MaskSkippedNodes];

    /// <summary>The reference every other strategy is checked against, pixel by pixel.</summary>
    public static StrategyDefinition Grid { get; } = StrategyDefinition.Of<GridStrategy>().NeverCounting([Counter.Descents, Counter.Ascents, .. MaskCounters]);
    public static StrategyDefinition Slab { get; } = StrategyDefinition.Of<SlabStrategy>().NeverCounting(MaskCounters);
    public static StrategyDefinition Dda { get; } = StrategyDefinition.Of<DdaStrategy>().NeverCounting(MaskCounters);
    public static StrategyDefinition DdaMask { get; } = StrategyDefinition.Of<DdaMaskStrategy>();
    public static StrategyDefinition Hdda { get; } = StrategyDefinition.Of<HddaStrategy>().NeverCounting(MaskCounters);

    public static IReadOnlyList<StrategyDefinition> All { get; } = [Grid, Slab, Dda, DdaMask, Hdda];
}
