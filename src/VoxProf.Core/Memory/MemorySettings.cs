using System.Numerics;
using VoxProf.Core.Statistics;

namespace VoxProf.Core.Memory;

/// <summary>
/// The cache the memory model replays node reads through: <see cref="LineBytes"/>-byte lines, a set-associative
/// cache of <see cref="CacheBytes"/> bytes with <see cref="Ways"/> lines per set and least-recently-used replacement.
/// The defaults (64-byte lines, 16 KiB, 4 ways) are from memory: they sit at the small end of the first-level data
/// caches GPU compute units are commonly described with (16 to 128 KiB, 64- or 128-byte lines), so they are a
/// starting point to override, not a property of any one device. <see cref="Group"/> is the lockstep group whose lanes'
/// reads reach the cache together (docs/counters.md, "Memory traffic").
/// </summary>
public sealed record MemorySettings(int LineBytes = 64, int CacheBytes = 16 * 1024, int Ways = 4)
{
    /// <summary>The line sizes the model accepts.</summary>
    public static IReadOnlyList<int> LineSizes { get; } = [64, 128];

    public const int MaxWays = 64;

    public static MemorySettings Default { get; } = new();

    /// <summary>The lanes that issue their reads in lockstep in the cache replay: the 32-lane tile of the subgroup model.</summary>
    public SubgroupShape Group { get; init; } = SubgroupShape.Lanes32;

    /// <summary>Sets in the cache: lines / ways.</summary>
    public int Sets => CacheBytes / LineBytes / Ways;

    /// <summary>Log2 of <see cref="LineBytes"/>: a byte address shifted right by it is the line's number.</summary>
    public int LineShift => BitOperations.Log2((uint)LineBytes);

    /// <summary>Why these settings cannot be simulated, as "field: found, expected …", or null when they can.</summary>
    public string? Problem()
    {
        if (!LineSizes.Contains(LineBytes))
            return $"line size: {LineBytes} is not valid, expected {string.Join(" or ", LineSizes)} bytes";
        if (Ways is < 1 or > MaxWays)
            return $"ways: {Ways} is not valid, expected 1 to {MaxWays}";
        if (CacheBytes < LineBytes * Ways || CacheBytes % (LineBytes * Ways) != 0)
            return $"cache size: {CacheBytes} bytes is not valid, expected a whole number of sets of {Ways} × {LineBytes}-byte lines ({LineBytes * Ways} bytes each)";
        if (CacheBytes > 64 * 1024 * 1024)
            return $"cache size: {CacheBytes} bytes is not valid, expected at most 64 MiB";
        return null;
    }
}
