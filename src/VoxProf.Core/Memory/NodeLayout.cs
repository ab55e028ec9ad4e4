using System.Runtime.CompilerServices;
using VoxProf.Core.Trees;

namespace VoxProf.Core.Memory;

/// <summary>
/// Where each node record lives: the tree stores its nodes in one array in the order the builder writes them, each
/// record <see cref="RecordBytes"/> bytes (24 for 2³ and 4³ nodes, 136 for 8³), so node <c>i</c> starts
/// <c>i × RecordBytes</c> bytes after the array's start, which the model takes to be aligned to a cache line. A read of
/// a record touches every line its bytes lie in: one or two for a 24-byte record, up to three for a 136-byte one with
/// 64-byte lines.
/// </summary>
public readonly struct NodeLayout
{
    public NodeLayout(int recordBytes)
    {
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(recordBytes);
        RecordBytes = recordBytes;
    }

    /// <summary>The layout of a tree with <paramref name="branching"/> cells per node edge.</summary>
    public static NodeLayout For(int branching) => new(BrickTree.RecordBytesFor(branching));

    /// <summary>Bytes of one node record as stored (padding included).</summary>
    public int RecordBytes { get; }

    /// <summary>Byte offset of node <paramref name="index"/> from the start of the node array.</summary>
    public long Address(int index) => (long)index * RecordBytes;

    /// <summary>The first line node <paramref name="index"/>'s record touches, for lines of 2^<paramref name="lineShift"/> bytes.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public int FirstLine(int index, int lineShift) => (int)(Address(index) >> lineShift);

    /// <summary>The last line the record touches (the first, when the record fits in one line).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public int LastLine(int index, int lineShift) => (int)((Address(index) + RecordBytes - 1) >> lineShift);

    /// <summary>The most lines one record can touch with lines of 2^<paramref name="lineShift"/> bytes.</summary>
    public int MaxLinesPerRecord(int lineShift) => ((RecordBytes + (1 << lineShift) - 2) >> lineShift) + 1;
}
