using VoxProf.Core.Strategies;

namespace VoxProf.Core.Traversal;

/// <summary>A traversal strategy. <see cref="Grid"/> is the reference every other strategy must agree with.</summary>
public enum Strategy
{
    /// <summary>Amanatides &amp; Woo 3D DDA over the finest voxels, with a tree lookup per voxel.</summary>
    Grid,
    /// <summary>Stack walk; each step inside a node is a Williams et al. slab test of the current cell.</summary>
    Slab,
    /// <summary>Stack walk; slab tests between levels, DDA steps inside a node.</summary>
    Dda,
    /// <summary><see cref="Dda"/> plus directional occupancy-mask culling.</summary>
    DdaMask,
    /// <summary>Museth's hierarchical DDA: one DDA state that changes level.</summary>
    Hdda,
}

public static class StrategyNames
{
    public static readonly IReadOnlyList<Strategy> All = [Strategy.Grid, Strategy.Slab, Strategy.Dda, Strategy.DdaMask, Strategy.Hdda];

    public static string Name(this Strategy s) => s switch
    {
        Strategy.Grid => "grid",
        Strategy.Slab => "slab",
        Strategy.Dda => "dda",
        Strategy.DdaMask => "dda-mask",
        Strategy.Hdda => "hdda",
        _ => throw new ArgumentOutOfRangeException(nameof(s)),
    };

    public static bool TryParse(string text, out Strategy strategy)
    {
        foreach (var s in All)
        {
            if (string.Equals(s.Name(), text, StringComparison.OrdinalIgnoreCase))
            {
                strategy = s;
                return true;
            }
        }
        strategy = default;
        return false;
    }

    public static StrategyDefinition Definition(this Strategy s) => BuiltInStrategies.All[(int)s];

    public static string ValidList => string.Join(", ", All.Select(s => s.Name()));
}
