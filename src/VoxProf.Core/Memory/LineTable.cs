using System.Numerics;
using System.Runtime.CompilerServices;

namespace VoxProf.Core.Memory;

/// <summary>
/// A set of a few line numbers on the stack: a pixel's of a few reads (a tree strategy's, about eight), or a lockstep
/// group's (about a dozen). An open-addressing table emptied when made, its members written to the caller's span in
/// the order they were first added. It takes at most half as many lines as it has slots, so probes stay short; past
/// that <see cref="Add"/> says no, and the caller uses <see cref="LineSet"/>, which grows. Cheaper than that class for
/// a few lines: no generation tags, growth or bounds of its own to keep (docs/performance.md, "Memory model").
/// </summary>
internal ref struct LineTable
{
    private readonly Span<int> _slots;
    private readonly Span<int> _members;
    private readonly int _shift;

    /// <param name="slots">A power of two, at least 2; emptied here.</param>
    /// <param name="members">Where the members go; the table takes at most half as many lines as it has slots.</param>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public LineTable(Span<int> slots, Span<int> members)
    {
        if (slots.Length < 2 || !BitOperations.IsPow2(slots.Length))
            throw new ArgumentException("the table needs a power-of-two number of slots, at least 2", nameof(slots));
        slots.Fill(-1);
        _slots = slots;
        _members = members.Length > slots.Length / 2 ? members[..(slots.Length / 2)] : members;
        _shift = 32 - BitOperations.Log2((uint)slots.Length);
        Count = 0;
    }

    public int Count { get; private set; }

    /// <summary>Adds <paramref name="line"/> (not negative) unless it is a member; false when it is new and there is no room.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public bool Add(int line)
    {
        int mask = _slots.Length - 1;
        // Fibonacci hashing, as LineSet's: neighbouring lines (sibling records) spread over the table.
        int slot = (int)(((uint)line * 2654435769u) >> _shift);
        while (true)
        {
            int held = _slots[slot];
            if (held == line)
                return true;
            if (held < 0)
                break;
            slot = (slot + 1) & mask;
        }
        if (Count == _members.Length)
            return false;
        _slots[slot] = line;
        _members[Count++] = line;
        return true;
    }
}
