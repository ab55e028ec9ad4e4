using VoxProf.Core.Statistics;

namespace VoxProf.Core.Memory;

/// <summary>
/// Distinct cache lines each lockstep group of one shape touched, one value per group (row-major over the image's
/// groups, partial edge groups included).
/// </summary>
public sealed record GroupLines(SubgroupShape Shape, uint[] Lines)
{
    /// <summary>Mean over groups; 0 for an image with no groups.</summary>
    public double Mean => Lines.Length == 0 ? 0 : Lines.Select(l => (double)l).Sum() / Lines.Length;

    public uint Max => Lines.Length == 0 ? 0 : Lines.Max();
}

/// <summary>What the memory model found for one strategy's image (docs/counters.md, "Memory traffic").</summary>
/// <param name="Groups">One per <see cref="SubgroupShape.Standard"/> shape, in that order.</param>
/// <param name="Accesses">Line requests that reached the simulated cache: per lockstep step, the distinct lines its lanes read.</param>
/// <param name="Hits">Requests found in the cache.</param>
public sealed record MemoryResult(MemorySettings Settings, IReadOnlyList<GroupLines> Groups, long Accesses, long Hits)
{
    public long Misses => Accesses - Hits;

    /// <summary>Hits over requests; 1 for an image that read nothing (nothing missed).</summary>
    public double HitRate => Accesses == 0 ? 1 : (double)Hits / Accesses;

    /// <summary>Bytes the misses fetched from the next level: one whole line per miss.</summary>
    public long BytesFetched => Misses * Settings.LineBytes;

    /// <summary>The groups of <paramref name="shape"/>, or null when that shape was not modelled.</summary>
    public GroupLines? Of(SubgroupShape shape) => Groups.FirstOrDefault(g => g.Shape == shape);
}
