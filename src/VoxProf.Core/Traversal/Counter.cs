namespace VoxProf.Core.Traversal;

/// <summary>Per-pixel work counters. Exact definitions: docs/counters.md.</summary>
public enum Counter
{
    Iterations,
    CellSteps,
    SlabTests,
    Descents,
    Ascents,
    NodeFetches,
    MaskCulledCells,
    MaskSkippedNodes,
    PrepassIterations,
    PrepassNodeFetches,
    PrepassSkip,
    CacheLines,
}

public static class CounterNames
{
    public const int Count = 12;

    public static readonly IReadOnlyList<Counter> All = Enum.GetValues<Counter>();

    public static string Name(this Counter c) => c switch
    {
        Counter.Iterations => "iterations",
        Counter.CellSteps => "cell-steps",
        Counter.SlabTests => "slab-tests",
        Counter.Descents => "descents",
        Counter.Ascents => "ascents",
        Counter.NodeFetches => "node-fetches",
        Counter.MaskCulledCells => "mask-culled-cells",
        Counter.MaskSkippedNodes => "mask-skipped-nodes",
        Counter.PrepassIterations => "prepass-iterations",
        Counter.PrepassNodeFetches => "prepass-node-fetches",
        Counter.PrepassSkip => "prepass-skip",
        Counter.CacheLines => "cache-lines",
        _ => throw new ArgumentOutOfRangeException(nameof(c)),
    };

    /// <summary>
    /// Whether a rise is a regression. Every counter measures work except <see cref="Counter.PrepassSkip"/>, which
    /// measures distance the prepass saved: there a fall is the regression.
    /// </summary>
    public static bool LowerIsBetter(this Counter c) => c != Counter.PrepassSkip;

    /// <summary>As <see cref="LowerIsBetter(Counter)"/> for a counter named in a report; unknown names count as work.</summary>
    public static bool LowerIsBetter(string name) => !TryParse(name, out Counter c) || c.LowerIsBetter();

    /// <summary>Unit shown in reports.</summary>
    public static string Unit(this Counter c) => c switch
    {
        Counter.PrepassSkip => "voxels",
        Counter.CacheLines => "lines",
        _ => "count",
    };

    /// <summary>
    /// Whether the counter comes from the memory model (docs/counters.md, "Memory traffic"): it stays 0, and reports
    /// show it as not measured, when a trace ran with the model off.
    /// </summary>
    public static bool NeedsMemoryModel(this Counter c) => c == Counter.CacheLines;

    public static string Description(this Counter c) => c switch
    {
        Counter.Iterations => "main-loop iterations of the pixel's ray",
        Counter.CellSteps => "advances from one cell to the next (DDA or slab)",
        Counter.SlabTests => "ray/box slab tests",
        Counter.Descents => "moves from a node into one of its child nodes",
        Counter.Ascents => "moves from a node back to its parent",
        Counter.NodeFetches => "node records read from the tree",
        Counter.MaskCulledCells => "occupied cells proven unreachable by the directional mask",
        Counter.MaskSkippedNodes => "nodes left whole because the directional mask left nothing reachable",
        Counter.PrepassIterations => "the coarse prepass ray's iterations, shared among the pixels it serves",
        Counter.PrepassNodeFetches => "look-ups the coarse prepass ray made in the occupancy grids, shared among the pixels it serves",
        Counter.PrepassSkip => "whole voxels of distance the prepass let the ray skip",
        Counter.CacheLines => "distinct cache lines the node records the pixel's ray read lie in (memory model)",
        _ => throw new ArgumentOutOfRangeException(nameof(c)),
    };

    public static bool TryParse(string text, out Counter counter)
    {
        foreach (var c in All)
        {
            if (string.Equals(c.Name(), text, StringComparison.OrdinalIgnoreCase))
            {
                counter = c;
                return true;
            }
        }
        counter = default;
        return false;
    }

    public static string ValidList => string.Join(", ", All.Select(c => c.Name()));
}
