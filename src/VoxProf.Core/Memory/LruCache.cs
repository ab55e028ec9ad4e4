using System.Numerics;
using System.Runtime.CompilerServices;

namespace VoxProf.Core.Memory;

/// <summary>
/// A set-associative cache with least-recently-used replacement, holding line numbers only (no data): line
/// <c>L</c> maps to set <c>L mod Sets</c>, and a miss in a full set evicts the line of that set used longest ago.
/// </summary>
public sealed class LruCache
{
    private const int Empty = -1;

    // Each set's lines, most recently used first: ways are few (at most 64), so moving a line to the front is a short copy.
    private readonly int[] _lines;

    // Sets - 1 when Sets is a power of two (the usual case), so the set index is a mask rather than a division.
    private readonly int _setMask;

    public LruCache(int sets, int ways)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(sets, 1);
        ArgumentOutOfRangeException.ThrowIfLessThan(ways, 1);
        Sets = sets;
        Ways = ways;
        _lines = new int[checked(sets * ways)];
        _setMask = BitOperations.IsPow2(sets) ? sets - 1 : -1;
        Clear();
    }

    public int Sets { get; }
    public int Ways { get; }

    /// <summary>Empties every set.</summary>
    public void Clear() => _lines.AsSpan().Fill(Empty);

    /// <summary>Reads line <paramref name="line"/> (not negative): true on a hit. Either way it becomes its set's most recent line.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public bool Access(int line)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(line);
        int index = (_setMask >= 0 ? line & _setMask : line % Sets) * Ways;
        // Rereading a set's most recent line changes nothing: the common case when rays reread the nodes near the
        // root (the grid strategy rereads them for every voxel). Only that test is inlined into the replay loops.
        if (_lines[index] == line)
            return true;
        return Move(line, _lines.AsSpan(index, Ways));
    }

    /// <summary>The rest of <see cref="Access"/>: finds the line in its set and moves it, or the new line, to the front.</summary>
    private bool Move(int line, Span<int> set)
    {
        int found = set.IndexOf(line);
        bool hit = found >= 0;
        // On a miss the last way (the least recent, or an empty one) is the one dropped.
        int shift = hit ? found : Ways - 1;
        set[..shift].CopyTo(set[1..]);
        set[0] = line;
        return hit;
    }
}
