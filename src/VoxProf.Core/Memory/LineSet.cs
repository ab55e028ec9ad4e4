using System.Numerics;
using System.Runtime.CompilerServices;

namespace VoxProf.Core.Memory;

/// <summary>
/// A set of line numbers that empties in constant time and keeps its members in the order they were added, for
/// counting distinct lines in time linear in the reads: a ray of the grid strategy rereads the same few records
/// thousands of times, where sorting every read would cost n log n.
/// </summary>
internal sealed class LineSet
{
    // Open addressing with linear probing. A slot holds (generation << 32 | line) and counts only when its generation
    // is the current one, so emptying the set is one increment, and a probe is one load.
    private ulong[] _slots = new ulong[1024];
    private int _shift = 32 - 10;
    private int[] _members = new int[512];
    private ulong _generation = 1;

    public int Count { get; private set; }

    /// <summary>The lines in the order they were first added.</summary>
    public ReadOnlySpan<int> Members => _members.AsSpan(0, Count);

    public void Clear()
    {
        Count = 0;
        if (++_generation == uint.MaxValue)
        {
            Array.Clear(_slots);
            _generation = 1;
        }
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public void Add(int line)
    {
        ulong[] slots = _slots;
        int mask = slots.Length - 1;
        ulong entry = (_generation << 32) | (uint)line;
        // Fibonacci hashing spreads neighbouring line numbers, which are common, over the table.
        int slot = (int)(((uint)line * 2654435769u) >> _shift);
        while (true)
        {
            ulong held = slots[slot];
            if (held == entry)
                return;
            if (held >> 32 != _generation)
                break;
            slot = (slot + 1) & mask;
        }
        slots[slot] = entry;
        if (Count == _members.Length)
            Array.Resize(ref _members, 2 * _members.Length);
        _members[Count++] = line;
        if (2 * Count > slots.Length)
            Grow();
    }

    /// <summary>Doubles the table, keeping it at most half full so probes stay short.</summary>
    private void Grow()
    {
        _slots = new ulong[2 * _slots.Length];
        _shift = 32 - BitOperations.Log2((uint)_slots.Length);
        _generation = 1;
        int count = Count;
        Count = 0;
        int[] members = _members;
        _members = new int[members.Length];
        for (int i = 0; i < count; i++)
            Add(members[i]);
    }
}
