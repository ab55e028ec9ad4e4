using System.Runtime.CompilerServices;
using VoxProf.Core.Traversal;

namespace VoxProf.Core.Memory;

/// <summary>
/// The pixel's node reads of one tracer tile, in traversal order: pixels in the order the tracer runs them (row by row
/// within the tile), each pixel's reads one after another. Reused from tile to tile, so tracing allocates only while a
/// buffer is still growing.
/// </summary>
public sealed class TileReads
{
    private int[] _reads = new int[4096];
    private int[] _pixelEnds = new int[Tracer.TileSize * Tracer.TileSize];

    /// <summary>The model's buffers that travel with this recorder, so one thread's tile needs no others.</summary>
    internal TileScratch Scratch { get; } = new();

    public int X0 { get; private set; }
    public int Y0 { get; private set; }
    public int X1 { get; private set; }
    public int Y1 { get; private set; }

    /// <summary>Pixels finished so far.</summary>
    public int Pixels { get; private set; }

    /// <summary>Reads recorded so far.</summary>
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

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public void Add(int nodeIndex)
    {
        if (Count == _reads.Length)
            Array.Resize(ref _reads, _reads.Length * 2);
        _reads[Count++] = nodeIndex;
    }

    /// <summary>Closes the current pixel: the reads since the last call are its own.</summary>
    public void EndPixel() => _pixelEnds[Pixels++] = Count;

    /// <summary>The node indices pixel <paramref name="k"/> of the tile read (k counts row by row from the tile's corner).</summary>
    public ReadOnlySpan<int> Of(int k) => _reads.AsSpan(Start(k), _pixelEnds[k] - Start(k));

    /// <summary>Where pixel <paramref name="k"/>'s reads start in <see cref="All"/>.</summary>
    public int Start(int k) => k == 0 ? 0 : _pixelEnds[k - 1];

    /// <summary>Every read of the tile, pixel after pixel.</summary>
    public ReadOnlySpan<int> All => _reads.AsSpan(0, Count);
}

/// <summary>
/// Counts like <see cref="CostCounts"/> and also records each node read's index in the <see cref="TileReads"/> the
/// current thread's tile attached. Kernels count in a local they start from <c>default</c>, so the recorder cannot
/// travel inside the struct: it is found through a thread-static field that <see cref="FrameMemory"/> sets for the
/// length of one tile on the thread that traces it. Only the recording differs, so the counts are exactly those of a
/// run without the model.
/// </summary>
public struct MemoryCounts : ICostCounters, ICountFlush
{
    [ThreadStatic]
    private static TileReads? _current;

    public CostCounts Counts;

    /// <summary>The strategy's own counters, for a strategy file that declares some.</summary>
    public ExtraCounts Extras;

    /// <summary>Makes <paramref name="reads"/> the recorder of this thread's node reads (null to detach).</summary>
    internal static void Attach(TileReads? reads) => _current = reads;

    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void Iteration() => Counts.Iteration();
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void CellStep() => Counts.CellStep();
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void SlabTest() => Counts.SlabTest();
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void Descent() => Counts.Descent();
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void Ascent() => Counts.Ascent();
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void MaskCulled(int cells) => Counts.MaskCulled(cells);
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void MaskSkipped() => Counts.MaskSkipped();
    [MethodImpl(MethodImplOptions.AggressiveInlining)] public void Extra(int index, uint amount) => Extras[index] += amount;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public void NodeFetch(int nodeIndex)
    {
        Counts.NodeFetch(nodeIndex);
        _current!.Add(nodeIndex);
    }

    /// <summary>Writes the ray's counts like <see cref="CostCounts.Flush"/> and closes the pixel's reads.</summary>
    public readonly void Flush(Span<uint> tile, int slot)
    {
        Counts.Flush(tile, slot);
        Extras.Flush(tile, slot);
        _current!.EndPixel();
    }
}
