using VoxProf.Core.Traversal;

namespace VoxProf.Reports.Compare;

/// <summary>Summary of one per-pixel difference image.</summary>
/// <param name="MaxAbs">Largest |candidate - base|: the symmetric scale's half-width.</param>
public readonly record struct PixelDiffSummary(long Min, long Max, long MaxAbs, int ChangedPixels);

/// <summary>
/// Per-pixel candidate minus base for one counter of one strategy. Pure functions over plain buffers, so the numbers
/// are tested apart from the colouring.
/// </summary>
public static class PixelDiff
{
    /// <summary>Writes candidate - base per pixel into <paramref name="diff"/> (long: the difference of two uints needs 33 bits).</summary>
    public static PixelDiffSummary Subtract(ReadOnlySpan<uint> @base, ReadOnlySpan<uint> candidate, Span<long> diff)
    {
        if (@base.Length != candidate.Length || diff.Length != @base.Length)
            throw new ArgumentException($"buffers differ in length: base {@base.Length}, candidate {candidate.Length}, diff {diff.Length}");
        long min = 0, max = 0;
        var changed = 0;
        for (var i = 0; i < @base.Length; i++)
        {
            var d = (long)candidate[i] - @base[i];
            diff[i] = d;
            if (d != 0)
                changed++;
            if (d < min)
                min = d;
            if (d > max)
                max = d;
        }
        return new PixelDiffSummary(min, max, Math.Max(-min, max), changed);
    }

    /// <summary>Marks pixels whose hit changed between the runs: hit versus miss, or a different voxel.</summary>
    /// <returns>The number of marked pixels.</returns>
    public static int HitChanged(ReadOnlySpan<PixelHit> @base, ReadOnlySpan<PixelHit> candidate, Span<bool> changed)
    {
        if (@base.Length != changed.Length || candidate.Length != changed.Length)
            throw new ArgumentException($"hit buffers differ in length: base {@base.Length}, candidate {candidate.Length}, mask {changed.Length}");
        var count = 0;
        for (var i = 0; i < changed.Length; i++)
        {
            var c = !@base[i].SameVoxel(candidate[i]);
            changed[i] = c;
            if (c)
                count++;
        }
        return count;
    }

    /// <summary>
    /// Maps a difference onto [-1, 1] of a symmetric scale (equal distances either side of zero get equal magnitudes),
    /// ready for a diverging ramp. A zero <paramref name="maxAbs"/> (identical images) maps everything to 0.
    /// </summary>
    public static double Normalize(long diff, long maxAbs) => maxAbs == 0 ? 0 : Math.Clamp((double)diff / maxAbs, -1, 1);
}
