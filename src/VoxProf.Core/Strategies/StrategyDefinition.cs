using VoxProf.Core.Memory;
using VoxProf.Core.Traversal;

namespace VoxProf.Core.Strategies;

/// <summary>
/// One strategy as the tracer and the reports see it: its name, description and counters, and a way to trace a tile
/// with the strategy's kernel specialised for the tree's branching and the counter type. Built-in strategies and
/// strategies from files are definitions of the same kind, made by <see cref="Of{TStrategy}"/>.
/// </summary>
public abstract class StrategyDefinition
{
    private protected StrategyDefinition(string name, string description, IReadOnlyList<ExtraCounter> extraCounters, bool usesPrepass, string? source)
    {
        Name = name;
        Description = description;
        ExtraCounters = extraCounters;
        UsesPrepass = usesPrepass;
        Source = source;
        CounterNames = [.. Traversal.CounterNames.All.Select(c => c.Name()), .. extraCounters.Select(c => c.Name)];
    }

    public string Name { get; }
    public string Description { get; }

    /// <summary>The strategy's own counters, after the built-in ones in <see cref="CounterNames"/>.</summary>
    public IReadOnlyList<ExtraCounter> ExtraCounters { get; }

    /// <summary>Whether rays start where the coarse prepass lets them.</summary>
    public bool UsesPrepass { get; }

    /// <summary>The file the strategy came from, or null for a built-in one.</summary>
    public string? Source { get; }

    /// <summary>Every counter of this strategy in buffer order: the built-in counters, then its own.</summary>
    public IReadOnlyList<string> CounterNames { get; }

    /// <summary>The definition of strategy type <typeparamref name="TStrategy"/>.</summary>
    public static StrategyDefinition Of<TStrategy>(string? source = null) where TStrategy : struct, IStrategy =>
        new StrategyDefinition<TStrategy>(source);

    /// <summary>The definition of a strategy type only known at run time (a strategy file's); checked as <see cref="Of{TStrategy}"/>.</summary>
    public static StrategyDefinition Of(Type strategyType, string? source)
    {
        if (!strategyType.IsValueType || !typeof(IStrategy).IsAssignableFrom(strategyType) || strategyType.ContainsGenericParameters)
            throw new ArgumentException($"{strategyType.FullName} is not a non-generic struct implementing {nameof(IStrategy)}", nameof(strategyType));
        var type = typeof(StrategyDefinition<>).MakeGenericType(strategyType);
        return (StrategyDefinition)Activator.CreateInstance(type, source)!;
    }

    /// <summary>
    /// Built-in counters the strategy's kernel never counts, which its code shows (the built-ins declare them; a
    /// strategy file's list is empty). Their per-pixel buffers are the trace's one buffer of zeros
    /// (<see cref="Traversal.ResultBuffers"/>): memory a trace neither allocates nor summarises.
    /// </summary>
    internal IReadOnlyList<Counter> NeverCounts { get; private set; } = [];

    /// <summary>Declares <see cref="NeverCounts"/>; for the built-in definitions only.</summary>
    internal StrategyDefinition NeverCounting(params Counter[] counters)
    {
        NeverCounts = counters;
        return this;
    }

    /// <summary>
    /// Whether the strategy's kernel starts each ray's read recording itself (a built-in one, with no counters of its
    /// own), so the memory model records its reads through <see cref="Memory.BoundedRoom"/> rather than <see cref="Memory.TestedRoom"/>.
    /// </summary>
    internal abstract bool StartsRayRecording { get; }

    /// <summary>Traces the pixels [x0, x1) × [y0, y1) into the result buffers.</summary>
    internal abstract void TraceTile(in TileJob job, int x0, int y0, int x1, int y1);

    public override string ToString() => Name;
}

/// <summary>A strategy type's definition: one tile loop specialised by the JIT per branching and counter type.</summary>
internal sealed class StrategyDefinition<TStrategy> : StrategyDefinition where TStrategy : struct, IStrategy
{
    public StrategyDefinition(string? source)
        : base(TStrategy.Name, TStrategy.Description, StrategyNameRules.CheckCounters(TStrategy.Name, TStrategy.ExtraCounters), TStrategy.UsesPrepass, source)
    {
        StrategyNameRules.ThrowIfInvalid(TStrategy.Name, source);
    }

    // A built-in strategy, which declares no counters of its own, starts its rays' recording itself.
    private static readonly bool StartsRays =
        typeof(IStartsRayRecording).IsAssignableFrom(typeof(TStrategy)) && TStrategy.ExtraCounters.Count == 0;

    internal override bool StartsRayRecording => StartsRays;

    internal override void TraceTile(in TileJob job, int x0, int y0, int x1, int y1)
    {
        // Choose the specialisation once per tile: inside it, branching and counting are compile-time constants.
        bool extras = ExtraCounters.Count > 0;
        if (job.View.N == 8) TraceTile<Branching8>(job, extras, x0, y0, x1, y1);
        else if (job.View.N == 4) TraceTile<Branching4>(job, extras, x0, y0, x1, y1);
        else TraceTile<Branching2>(job, extras, x0, y0, x1, y1);
    }

    private static void TraceTile<TBranching>(in TileJob job, bool extras, int x0, int y0, int x1, int y1)
        where TBranching : struct, IBranching
    {
        if (!job.CountWork) Tracer.TraceTile<TStrategy, TBranching, NoCounters>(job, x0, y0, x1, y1);
        else if (job.RecordsReads && StartsRays) Tracer.TraceTile<TStrategy, TBranching, MemoryCounts<CostCounts, BoundedRoom>>(job, x0, y0, x1, y1);
        else if (job.RecordsReads && extras) Tracer.TraceTile<TStrategy, TBranching, MemoryCounts<CostCountsWithExtras, TestedRoom>>(job, x0, y0, x1, y1);
        else if (job.RecordsReads) Tracer.TraceTile<TStrategy, TBranching, MemoryCounts<CostCounts, TestedRoom>>(job, x0, y0, x1, y1);
        else if (extras) Tracer.TraceTile<TStrategy, TBranching, CostCountsWithExtras>(job, x0, y0, x1, y1);
        else Tracer.TraceTile<TStrategy, TBranching, CostCounts>(job, x0, y0, x1, y1);
    }
}
