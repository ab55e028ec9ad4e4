using VoxProf.Core.Rays;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;

namespace VoxProf.Core.Strategies;

/// <summary>
/// A traversal strategy: a struct whose static members name it and trace one ray. The tracer takes it as a generic
/// struct parameter and specialises its tile loop per strategy, branching and counter type, so a strategy's counting
/// compiles to the same code as a built-in kernel's. The built-in strategies implement this interface too
/// (<see cref="BuiltInStrategies"/>); docs/writing-a-strategy.md walks through writing one.
/// </summary>
public interface IStrategy
{
    /// <summary>Name used on the command line and in reports: see <see cref="StrategyNameRules"/>.</summary>
    static abstract string Name { get; }

    /// <summary>One line for reports.</summary>
    static abstract string Description { get; }

    /// <summary>Counters of the strategy's own (at most <see cref="ExtraCounts.Capacity"/>), counted with
    /// <see cref="ICostCounters.Extra"/> in this order.</summary>
    static virtual IReadOnlyList<ExtraCounter> ExtraCounters => [];

    /// <summary>Whether rays start where the coarse prepass lets them (true for every strategy but the reference).</summary>
    static virtual bool UsesPrepass => true;

    /// <summary>
    /// Traces one ray from parameter <paramref name="tMin"/> and returns its counts. On a hit, sets
    /// <paramref name="hit"/> (it arrives cleared). <paramref name="path"/> is scratch for one <see cref="NodeRef"/> per level
    /// (<see cref="TreeView.Depth"/> of them), reused across rays. <typeparamref name="TBranching"/> is
    /// <see cref="Branching2"/>, <see cref="Branching4"/> or <see cref="Branching8"/>: a strategy works on every
    /// branching when it asks about cells through <see cref="TreeView"/>'s methods.
    /// </summary>
    static abstract TCounters Trace<TBranching, TCounters>(in TreeView view, in RaySetup ray, double tMin, Span<NodeRef> path, ref PixelHit hit)
        where TBranching : struct, IBranching
        where TCounters : struct, ICostCounters;
}

/// <summary>A counter a strategy declares for itself; it appears in every report next to the built-in counters.</summary>
public sealed record ExtraCounter(string Name, string Description);
