using System.Runtime.CompilerServices;
using VoxProf.Core.Trees;

namespace VoxProf.Core.Memory;

/// <summary>
/// Where each node record lives: the tree stores its nodes in one array in the order the builder writes them, each
/// record <see cref="RecordBytes"/> bytes, so node <c>i</c> starts <c>i × RecordBytes</c> bytes after the array's start,
/// which the model takes to be aligned to a cache line. A record that straddles a line boundary touches both lines.
/// </summary>
public static class NodeLayout
{
    /// <summary>Bytes of one node record as stored (the size of <see cref="Node"/>, padding included).</summary>
    public static int RecordBytes { get; } = Unsafe.SizeOf<Node>();

    /// <summary>Byte offset of node <paramref name="index"/> from the start of the node array.</summary>
    public static long Address(int index) => (long)index * RecordBytes;

    /// <summary>The first line node <paramref name="index"/>'s record touches, for lines of 2^<paramref name="lineShift"/> bytes.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static int FirstLine(int index, int lineShift) => (int)(Address(index) >> lineShift);

    /// <summary>The last line the record touches: the first, or the next one when the record straddles a boundary.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static int LastLine(int index, int lineShift) => (int)((Address(index) + RecordBytes - 1) >> lineShift);
}
