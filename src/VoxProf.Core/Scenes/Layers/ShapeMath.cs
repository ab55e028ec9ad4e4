using VoxProf.Core.Geometry;

namespace VoxProf.Core.Scenes.Layers;

/// <summary>Voxel-centre arithmetic shared by the analytic shapes.</summary>
internal static class ShapeMath
{
    /// <summary>
    /// Offset from <paramref name="c"/> to the voxel centre nearest to it among voxels [min, max) (0 if c lies
    /// between the first and last centre). Computed as a voxel centre minus c, like the exact tests.
    /// </summary>
    public static double NearestOffset(int min, int max, double c)
    {
        double lo = min + 0.5, hi = max - 0.5;
        if (c < lo)
            return lo - c;
        if (c > hi)
            return hi - c;
        return 0;
    }

    /// <summary>Surface area of a box of voxels (0 when empty).</summary>
    public static double BoxArea(in Box3i b) =>
        b.IsEmpty ? 0 : 2.0 * ((double)b.SizeX * b.SizeY + (double)b.SizeY * b.SizeZ + (double)b.SizeZ * b.SizeX);

    /// <summary>Offset from <paramref name="c"/> to the farthest voxel centre among voxels [min, max).</summary>
    public static double FarthestOffset(int min, int max, double c)
    {
        double a = min + 0.5 - c, b = max - 0.5 - c;
        return Math.Abs(a) >= Math.Abs(b) ? a : b;
    }

    /// <summary>Voxels whose centres can lie within radius of c on one axis, with one voxel of margin.</summary>
    public static (int Min, int Max) Span(double c, double radius)
    {
        double lo = Math.Floor(c - radius - 0.5) - 1, hi = Math.Ceiling(c + radius - 0.5) + 2;
        return (ClampToInt(lo), ClampToInt(hi));
    }

    public static Box3i BallBounds(double cx, double cy, double cz, double r)
    {
        var (x0, x1) = Span(cx, r);
        var (y0, y1) = Span(cy, r);
        var (z0, z1) = Span(cz, r);
        return new Box3i(x0, y0, z0, x1, y1, z1);
    }

    /// <summary>
    /// The voxels whose centres lie in the closed interval [lo, hi], as a half-open index range.
    /// </summary>
    public static (int Min, int Max) CentresIn(double lo, double hi)
    {
        double first = Math.Ceiling(lo - 0.5), last = Math.Floor(hi - 0.5);
        return (ClampToInt(first), ClampToInt(last + 1));
    }

    public static int ClampToInt(double v) =>
        v <= -(1 << 30) ? -(1 << 30) : v >= (1 << 30) ? 1 << 30 : (int)v;
}
