using System.Diagnostics.CodeAnalysis;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using VoxProf.Core.Traversal;

namespace VoxProf.Core.Memory;

/// <summary>
/// The pixel's node reads of one tracer tile, in traversal order: pixels in the order the tracer runs them (row by row
/// within the tile), each pixel's reads one after another. Reused from tile to tile, so tracing allocates only while a
/// buffer is still growing.
/// </summary>
public sealed unsafe class TileReads
{
    // Pinned, so a ray's counters can write its reads through a pointer (MemoryCounts); a new,
    // larger array replaces it when a tile reads more (MakeRoom, Grow).
    private int[] _reads;
    private int[] _pixelEnds = new int[Tracer.TileSize * Tracer.TileSize];

    // The buffer's start and its last slot.
    private int* _base, _last;

    public TileReads() => Replace(GC.AllocateUninitializedArray<int>(4096, pinned: true));

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
        int used = next == null ? Count : (int)(next - _base);
        if (used == _reads.Length)
            Grow(used);
        next = _base + used;
        end = _base + _reads.Length;
    }

    /// <summary>
    /// Where the current pixel's reads start, and the buffer's last slot (<see cref="BoundedRoom"/>:
    /// a ray's reads past it all land there, and the ray is traced again after <see cref="Grow()"/>).
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal void Room(out int* next, out int* last)
    {
        next = _base + Count;
        last = _last;
    }

    /// <summary>Doubles the buffer, keeping the finished pixels' reads: the current pixel is to be traced again.</summary>
    internal void Grow() => Grow(Count);

    private void Grow(int keep)
    {
        int[] larger = GC.AllocateUninitializedArray<int>(checked(_reads.Length * 2), pinned: true);
        _reads.AsSpan(0, keep).CopyTo(larger);
        Replace(larger);
    }

    [MemberNotNull(nameof(_reads))]
    private void Replace(int[] reads)
    {
        _reads = reads;
        // Pinned arrays never move, so their address holds for as long as the field keeps them.
        _base = (int*)Unsafe.AsPointer(ref MemoryMarshal.GetArrayDataReference(reads));
        _last = _base + reads.Length - 1;
    }

    /// <summary>
    /// Closes the current pixel, whose reads end at <paramref name="next"/> (null when it read nothing): the reads
    /// since the last call are its own.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal void EndPixel(int* next)
    {
        if (next != null)
            Count = (int)(next - _base);
        _pixelEnds[Pixels++] = Count;
    }

    /// <summary>The node indices pixel <paramref name="k"/> of the tile read (k counts row by row from the tile's corner).</summary>
    public ReadOnlySpan<int> Of(int k) => _reads.AsSpan(Start(k), _pixelEnds[k] - Start(k));

    /// <summary>Where pixel <paramref name="k"/>'s reads start in <see cref="All"/>.</summary>
    public int Start(int k) => k == 0 ? 0 : _pixelEnds[k - 1];

    /// <summary>Every read of the tile, pixel after pixel.</summary>
    public ReadOnlySpan<int> All => _reads.AsSpan(0, Count);
}
