using System.Runtime.CompilerServices;
using System.Runtime.Intrinsics;
using VoxProf.Core.Traversal;

namespace VoxProf.Core.Memory;

/// <summary>
/// Counts like <typeparamref name="TCounts"/> (<see cref="CostCounts"/>, or <see cref="CostCountsWithExtras"/> for a
/// strategy with counters of its own) and also records each node read's index in the <see cref="TileReads"/> the
/// current thread's tile attached: a store through the struct's own pointer into the recorder's pinned buffer (with
/// the recorder looked up at every read, grid's tracing on the sample scene took 36% longer than with the model off).
/// How a read finds room is <typeparamref name="TRoom"/>'s: <see cref="TestedRoom"/> for any kernel, a strategy file's
/// included, <see cref="BoundedRoom"/> for the built-in kernels, which start each ray's recording themselves. Only the
/// recording differs, so the counts are exactly those of a run without the model.
/// </summary>
internal unsafe struct MemoryCounts<TCounts, TRoom> : ICostCounters, ICountFlush
    where TCounts : struct, ICostCounters, ICountFlush
    where TRoom : struct, IReadRoom
{
    public TCounts Counts;

    // Where this ray's next read goes and where its room ends (TRoom says how far).
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
        TRoom.Record(ref _next, ref _end, nodeIndex);
    }

    /// <summary>
    /// Records the first <paramref name="nodes"/> (at most eight) of <paramref name="path"/>'s node indices again, with
    /// one store where the room holds all eight (the lanes past <paramref name="nodes"/> are written but not kept: the
    /// next reads overwrite them), else one at a time as <typeparamref name="TRoom"/> records. Counting is the caller's.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal void RecordAgain(Vector256<int> path, int nodes)
    {
        if (_end - _next >= Vector256<int>.Count)
        {
            path.Store(_next);
            _next += nodes;
            return;
        }
        for (int i = 0; i < nodes; i++)
            TRoom.Record(ref _next, ref _end, path.GetElement(i));
    }

    /// <summary>Points the ray's reads at the room after the tile's finished pixels (<see cref="RayRecording"/>).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal void Start(TileReads reads) => reads.Room(out _next, out _end);

    /// <summary>
    /// Writes the ray's counts like <typeparamref name="TCounts"/> and closes the pixel's reads in
    /// <paramref name="reads"/>; false, writing nothing, when some of the ray's reads may have been lost
    /// (<see cref="BoundedRoom"/>): the ray is to be traced again after <see cref="TileReads.Grow()"/>.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public readonly bool Flush(Span<uint> tile, int slot, TileReads? reads)
    {
        if (!TRoom.Landed(_next, _end))
            return false;
        Counts.Flush(tile, slot, null);
        reads!.EndPixel(_next);
        return true;
    }
}

/// <summary>How a ray's reads find room in the tile's recorder.</summary>
internal unsafe interface IReadRoom
{
    /// <summary>Stores <paramref name="nodeIndex"/> at <paramref name="next"/> and moves it on.</summary>
    static abstract void Record(ref int* next, ref int* end, int nodeIndex);

    /// <summary>Whether every read of the ray, which ended at <paramref name="next"/>, was kept.</summary>
    static abstract bool Landed(int* next, int* end);
}

/// <summary>
/// A test for room at every read; the ray's first read, and a read that finds the buffer full, find room through
/// <see cref="TileReads.Current"/>, a thread-static field <see cref="FrameMemory"/> sets for the length of one tile.
/// Serves any kernel: a strategy file's need not start its rays.
/// </summary>
internal unsafe struct TestedRoom : IReadRoom
{
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static void Record(ref int* next, ref int* end, int nodeIndex)
    {
        if (next == end)
            MakeRoom(ref next, ref end);
        *next++ = nodeIndex;
    }

    // Out of line: once per ray, and when a tile's buffer fills.
    [MethodImpl(MethodImplOptions.NoInlining)]
    private static void MakeRoom(ref int* next, ref int* end) => TileReads.Current!.MakeRoom(ref next, ref end);

    public static bool Landed(int* next, int* end) => true;
}

/// <summary>
/// For kernels that start each ray's recording (<see cref="RayRecording.Start"/>): a read is a store and a pointer
/// bump with no test that can branch to a call. When the tile's buffer is full, the ray's further reads all land in
/// its last slot, the end of the room; the tracer sees the ray ended there, grows the buffer and traces the ray again,
/// which makes the same reads, counts and hit (a ray that exactly filled the buffer is traced again too). Why not the
/// test for room: a call on the reads' path, however rarely taken, makes the JIT keep more of the kernel's state in
/// memory; in the published command, one thread, the model on cost `dda-mask` 10–12% over the model off with the test
/// and 6–8% without it, `grid` 28% and 11% (docs/performance.md, "Recording without a call in the kernel").
/// </summary>
internal unsafe struct BoundedRoom : IReadRoom
{
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static void Record(ref int* next, ref int* end, int nodeIndex)
    {
        int* at = next;
        *at = nodeIndex;
        next = at < end ? at + 1 : at;
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static bool Landed(int* next, int* end) => next != end;
}

/// <summary>How a built-in kernel starts a ray's read recording (a no-op unless it counts with <see cref="BoundedRoom"/>).</summary>
internal static class RayRecording
{
    /// <summary>Call right after the ray's counters are made; the type test folds in each specialisation of the kernel.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static void Start<T>(ref T counters) where T : struct
    {
        if (typeof(T) == typeof(MemoryCounts<CostCounts, BoundedRoom>))
            Unsafe.As<T, MemoryCounts<CostCounts, BoundedRoom>>(ref counters).Start(TileReads.Current!);
    }
}

/// <summary>
/// Marks a built-in strategy whose kernel starts every ray with <see cref="RayRecording.Start"/>, so the tracer may
/// record its reads with <see cref="BoundedRoom"/> (when it counts with <see cref="CostCounts"/>: a strategy with
/// counters of its own is recorded with <see cref="TestedRoom"/>, marked or not).
/// </summary>
internal interface IStartsRayRecording;
