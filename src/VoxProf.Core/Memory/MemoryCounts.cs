using System.Runtime.CompilerServices;
using VoxProf.Core.Traversal;

namespace VoxProf.Core.Memory;

/// <summary>
/// Counts like <typeparamref name="TCounts"/> (<see cref="CostCounts"/>, or <see cref="CostCountsWithExtras"/> for a
/// strategy with counters of its own) and also records each node read's index in the <see cref="TileReads"/> the
/// current thread's tile attached. Kernels count in a local they start from <c>default</c>, so the recorder cannot
/// travel inside the struct: the ray's first read finds it through <see cref="TileReads.Current"/>, a thread-static
/// field <see cref="FrameMemory"/> sets for the length of one tile, and every read after that is a store through the
/// struct's own pointer into the recorder's pinned buffer (with the recorder looked up at every read, grid's tracing
/// on the sample scene took 36% longer than with the model off; through the pointer, 24%). Only the recording
/// differs, so the counts are exactly those of a run without the model. This serves any kernel, a strategy file's
/// included; the built-in kernels count with <see cref="StartedMemoryCounts{TCounts}"/>, which needs their help and
/// has no call on the reads' path (grid: 28% over the model off this way, 11% that way).
/// </summary>
internal unsafe struct MemoryCounts<TCounts> : ICostCounters, ICountFlush
    where TCounts : struct, ICostCounters, ICountFlush
{
    public TCounts Counts;

    // Where this ray's next read goes and where the room for it ends; both null until the ray's first read.
    private int* _next;
    private int* _end;

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
        if (_next == _end)
            MakeRoom();
        *_next++ = nodeIndex;
    }

    // Out of line: once per ray, and when a tile's buffer fills.
    [MethodImpl(MethodImplOptions.NoInlining)]
    private void MakeRoom() => TileReads.Current!.MakeRoom(ref _next, ref _end);

    /// <summary>Writes the ray's counts like <typeparamref name="TCounts"/> and closes the pixel's reads in <paramref name="reads"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public readonly bool Flush(Span<uint> tile, int slot, TileReads? reads)
    {
        Counts.Flush(tile, slot, null);
        reads!.EndPixel(_next);
        return true;
    }
}
