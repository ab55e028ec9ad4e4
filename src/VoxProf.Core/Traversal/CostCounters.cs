using System.Runtime.CompilerServices;
using VoxProf.Core.Memory;

namespace VoxProf.Core.Traversal;

/// <summary>
/// Work counters as a generic struct parameter: kernels are written once and the JIT specialises them per counter type,
/// so with <see cref="NoCounters"/> every counting call compiles to nothing (used for clean timing runs).
/// Kernels count in a local and flush once per ray.
/// </summary>
public interface ICostCounters
{
    void Iteration();
    void CellStep();
    void SlabTest();
    void Descent();
    void Ascent();
    /// <summary>One node record read; <paramref name="nodeIndex"/> is its place in the tree's node array, in the
    /// order the builder wrote them, so a memory model can replay a ray's reads as addresses.</summary>
    void NodeFetch(int nodeIndex);
    void MaskCulled(int cells);
    void MaskSkipped();
    /// <summary>Adds <paramref name="amount"/> to the strategy's own counter <paramref name="index"/> (the order of
    /// its declared extra counters, below <see cref="ExtraCounts.Capacity"/>).</summary>
    void Extra(int index, uint amount);
}

/// <summary>How the tracer hands a ray's counts to its tile's counts (<see cref="TileCounts"/>).</summary>
internal interface ICountFlush
{
    /// <summary>
    /// Writes this ray's counts into slot <paramref name="slot"/> of its tile's counts (counters indexed by
    /// <see cref="Counter"/>, then extra counters), and with the memory model on closes the pixel's reads in
    /// <paramref name="reads"/>, the tile's recorder, which the tracer looks up once per tile rather than per ray.
    /// False, having written nothing, when the ray must be traced again (<see cref="BoundedRoom"/>);
    /// every other counter type returns a constant true, which the JIT folds.
    /// </summary>
    bool Flush(Span<uint> tile, int slot, TileReads? reads);
}

/// <summary>Counting compiled out.</summary>
public struct NoCounters : ICostCounters, ICountFlush
{
    public void Iteration() { }
    public void CellStep() { }
    public void SlabTest() { }
    public void Descent() { }
    public void Ascent() { }
    public void NodeFetch(int nodeIndex) { }
    public void MaskCulled(int cells) { }
    public void MaskSkipped() { }
    public void Extra(int index, uint amount) { }
    readonly bool ICountFlush.Flush(Span<uint> tile, int slot, TileReads? reads) => true;
}

/// <summary>
/// Counts every built-in event of one ray (definitions: docs/counters.md). The tracer uses it for strategies that
/// declare no counters of their own, so their counts stay 32 bytes; <see cref="Extra"/> is a no-op here
/// and <see cref="CostCountsWithExtras"/> serves the others.
/// </summary>
public struct CostCounts : ICostCounters, ICountFlush
{
    public uint Iterations;
    public uint CellSteps;
    public uint SlabTests;
    public uint Descents;
    public uint Ascents;
    public uint NodeFetches;
    public uint MaskCulledCells;
    public uint MaskSkippedNodes;

    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void Iteration() => Iterations++;
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void CellStep() => CellSteps++;
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void SlabTest() => SlabTests++;
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void Descent() => Descents++;
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void Ascent() => Ascents++;
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void NodeFetch(int nodeIndex) => NodeFetches++;
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void MaskCulled(int cells) => MaskCulledCells += (uint)cells;
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void MaskSkipped() => MaskSkippedNodes++;
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public readonly void Extra(int index, uint amount) { }

    /// <summary>Writes this ray's counts into slot <paramref name="slot"/> of its tile's counts (indexed by <see cref="Counter"/>).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public readonly bool Flush(Span<uint> tile, int slot, TileReads? reads)
    {
        tile[TileCounts.Index((int)Counter.Iterations, slot)] = Iterations;
        tile[TileCounts.Index((int)Counter.CellSteps, slot)] = CellSteps;
        tile[TileCounts.Index((int)Counter.SlabTests, slot)] = SlabTests;
        tile[TileCounts.Index((int)Counter.Descents, slot)] = Descents;
        tile[TileCounts.Index((int)Counter.Ascents, slot)] = Ascents;
        tile[TileCounts.Index((int)Counter.NodeFetches, slot)] = NodeFetches;
        tile[TileCounts.Index((int)Counter.MaskCulledCells, slot)] = MaskCulledCells;
        tile[TileCounts.Index((int)Counter.MaskSkippedNodes, slot)] = MaskSkippedNodes;
        return true;
    }
}

/// <summary>A strategy's own counters of one ray.</summary>
[InlineArray(Capacity)]
public struct ExtraCounts
{
    /// <summary>Most extra counters a strategy may declare.</summary>
    public const int Capacity = 8;

    private uint _first;

    /// <summary>Writes the extra counts into slot <paramref name="slot"/> of a tile's counts, after the built-in counters.</summary>
    internal readonly void Flush(Span<uint> tile, int slot)
    {
        for (int i = CounterNames.Count; i < TileCounts.Counters(tile); i++)
            tile[TileCounts.Index(i, slot)] = this[i - CounterNames.Count];
    }
}

/// <summary>
/// <see cref="CostCounts"/> plus a strategy's own counters, for strategies that declare some. The extra counts follow
/// the built-in ones in the per-pixel buffers, in the order the strategy declares them.
/// </summary>
public struct CostCountsWithExtras : ICostCounters, ICountFlush
{
    public CostCounts Counts;
    public ExtraCounts Extras;

    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void Iteration() => Counts.Iterations++;
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void CellStep() => Counts.CellSteps++;
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void SlabTest() => Counts.SlabTests++;
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void Descent() => Counts.Descents++;
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void Ascent() => Counts.Ascents++;
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void NodeFetch(int nodeIndex) => Counts.NodeFetches++;
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void MaskCulled(int cells) => Counts.MaskCulledCells += (uint)cells;
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void MaskSkipped() => Counts.MaskSkippedNodes++;
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void Extra(int index, uint amount) => Extras[index] += amount;

    /// <summary>Writes the built-in counts, then the extra counters after <see cref="CounterNames.Count"/>.</summary>
    public readonly bool Flush(Span<uint> tile, int slot, TileReads? reads)
    {
        Counts.Flush(tile, slot, null);
        Extras.Flush(tile, slot);
        return true;
    }
}

/// <summary>
/// Keeps a kernel's counts in its stack frame instead of registers. Promoted to registers, eight counters crowd the walk's
/// own state (node, cell, level, plane times) out of them and the JIT spills that state inside the loop instead; a count
/// in memory costs one add to a cache line the core holds anyway. Handing the local's address to a call the JIT does not
/// inline is what keeps it in memory (the `kernels` benchmark, docs/performance.md: dda 0.50 → 0.45 s, hdda 0.46 →
/// 0.43 s on the raw terrain scene, one thread).
/// </summary>
/// <remarks>The call is made once per ray anyway, so it also starts the ray's read recording (<see cref="RayRecording"/>).</remarks>
internal static class CountsInMemory
{
    [MethodImpl(MethodImplOptions.NoInlining)]
    public static void Keep<T>(ref T counters) where T : struct => RayRecording.Start(ref counters);
}
