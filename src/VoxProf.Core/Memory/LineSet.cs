using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;

namespace VoxProf.Core.Memory;

/// <summary>
/// A set of line numbers that empties in constant time and keeps its members in the order they were added, for
/// counting distinct lines in time linear in the reads: a ray of the grid strategy rereads the same few records
/// thousands of times, where sorting every read would cost n log n. For unions, where most lines added are members
/// already, <see cref="AddRepeated"/> looks through up to <see cref="SmallLimit"/> members with two vector compares
/// instead of hashing (a 32-lane group of a tree strategy holds about 11 lines).
/// </summary>
internal sealed class LineSet
{
    /// <summary>The most members looked through directly: two blocks of eight.</summary>
    internal const int SmallLimit = 16;

    // Open addressing with linear probing. A slot holds (generation << 32 | line) and counts only when its generation
    // is the current one, so emptying the set is one increment, and a probe is one load. While _indexed is false the
    // members are not all in the table (AddRepeated keeps a few in the list alone).
    private ulong[] _slots = new ulong[1024];
    private bool _indexed = true;
    private int _shift = 32 - 10;
    private int[] _members = new int[512];
    private ulong _generation = 1;

    public int Count { get; private set; }

    /// <summary>The lines in the order they were first added.</summary>
    public ReadOnlySpan<int> Members => _members.AsSpan(0, Count);

    public void Clear()
    {
        Count = 0;
        NextGeneration();
        _indexed = true;
    }

    private void NextGeneration()
    {
        if (++_generation == uint.MaxValue)
        {
            Array.Clear(_slots);
            _generation = 1;
        }
    }

    /// <summary>Adds <paramref name="line"/> unless it is a member: hashed, the way for lines that are mostly new.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public void Add(int line)
    {
        if (!_indexed)
            Index();
        AddHashed(line);
    }

    /// <summary>
    /// As <see cref="Add"/>, for lines that are mostly members already. A few members are compared with the line
    /// directly, which is faster than hashing when the line is found; when it is new, the store that adds it would hold
    /// up the next add's vector load of the members (measured: pixels' lines, mostly new, took longer this way).
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public void AddRepeated(int line)
    {
        if (Count <= SmallLimit && Vector256.IsHardwareAccelerated)
        {
            // Members past Count are stale: the mask keeps the compares to the first Count. _members holds at least
            // 512 items, so both blocks can always be loaded.
            ref int first = ref MemoryMarshal.GetArrayDataReference(_members);
            Vector256<int> wanted = Vector256.Create(line);
            uint same = Vector256.Equals(Vector256.LoadUnsafe(ref first), wanted).ExtractMostSignificantBits()
                | Vector256.Equals(Vector256.LoadUnsafe(ref first, 8), wanted).ExtractMostSignificantBits() << 8;
            if ((same & ((1u << Count) - 1)) != 0)
                return;
            if (Count < SmallLimit)
            {
                _members[Count++] = line;
                _indexed = false;
                return;
            }
        }
        Add(line);
    }

    /// <summary>Puts the members, in their order, into a table of a new generation.</summary>
    [MethodImpl(MethodImplOptions.NoInlining)]
    private void Index()
    {
        NextGeneration();
        _indexed = true;
        int count = Count;
        Count = 0;
        for (int i = 0; i < count; i++)
            AddHashed(_members[i]);
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private void AddHashed(int line)
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
            AddHashed(members[i]);
    }
}
