using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.Intrinsics;
using System.Runtime.Intrinsics.X86;

namespace VoxProf.Core.Memory;

/// <summary>
/// The memory model's two passes over a tile's reads, eight reads at a time with AVX2 gathers, where the processor has
/// them (<see cref="FrameMemory"/> keeps the one-at-a-time versions for the rest and for tests). Both give exactly the
/// one-at-a-time answers, in the same order.
/// </summary>
internal static unsafe class GatheredReads
{
    /// <summary>The most lanes a group may have here: one bit each in a 64-bit word.</summary>
    public const int MaxLanes = 64;

    public static bool IsSupported => Avx2.IsSupported;

    /// <summary>Lanes rounded up to whole blocks of eight: the length <see cref="Replay"/> wants its lane spans to have.</summary>
    public static int PaddedLanes(int lanes) => (lanes + 7) & ~7;

    /// <summary>
    /// A pixel's reads added to its set of distinct lines (<paramref name="set"/>), skipping each node that
    /// <paramref name="recent"/> (a direct-mapped memory of nodes, slot = node mod its length, a power of two) says was
    /// added already, as the one-at-a-time filter does. Eight reads are looked up in the memory with one gather; when
    /// all eight are there, which is most of the time on a grid trace (over a thousand reads a pixel, of a few dozen
    /// nodes), the eight add nothing and change nothing, and they are skipped together; otherwise they go one at a time.
    /// </summary>
    public static void AddPixel(ReadOnlySpan<int> reads, Span<int> recent, LineSet set, NodeLayout layout, int shift)
    {
        if (!BitOperations.IsPow2(recent.Length))
            throw new ArgumentException("the memory of recent nodes must have a power-of-two length", nameof(recent));
        Vector256<int> slotMask = Vector256.Create(recent.Length - 1);
        int i = 0;
        fixed (int* read = reads)
        fixed (int* memory = recent)
        {
            for (; i + 8 <= reads.Length; i += 8)
            {
                Vector256<int> nodes = Vector256.Load(read + i);
                if (Vector256.EqualsAll(Avx2.GatherVector256(memory, nodes & slotMask, sizeof(int)), nodes))
                    continue;
                for (int j = i; j < i + 8; j++)
                    FrameMemory.AddRead(read[j], recent, set, layout, shift);
            }
        }
        for (; i < reads.Length; i++)
            FrameMemory.AddRead(reads[i], recent, set, layout, shift);
    }

    /// <summary>
    /// A replay step's distinct nodes found eight lanes at a time. Each lane's read at the step is gathered straight
    /// from the tile's reads (a masked gather, so a lane that has finished reads nothing), then the lowest lane not yet
    /// matched names the next distinct node and one compare per eight lanes strikes every lane reading it. A step's
    /// lanes read about 2.3 distinct nodes on the grid trace, so that is about three rounds of compares where the
    /// lane-by-lane search tested every lane against a list. The gather matters: the same compares on lanes stored one
    /// at a time waited on those stores and were slower than the search (docs/performance.md, "The memory model's
    /// replay"). A group's steps run in one call, its spans pinned once.
    /// </summary>
    /// <remarks>
    /// Replays one group's steps 0 … <paramref name="longest"/> − 1 through <paramref name="cache"/>: at each step the
    /// distinct nodes the lanes read, first appearance first, and their lines (<see cref="FrameMemory.StepLines"/>). Lane i
    /// reads <c>all[starts[i] + step]</c> while that is before <c>ends[i]</c>. The spans hold
    /// <see cref="PaddedLanes"/> lanes, at most <see cref="MaxLanes"/>; a padding lane has its end at or before its
    /// start, so it reads nothing. Returns the cache's accesses and hits.
    /// </remarks>
    [SkipLocalsInit]
    public static (long Accesses, long Hits) Replay(ReadOnlySpan<int> all, ReadOnlySpan<int> starts, ReadOnlySpan<int> ends, int longest,
        Span<int> nodes, Span<int> lines, NodeLayout layout, int shift, LruCache cache)
    {
        if (starts.Length % 8 != 0 || ends.Length != starts.Length || starts.Length > MaxLanes)
            throw new ArgumentException("lanes must come in whole blocks of eight, at most 64", nameof(starts));
        int blocks = starts.Length >> 3;
        Span<Vector256<int>> values = stackalloc Vector256<int>[MaxLanes / 8];
        long accesses = 0, hits = 0;
        fixed (int* read = all)
        fixed (int* start = starts)
        fixed (int* end = ends)
        {
            for (int step = 0; step < longest; step++)
            {
                Vector256<int> at0 = Vector256.Create(step);
                ulong pending = 0;
                for (int b = 0; b < blocks; b++)
                {
                    Vector256<int> at = Vector256.Load(start + 8 * b) + at0;
                    Vector256<int> active = Vector256.LessThan(at, Vector256.Load(end + 8 * b));
                    values[b] = Avx2.GatherMaskVector256(Vector256<int>.Zero, read, at, active, sizeof(int));
                    pending |= (ulong)active.ExtractMostSignificantBits() << (8 * b);
                }
                int count = 0;
                while (pending != 0)
                {
                    int lane = BitOperations.TrailingZeroCount(pending);
                    int node = read[start[lane] + step];
                    nodes[count++] = node;
                    Vector256<int> wanted = Vector256.Create(node);
                    ulong same = 0;
                    for (int b = 0; b < blocks; b++)
                        same |= (ulong)Vector256.Equals(values[b], wanted).ExtractMostSignificantBits() << (8 * b);
                    pending &= ~same;
                }
                int lineCount = FrameMemory.StepLines(layout, nodes[..count], lines, shift);
                hits += FrameMemory.Issue(cache, lines[..lineCount]);
                accesses += lineCount;
            }
        }
        return (accesses, hits);
    }
}
