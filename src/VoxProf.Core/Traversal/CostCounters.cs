using System.Runtime.CompilerServices;

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
}

/// <summary>Counting compiled out.</summary>
public struct NoCounters : ICostCounters
{
    public void Iteration() { }
    public void CellStep() { }
    public void SlabTest() { }
    public void Descent() { }
    public void Ascent() { }
    public void NodeFetch(int nodeIndex) { }
    public void MaskCulled(int cells) { }
    public void MaskSkipped() { }
}

/// <summary>Counts every event of one ray. Definitions: docs/counters.md.</summary>
public struct CostCounts : ICostCounters
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

    /// <summary>Writes this ray's counts into the per-pixel buffers (indexed by <see cref="Counter"/>).</summary>
    public readonly void Flush(uint[][] buffers, int pixel)
    {
        buffers[(int)Counter.Iterations][pixel] = Iterations;
        buffers[(int)Counter.CellSteps][pixel] = CellSteps;
        buffers[(int)Counter.SlabTests][pixel] = SlabTests;
        buffers[(int)Counter.Descents][pixel] = Descents;
        buffers[(int)Counter.Ascents][pixel] = Ascents;
        buffers[(int)Counter.NodeFetches][pixel] = NodeFetches;
        buffers[(int)Counter.MaskCulledCells][pixel] = MaskCulledCells;
        buffers[(int)Counter.MaskSkippedNodes][pixel] = MaskSkippedNodes;
    }
}
