using System.Runtime.CompilerServices;
using VoxProf.Core.Traversal;

namespace VoxProf.Core.Memory;

/// <summary>
/// <see cref="MemoryCounts{TCounts}"/> for the built-in kernels, which start each ray's recording as they start the
/// ray (<see cref="RayRecording.Start"/>): a read is then a store and a pointer bump with no test that can branch to
/// a call. When the tile's buffer is full, the ray's further reads all land in its last slot; the tracer sees the
/// ray ended there (<see cref="Flush"/> refuses it), grows the buffer and traces the ray again, which makes the same
/// reads and counts. Why not the room test of <see cref="MemoryCounts{TCounts}"/>: a call on the reads' path, however
/// rarely taken, makes the JIT keep more of the kernel's state in memory; in the published command, one thread, the
/// model on cost `dda-mask` 10–12% over the model off with the room test and 6–8% without it, `grid` 28% and 11%
/// (docs/performance.md, "Recording without a call in the kernel"). Strategy files keep the room test: their kernels
/// need not start rays this way.
/// </summary>
internal unsafe struct StartedMemoryCounts<TCounts> : ICostCounters, ICountFlush
    where TCounts : struct, ICostCounters, ICountFlush
{
    public TCounts Counts;

    // Where this ray's next read goes, and the buffer's last slot.
    private int* _next;
    private int* _last;

    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void Iteration() => Counts.Iteration();
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void CellStep() => Counts.CellStep();
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void SlabTest() => Counts.SlabTest();
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void Descent() => Counts.Descent();
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void Ascent() => Counts.Ascent();
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void MaskCulled(int cells) => Counts.MaskCulled(cells);
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void MaskSkipped() => Counts.MaskSkipped();
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void Extra(int index, uint amount) => Counts.Extra(index, amount);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public void NodeFetch(int nodeIndex)
    {
        Counts.NodeFetch(nodeIndex);
        int* at = _next;
        *at = nodeIndex;
        _next = at < _last ? at + 1 : at;
    }

    /// <summary>Points the ray's reads at the room after the tile's finished pixels.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal void Start(TileReads reads) => reads.Room(out _next, out _last);

    /// <summary>
    /// Writes the ray's counts like <typeparamref name="TCounts"/> and closes the pixel's reads in
    /// <paramref name="reads"/>; false, writing nothing, when the reads reached the buffer's last slot, where some may
    /// have been lost (or the ray exactly filled it): the ray is to be traced again after <see cref="TileReads.Grow()"/>.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public readonly bool Flush(Span<uint> tile, int slot, TileReads? reads)
    {
        if (_next == _last)
            return false;
        Counts.Flush(tile, slot, null);
        reads!.EndPixel(_next);
        return true;
    }
}

/// <summary>How a built-in kernel starts a ray's read recording (a no-op unless it counts with <see cref="StartedMemoryCounts{TCounts}"/>).</summary>
internal static class RayRecording
{
    /// <summary>Call right after the ray's counters are made; the type tests fold in each specialisation of the kernel.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static void Start<T>(ref T counters) where T : struct
    {
        if (typeof(T) == typeof(StartedMemoryCounts<CostCounts>))
            Unsafe.As<T, StartedMemoryCounts<CostCounts>>(ref counters).Start(TileReads.Current!);
    }
}

/// <summary>
/// Marks a built-in strategy whose kernel starts every ray with <see cref="RayRecording.Start"/>, so the tracer may
/// count it with <see cref="StartedMemoryCounts{TCounts}"/> (of <see cref="CostCounts"/>: a strategy with counters of
/// its own is recorded with <see cref="MemoryCounts{TCounts}"/>, marked or not).
/// </summary>
internal interface IStartsRayRecording;
