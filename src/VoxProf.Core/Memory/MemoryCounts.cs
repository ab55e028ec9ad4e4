using System.Runtime.CompilerServices;
using VoxProf.Core.Traversal;

namespace VoxProf.Core.Memory;

/// <summary>
/// The pixel's node reads of one tracer tile, in traversal order: pixels in the order the tracer runs them (row by row
/// within the tile), each pixel's reads one after another. Reused from tile to tile, so tracing allocates only while a
/// buffer is still growing.
/// </summary>
public sealed unsafe class TileReads
{
    // Pinned, so a ray's counters can write its reads through a pointer (MemoryCounts); a new, larger array replaces it
    // when a tile reads more, and the pointers of the ray then tracing move to it (MakeRoom).
    private int[] _reads = GC.AllocateUninitializedArray<int>(4096, pinned: true);
    private int[] _pixelEnds = new int[Tracer.TileSize * Tracer.TileSize];

    [ThreadStatic]
    private static TileReads? _current;

    /// <summary>The model's buffers that travel with this recorder, so one thread's tile needs no others.</summary>
    internal TileScratch Scratch { get; } = new();

    /// <summary>The recorder of this thread's node reads while it traces a tile with the model on, else null.</summary>
    internal static TileReads? Current => _current;

    /// <summary>Makes <paramref name="reads"/> the recorder of this thread's node reads (null to detach).</summary>
    internal static void Attach(TileReads? reads) => _current = reads;

    public int X0 { get; private set; }
    public int Y0 { get; private set; }
    public int X1 { get; private set; }
    public int Y1 { get; private set; }

    /// <summary>Pixels finished so far.</summary>
    public int Pixels { get; private set; }

    /// <summary>Reads of the finished pixels.</summary>
    public int Count { get; private set; }

    /// <summary>Starts the tile [x0, x1) × [y0, y1), forgetting the last one.</summary>
    public void Begin(int x0, int y0, int x1, int y1)
    {
        (X0, Y0, X1, Y1) = (x0, y0, x1, y1);
        int pixels = (x1 - x0) * (y1 - y0);
        if (_pixelEnds.Length < pixels)
            _pixelEnds = new int[pixels];
        Scratch.EnsurePixels(pixels);
        Pixels = 0;
        Count = 0;
    }

    /// <summary>
    /// Room for the current pixel's next read: <paramref name="next"/> is where it goes (null before the pixel's first
    /// read, which then starts after the finished pixels' reads) and <paramref name="end"/> the end of the room.
    /// </summary>
    internal void MakeRoom(ref int* next, ref int* end)
    {
        int used;
        fixed (int* start = _reads)
            used = next == null ? Count : (int)(next - start);
        if (used == _reads.Length)
        {
            int[] larger = GC.AllocateUninitializedArray<int>(checked(_reads.Length * 2), pinned: true);
            _reads.AsSpan(0, used).CopyTo(larger);
            _reads = larger;
        }
        fixed (int* start = _reads)
        {
            next = start + used;
            end = start + _reads.Length;
        }
    }

    /// <summary>
    /// Closes the current pixel, whose reads end at <paramref name="next"/> (null when it read nothing): the reads
    /// since the last call are its own.
    /// </summary>
    internal void EndPixel(int* next)
    {
        if (next != null)
        {
            fixed (int* start = _reads)
                Count = (int)(next - start);
        }
        _pixelEnds[Pixels++] = Count;
    }

    /// <summary>The node indices pixel <paramref name="k"/> of the tile read (k counts row by row from the tile's corner).</summary>
    public ReadOnlySpan<int> Of(int k) => _reads.AsSpan(Start(k), _pixelEnds[k] - Start(k));

    /// <summary>Where pixel <paramref name="k"/>'s reads start in <see cref="All"/>.</summary>
    public int Start(int k) => k == 0 ? 0 : _pixelEnds[k - 1];

    /// <summary>Every read of the tile, pixel after pixel.</summary>
    public ReadOnlySpan<int> All => _reads.AsSpan(0, Count);
}

/// <summary>
/// Counts like <typeparamref name="TCounts"/> (<see cref="CostCounts"/>, or <see cref="CostCountsWithExtras"/> for a
/// strategy with counters of its own) and also records each node read's index in the <see cref="TileReads"/> the
/// current thread's tile attached. Kernels count in a local they start from <c>default</c>, so the recorder cannot
/// travel inside the struct: the ray's first read finds it through <see cref="TileReads.Current"/>, a thread-static
/// field <see cref="FrameMemory"/> sets for the length of one tile, and every read after that is a store through the
/// struct's own pointer into the recorder's pinned buffer (with the recorder looked up at every read, grid's tracing
/// on the sample scene took 36% longer than with the model off; through the pointer, 24%). Only the recording
/// differs, so the counts are exactly those of a run without the model.
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
    public readonly void Flush(Span<uint> tile, int slot, TileReads? reads)
    {
        Counts.Flush(tile, slot, null);
        reads!.EndPixel(_next);
    }
}
