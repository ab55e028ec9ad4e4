using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;
using VoxProf.Core.Memory;

namespace VoxProf.Core.Traversal;

/// <summary>
/// A remembered walk's node reads counted again (<see cref="TreeView.LookupAgain"/>): exactly what reading
/// <c>path[0 .. nodes)</c> one node at a time counts and records, in fewer instructions for the two counter types
/// the built-in kernels run with. grid repeats its last walk at most voxels of a ray, over a thousand reads a pixel.
/// </summary>
internal static unsafe class PathReads
{
    /// <summary>The reads recorded with one store: a path this short (and a span this long) takes the short way.</summary>
    public const int Block = 8;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static void Again<TCounters>(ref TCounters counters, ReadOnlySpan<NodeRef> path, int nodes)
        where TCounters : struct, ICostCounters
    {
        // Each type test folds away in each specialisation of the kernel.
        if (typeof(TCounters) == typeof(CostCounts))
        {
            Unsafe.As<TCounters, CostCounts>(ref counters).NodeFetches += (uint)nodes;
            return;
        }
        if (typeof(TCounters) == typeof(MemoryCounts<CostCounts, BoundedRoom>) && nodes <= Block && path.Length >= Block)
        {
            ref MemoryCounts<CostCounts, BoundedRoom> recorded = ref Unsafe.As<TCounters, MemoryCounts<CostCounts, BoundedRoom>>(ref counters);
            recorded.Counts.NodeFetches += (uint)nodes;
            recorded.RecordAgain(Vector256.LoadUnsafe(ref Unsafe.As<NodeRef, int>(ref MemoryMarshal.GetReference(path))), nodes);
            return;
        }
        for (int i = 0; i < nodes; i++)
            counters.NodeFetch(path[i].Index);
    }
}
