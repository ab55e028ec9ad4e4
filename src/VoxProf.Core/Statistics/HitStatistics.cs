using System.Runtime.CompilerServices;
using VoxProf.Core.Traversal;

namespace VoxProf.Core.Statistics;

/// <summary>Hit rate and disagreement with a reference image.</summary>
public static class HitStatistics
{
    /// <summary>Fraction of pixels whose ray hit a voxel; 0 for an empty image.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static double HitRate(ReadOnlySpan<PixelHit> hits)
    {
        if (hits.IsEmpty)
            return 0;
        long n = 0;
        foreach (ref readonly PixelHit h in hits)
        {
            if (h.Hit)
                n++;
        }
        return (double)n / hits.Length;
    }

    /// <summary>The first pixel (row-major) whose hit voxel, or hit or miss, differs from <paramref name="reference"/>; -1 when none does.</summary>
    public static int FirstMismatch(ReadOnlySpan<PixelHit> hits, ReadOnlySpan<PixelHit> reference)
    {
        if (hits.Length != reference.Length)
            throw new ArgumentException("images differ in size", nameof(reference));
        for (int i = 0; i < hits.Length; i++)
        {
            if (!hits[i].SameVoxel(reference[i]))
                return i;
        }
        return -1;
    }

    /// <summary>Pixels whose hit voxel (or hit/miss) differs from <paramref name="reference"/>.</summary>
    public static long MismatchCount(ReadOnlySpan<PixelHit> hits, ReadOnlySpan<PixelHit> reference)
    {
        if (hits.Length != reference.Length)
            throw new ArgumentException("images differ in size", nameof(reference));
        long n = 0;
        for (int i = 0; i < hits.Length; i++)
        {
            if (!hits[i].SameVoxel(reference[i]))
                n++;
        }
        return n;
    }
}
