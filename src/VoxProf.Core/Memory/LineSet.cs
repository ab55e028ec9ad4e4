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
    // Open addressing with linear probing; a slot is in the set only when its stamp is the current generation,
    // so emptying the set is one increment.
    private int[] _keys = new int[1024];
    private int[] _stamps = new int[1024];
    private int[] _members = new int[512];
    private int _generation = 1;

    public int Count { get; private set; }

    /// <summary>The lines in the order they were first added.</summary>
    public ReadOnlySpan<int> Members => _members.AsSpan(0, Count);

    public void Clear()
    {
        Count = 0;
        if (++_generation == int.MaxValue)
        {
            Array.Clear(_stamps);
            _generation = 1;
        }
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public void Add(int line)
    {
        int mask = _keys.Length - 1;
        // Fibonacci hashing spreads neighbouring line numbers, which are common, over the table.
        int slot = (int)(((uint)line * 2654435769u) >> (32 - BitOperations.Log2((uint)_keys.Length))) & mask;
        while (_stamps[slot] == _generation)
        {
            if (_keys[slot] == line)
                return;
            slot = (slot + 1) & mask;
        }
        _stamps[slot] = _generation;
        _keys[slot] = line;
        if (Count == _members.Length)
            Array.Resize(ref _members, 2 * _members.Length);
        _members[Count++] = line;
        if (2 * Count > _keys.Length)
            Grow();
    }

    /// <summary>Doubles the table, keeping it at most half full so probes stay short.</summary>
    private void Grow()
    {
        _keys = new int[2 * _keys.Length];
        _stamps = new int[_keys.Length];
        _generation = 1;
        int count = Count;
        Count = 0;
        int[] members = _members;
        _members = new int[members.Length];
        for (int i = 0; i < count; i++)
            Add(members[i]);
    }
}
