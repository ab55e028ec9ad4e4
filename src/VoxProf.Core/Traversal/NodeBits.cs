using System.Numerics;
using System.Runtime.CompilerServices;

namespace VoxProf.Core.Traversal;

/// <summary>
/// The current node's occupancy held in a local while a built-in kernel walks its cells, as the modelled algorithm
/// keeps the record it read. For 2³ and 4³ nodes it is one 64-bit word the JIT keeps in a register, so a step tests a
/// bit instead of reloading the node array through the view; 8³ nodes (512 bits) are asked through the view. Every
/// built-in walk holds it (the `kernels` benchmark: together with the cell bit carried between iterations, dda-mask
/// 0.38 → 0.35 s). For the unmasked walks that benchmark, whose tiered compilation recompiles the kernel with a
/// profile, had found the extra live register costing more than the reload saved (dda 0.35 s against 0.335 s), but the
/// published command, which compiles each method once without one, traced faster with it (one thread, raw terrain,
/// fastest of 8–10 runs, memory model off / on): dda 0.246 / 0.257 s against 0.251 / 0.269 s; hdda 0.237 / 0.251 s
/// against 0.238–0.242 / 0.255–0.256 s; slab 0.280 / 0.294–0.296 s against 0.287–0.292 / 0.301–0.303 s.
/// </summary>
internal readonly struct NodeBits<TBranching> where TBranching : struct, IBranching
{
    private readonly ulong _occupancy;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public NodeBits(in TreeView view, NodeRef node) =>
        _occupancy = TBranching.Log2N == 3 ? 0 : view.OccupancyWord<TBranching>(node, 0);

    /// <summary><see cref="TreeView.IsOccupied{TBranching}"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public bool IsOccupied(in TreeView view, NodeRef node, int bit) =>
        TBranching.Log2N == 3 ? view.IsOccupied<TBranching>(node, bit) : ((_occupancy >> bit) & 1) != 0;

    /// <summary><see cref="TreeView.ReachesOccupied{TBranching}"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public bool ReachesOccupied(in TreeView view, NodeRef node, int octant, int bit) =>
        TBranching.Log2N == 3
            ? view.ReachesOccupied<TBranching>(node, octant, bit)
            : (_occupancy & view.ReachInTable<TBranching>(octant, bit)) != 0;

    /// <summary><see cref="TreeView.CountUnreachable{TBranching}"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public int CountUnreachable(in TreeView view, NodeRef node, int octant, int bit) =>
        TBranching.Log2N == 3
            ? view.CountUnreachable<TBranching>(node, octant, bit)
            : BitOperations.PopCount(_occupancy & ~view.ReachInTable<TBranching>(octant, bit));
}
