using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.Intrinsics;

namespace VoxProf.Core.Trees;

/// <summary>
/// One bit per cell of an 8×8×8 node: eight 64-bit words, word w holding cells 64·w to 64·w + 63 (cell x + 8y + 64z,
/// so word w is the z = w slice). A value type laid out inline, so a node record holds its masks without a pointer.
/// </summary>
[InlineArray(Words)]
public struct Mask512
{
    public const int Words = 8;

    private ulong _word;

    /// <summary>Whether bit <paramref name="bit"/> (0–511) is set.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public readonly bool Has(int bit) => ((this[bit >> 6] >> bit) & 1) != 0;

    /// <summary>Sets bit <paramref name="bit"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public void Set(int bit) => this[bit >> 6] |= 1UL << bit;

    /// <summary>Number of set bits.</summary>
    public readonly int Count
    {
        get
        {
            int count = 0;
            for (int w = 0; w < Words; w++)
                count += BitOperations.PopCount(this[w]);
            return count;
        }
    }

    public readonly bool IsEmpty
    {
        get
        {
            ulong any = 0;
            for (int w = 0; w < Words; w++)
                any |= this[w];
            return any == 0;
        }
    }

    /// <summary>Set bits below <paramref name="bit"/>: the offset of that cell's child or material.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public readonly int Rank(int bit)
    {
        int word = bit >> 6;
        int rank = BitOperations.PopCount(this[word] & ((1UL << bit) - 1));
        for (int w = 0; w < word; w++)
            rank += BitOperations.PopCount(this[w]);
        return rank;
    }

    /// <summary>Whether this mask and <paramref name="other"/> share a set bit.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public readonly bool Overlaps(in Mask512 other) => AnyInUnion(this, default, other);

    /// <summary>Number of bits set here and clear in <paramref name="other"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public readonly int CountOutside(in Mask512 other) => CountUnionOutside(this, default, other);

    /// <summary>
    /// Whether (<paramref name="a"/> | <paramref name="b"/>) &amp; <paramref name="within"/> has a set bit: a node's
    /// occupancy (child | solid) against a directional mask, on every step of dda-mask, so it is done 256 bits at a
    /// time where the processor can (the kernels benchmark at --branching 8).
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static bool AnyInUnion(in Mask512 a, in Mask512 b, in Mask512 within)
    {
        if (Vector256.IsHardwareAccelerated)
        {
            Vector256<ulong> lo = (Half(a, 0) | Half(b, 0)) & Half(within, 0);
            Vector256<ulong> hi = (Half(a, 1) | Half(b, 1)) & Half(within, 1);
            return (lo | hi) != Vector256<ulong>.Zero;
        }
        ulong any = 0;
        for (int w = 0; w < Words; w++)
            any |= (a[w] | b[w]) & within[w];
        return any != 0;
    }

    /// <summary>Number of bits set in <paramref name="a"/> | <paramref name="b"/> and clear in <paramref name="outsideOf"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static int CountUnionOutside(in Mask512 a, in Mask512 b, in Mask512 outsideOf)
    {
        int count = 0;
        for (int w = 0; w < Words; w++)
            count += BitOperations.PopCount((a[w] | b[w]) & ~outsideOf[w]);
        return count;
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static Vector256<ulong> Half(in Mask512 m, int half) =>
        Unsafe.Add(ref Unsafe.As<Mask512, Vector256<ulong>>(ref Unsafe.AsRef(in m)), half);

    /// <summary>The union of two masks.</summary>
    public static Mask512 Or(in Mask512 a, in Mask512 b)
    {
        Mask512 r = default;
        for (int w = 0; w < Words; w++)
            r[w] = a[w] | b[w];
        return r;
    }
}
