using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.Intrinsics;
using System.Runtime.Intrinsics.X86;

namespace VoxProf.Core.Memory;

/// <summary>
/// The memory model's two passes over a tile's reads eight reads at a time with AVX2, sixteen where AVX-512 runs,
/// where the processor has them (<see cref="FrameMemory"/> keeps the one-at-a-time versions for the rest and for
/// tests). Both give exactly the one-at-a-time answers, in the same order.
/// </summary>
internal static unsafe class VectorReads
{
    /// <summary>The most lanes a group may have here: one bit each in a 64-bit word.</summary>
    public const int MaxLanes = 64;

    public static bool IsSupported => Avx2.IsSupported;

    /// <summary>Whether the sixteen-lane versions run here (AVX-512, and the runtime willing to use it).</summary>
    public static bool WideSupported => Avx512F.IsSupported && Vector512.IsHardwareAccelerated;

    /// <summary>Lanes rounded up to whole blocks of eight: the length <see cref="Replay"/> wants its lane spans to have.</summary>
    public static int PaddedLanes(int lanes) => (lanes + 7) & ~7;

    /// <summary>
    /// A pixel's reads added to its set of distinct lines (<paramref name="set"/>), skipping each node that
    /// <paramref name="recent"/> (a direct-mapped memory of nodes, slot = node mod its length, a power of two) says was
    /// added already, as the one-at-a-time filter does. Eight reads are looked up in the memory with one gather, or
    /// sixteen with one permute (below); when all are there, which is most of the time on a grid trace (over a thousand
    /// reads a pixel, of a few dozen nodes), they add nothing and change nothing, and they are skipped together;
    /// otherwise they go one at a time.
    /// </summary>
    /// <param name="wide">Sixteen reads at a time with AVX-512 (<see cref="WideSupported"/>); false keeps to eight, as
    /// where it does not run, so tests can hold both to one answer.</param>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static void AddPixel(ReadOnlySpan<int> reads, Span<int> recent, LineSet set, NodeLayout layout, int shift, bool wide)
    {
        if (!BitOperations.IsPow2(recent.Length))
            throw new ArgumentException("the memory of recent nodes must have a power-of-two length", nameof(recent));
        Vector256<int> slotMask = Vector256.Create(recent.Length - 1);
        int i = 0;
        fixed (int* read = reads)
        fixed (int* memory = recent)
        {
            if (wide && WideSupported && recent.Length == 2 * Vector512<int>.Count)
            {
                // A memory of 32 nodes fits two vectors, and one two-table permute looks up sixteen reads in it (the
                // permute takes an index's low five bits: the read's slot), without a gather.
                Vector512<int> low = Vector512.Load(memory), high = Vector512.Load(memory + 16);
                for (; i + 16 <= reads.Length; i += 16)
                {
                    Vector512<int> nodes = Vector512.Load(read + i);
                    if (Vector512.EqualsAll(Avx512F.PermuteVar16x32x2(low, nodes, high), nodes))
                        continue;
                    for (int j = i; j < i + 16; j++)
                        FrameMemory.AddRead(read[j], recent, set, layout, shift);
                    low = Vector512.Load(memory);
                    high = Vector512.Load(memory + 16);
                }
            }
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
    /// A replay step's distinct nodes found eight lanes at a time. Each lane's reads are loaded eight steps at a time
    /// (one load from the lane's own run of reads) and each block of eight lanes is transposed, so a step's reads of
    /// eight lanes sit in one vector; then the lowest active lane not yet matched names the next distinct node and one
    /// compare per eight lanes strikes every lane reading it. A step's lanes read about 2.3 distinct nodes on the grid
    /// trace, so that is about three rounds of compares where the lane-by-lane search tested every lane against a
    /// list. Lanes stored one at a time and then compared were slower than that search (their compares waited on the
    /// stores); a gather per step and block, as before, cost more than the loads and the transpose' shuffles
    /// (docs/performance.md, "The memory model's passes, `merge` and `compare` reading"). A group's steps run in one
    /// call, its spans pinned once.
    /// </summary>
    /// <remarks>
    /// Replays one group's steps 0 … <paramref name="longest"/> − 1 through <paramref name="cache"/>: at each step the
    /// distinct nodes the lanes read, first appearance first, and their lines (<see cref="FrameMemory.StepLines"/>). Lane i
    /// reads <c>all[starts[i] + step]</c> while that is before <c>ends[i]</c>. The spans hold
    /// <see cref="PaddedLanes"/> lanes, at most <see cref="MaxLanes"/>; a padding lane has its end at or before its
    /// start, so it reads nothing. With <paramref name="wide"/>, sixteen lanes a compare where AVX-512 runs. Returns the
    /// cache's accesses and hits.
    /// </remarks>
    [SkipLocalsInit]
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static (long Accesses, long Hits) Replay(ReadOnlySpan<int> all, ReadOnlySpan<int> starts, ReadOnlySpan<int> ends, int longest,
        Span<int> nodes, Span<int> lines, NodeLayout layout, int shift, LruCache cache, bool wide)
    {
        if (starts.Length % 8 != 0 || ends.Length != starts.Length || starts.Length > MaxLanes)
            throw new ArgumentException("lanes must come in whole blocks of eight, at most 64", nameof(starts));
        int blocks = starts.Length >> 3;
        // Eight steps' reads of every lane: step k of block b at vector k * blocks + b.
        Span<Vector256<int>> values = stackalloc Vector256<int>[MaxLanes];
        long accesses = 0, hits = 0;
        fixed (int* read = all)
        fixed (int* start = starts)
        fixed (int* end = ends)
        fixed (Vector256<int>* held = values)
        {
            // Each lane's number of reads: lane i reads at a step while the step is below it.
            Span<Vector256<int>> length = stackalloc Vector256<int>[MaxLanes / 8];
            for (int b = 0; b < blocks; b++)
                length[b] = Vector256.Load(end + 8 * b) - Vector256.Load(start + 8 * b);
            wide = wide && WideSupported && blocks % 2 == 0;
            for (int first = 0; first < longest; first += 8)
            {
                for (int b = 0; b < blocks; b++)
                    Transposed(read, all.Length, start + 8 * b, first, held + b, blocks);
                int steps = Math.Min(8, longest - first);
                for (int k = 0; k < steps; k++)
                {
                    int step = first + k;
                    Vector256<int> at0 = Vector256.Create(step);
                    Vector256<int>* row = held + k * blocks;
                    ulong pending = 0;
                    for (int b = 0; b < blocks; b++)
                        pending |= (ulong)Vector256.LessThan(at0, length[b]).ExtractMostSignificantBits() << (8 * b);
                    // A finished lane holds another pixel's read or nothing; it is never pending, so matching it only
                    // clears a bit that is clear already.
                    int count = 0;
                    while (pending != 0)
                    {
                        int lane = BitOperations.TrailingZeroCount(pending);
                        int node = ((int*)row)[lane];
                        nodes[count++] = node;
                        pending &= ~(wide ? Same512(row, blocks, node) : Same256(row, blocks, node));
                    }
                    int lineCount = FrameMemory.StepLines(layout, nodes[..count], lines, shift);
                    hits += FrameMemory.Issue(cache, lines[..lineCount]);
                    accesses += lineCount;
                }
            }
        }
        return (accesses, hits);
    }

    /// <summary>The lanes of a step (<paramref name="blocks"/> vectors of eight at <paramref name="row"/>) that read <paramref name="node"/>, a bit each.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static ulong Same256(Vector256<int>* row, int blocks, int node)
    {
        Vector256<int> wanted = Vector256.Create(node);
        ulong same = 0;
        for (int b = 0; b < blocks; b++)
            same |= (ulong)Vector256.Equals(row[b], wanted).ExtractMostSignificantBits() << (8 * b);
        return same;
    }

    /// <summary>As <see cref="Same256"/>, sixteen lanes a compare, for an even number of blocks.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static ulong Same512(Vector256<int>* row, int blocks, int node)
    {
        Vector512<int> wanted = Vector512.Create(node);
        ulong same = 0;
        for (int b = 0; b < blocks; b += 2)
            same |= Vector512.Equals(Vector512.Load((int*)(row + b)), wanted).ExtractMostSignificantBits() << (8 * b);
        return same;
    }

    /// <summary>
    /// Steps <paramref name="first"/> … +7 of eight lanes, lane i reading <c>read[start[i] + step]</c>, written as eight
    /// vectors (one a step, a lane an element) at <paramref name="output"/>, <paramref name="stride"/> apart. A lane's
    /// eight reads are one load; near the end of the reads, where a load would pass it, they are read one at a time. What
    /// a lane holds past its own end is whatever follows in the reads: the caller masks those lanes out.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static void Transposed(int* read, int length, int* start, int first, Vector256<int>* output, int stride)
    {
        Vector256<int> r0 = Row(read, length, start[0] + first), r1 = Row(read, length, start[1] + first);
        Vector256<int> r2 = Row(read, length, start[2] + first), r3 = Row(read, length, start[3] + first);
        Vector256<int> r4 = Row(read, length, start[4] + first), r5 = Row(read, length, start[5] + first);
        Vector256<int> r6 = Row(read, length, start[6] + first), r7 = Row(read, length, start[7] + first);
        // The usual 8×8 transpose: interleave pairs of rows, then pairs of pairs, then swap 128-bit halves.
        Vector256<int> t0 = Avx2.UnpackLow(r0, r1), t1 = Avx2.UnpackHigh(r0, r1);
        Vector256<int> t2 = Avx2.UnpackLow(r2, r3), t3 = Avx2.UnpackHigh(r2, r3);
        Vector256<int> t4 = Avx2.UnpackLow(r4, r5), t5 = Avx2.UnpackHigh(r4, r5);
        Vector256<int> t6 = Avx2.UnpackLow(r6, r7), t7 = Avx2.UnpackHigh(r6, r7);
        Vector256<int> u0 = Avx2.UnpackLow(t0.AsInt64(), t2.AsInt64()).AsInt32(), u1 = Avx2.UnpackHigh(t0.AsInt64(), t2.AsInt64()).AsInt32();
        Vector256<int> u2 = Avx2.UnpackLow(t1.AsInt64(), t3.AsInt64()).AsInt32(), u3 = Avx2.UnpackHigh(t1.AsInt64(), t3.AsInt64()).AsInt32();
        Vector256<int> u4 = Avx2.UnpackLow(t4.AsInt64(), t6.AsInt64()).AsInt32(), u5 = Avx2.UnpackHigh(t4.AsInt64(), t6.AsInt64()).AsInt32();
        Vector256<int> u6 = Avx2.UnpackLow(t5.AsInt64(), t7.AsInt64()).AsInt32(), u7 = Avx2.UnpackHigh(t5.AsInt64(), t7.AsInt64()).AsInt32();
        output[0] = Avx2.Permute2x128(u0, u4, 0x20);
        output[stride] = Avx2.Permute2x128(u1, u5, 0x20);
        output[2 * stride] = Avx2.Permute2x128(u2, u6, 0x20);
        output[3 * stride] = Avx2.Permute2x128(u3, u7, 0x20);
        output[4 * stride] = Avx2.Permute2x128(u0, u4, 0x31);
        output[5 * stride] = Avx2.Permute2x128(u1, u5, 0x31);
        output[6 * stride] = Avx2.Permute2x128(u2, u6, 0x31);
        output[7 * stride] = Avx2.Permute2x128(u3, u7, 0x31);
    }

    /// <summary>Eight reads from <paramref name="at"/>: one load, or one at a time (zero past the reads) where a load would pass their end.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static Vector256<int> Row(int* read, int length, int at)
    {
        if (at + 8 <= length)
            return Vector256.Load(read + at);
        return Tail(read, length, at);
    }

    [MethodImpl(MethodImplOptions.NoInlining)]
    private static Vector256<int> Tail(int* read, int length, int at)
    {
        Vector256<int> row = Vector256<int>.Zero;
        for (int i = 0; i < 8; i++)
        {
            if (at + i >= 0 && at + i < length)
                row = row.WithElement(i, read[at + i]);
        }
        return row;
    }
}
