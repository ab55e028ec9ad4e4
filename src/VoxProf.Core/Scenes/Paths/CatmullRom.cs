using System.Numerics;

namespace VoxProf.Core.Scenes.Paths;

/// <summary>
/// Centripetal Catmull–Rom interpolation (Yuksel, Schaefer &amp; Keyser, "Parameterization and applications of
/// Catmull–Rom curves", 2011): knots spaced by the square root of the distance between control points (α = 0.5),
/// evaluated with the Barry–Goldman pyramid. With α = 0.5 a segment has no cusp or self-intersection and does not
/// overshoot a sharp turn, which a camera flying past a wall must not do.
/// </summary>
public static class CatmullRom
{
    /// <summary>The curve between <paramref name="p1"/> (at <paramref name="s"/> = 0) and <paramref name="p2"/> (at 1).</summary>
    /// <remarks>
    /// A neighbour that coincides with its end point gives a zero knot interval; it is replaced by the reflection of the
    /// segment's far end, as a missing neighbour at the ends of a path is (<see cref="Point"/>). A segment whose ends
    /// coincide stays at that point.
    /// </remarks>
    public static Vector3 Segment(Vector3 p0, Vector3 p1, Vector3 p2, Vector3 p3, double s)
    {
        if (p1 == p2)
            return p1;
        if (p0 == p1)
            p0 = Reflect(p2, p1);
        if (p3 == p2)
            p3 = Reflect(p1, p2);
        var (a, b, c, d) = (Of(p0), Of(p1), Of(p2), Of(p3));
        double t0 = 0;
        double t1 = t0 + Math.Sqrt(Distance(a, b));
        double t2 = t1 + Math.Sqrt(Distance(b, c));
        double t3 = t2 + Math.Sqrt(Distance(c, d));
        double t = t1 + s * (t2 - t1);

        // Barry–Goldman: three linear blends of neighbours, two of those, then one.
        Vector3D a1 = Blend(a, b, t0, t1, t);
        Vector3D a2 = Blend(b, c, t1, t2, t);
        Vector3D a3 = Blend(c, d, t2, t3, t);
        Vector3D b1 = Blend(a1, a2, t0, t2, t);
        Vector3D b2 = Blend(a2, a3, t1, t3, t);
        Vector3D r = Blend(b1, b2, t1, t2, t);
        return new Vector3((float)r.X, (float)r.Y, (float)r.Z);
    }

    /// <summary>
    /// The point at <paramref name="u"/> along a chain of keys: key i at u = i, so each pair of neighbouring keys
    /// takes an equal share of u. The ends use the reflection of the second and second-last keys as their missing
    /// neighbours (common practice), so a path of evenly spaced collinear keys moves at an even pace end to end.
    /// </summary>
    public static Vector3 Point(IReadOnlyList<Vector3> keys, double u)
    {
        if (keys.Count == 1)
            return keys[0];
        int i = Locate(keys.Count, u, out double s);
        Vector3 p1 = keys[i], p2 = keys[i + 1];
        Vector3 p0 = i > 0 ? keys[i - 1] : Reflect(p2, p1);
        Vector3 p3 = i + 2 < keys.Count ? keys[i + 2] : Reflect(p1, p2);
        return Segment(p0, p1, p2, p3, s);
    }

    /// <summary>Straight lines between neighbouring keys, with the same parameter as <see cref="Point"/>.</summary>
    public static Vector3 Linear(IReadOnlyList<Vector3> keys, double u)
    {
        if (keys.Count == 1)
            return keys[0];
        int i = Locate(keys.Count, u, out double s);
        Vector3D a = Of(keys[i]), b = Of(keys[i + 1]);
        return new Vector3((float)(a.X + s * (b.X - a.X)), (float)(a.Y + s * (b.Y - a.Y)), (float)(a.Z + s * (b.Z - a.Z)));
    }

    // The segment u falls in (the last one for u at the end) and how far along it, 0..1.
    private static int Locate(int keys, double u, out double s)
    {
        int i = Math.Clamp((int)Math.Floor(u), 0, keys - 2);
        s = Math.Clamp(u - i, 0, 1);
        return i;
    }

    // p mirrored through centre: 2 centre − p.
    private static Vector3 Reflect(Vector3 p, Vector3 centre) => new(2 * centre.X - p.X, 2 * centre.Y - p.Y, 2 * centre.Z - p.Z);

    private static Vector3D Blend(Vector3D p, Vector3D q, double ta, double tb, double t)
    {
        double w = (t - ta) / (tb - ta);
        return new Vector3D(p.X + w * (q.X - p.X), p.Y + w * (q.Y - p.Y), p.Z + w * (q.Z - p.Z));
    }

    private static double Distance(Vector3D p, Vector3D q)
    {
        double x = q.X - p.X, y = q.Y - p.Y, z = q.Z - p.Z;
        return Math.Sqrt(x * x + y * y + z * z);
    }

    private static Vector3D Of(Vector3 v) => new(v.X, v.Y, v.Z);

    // Double precision throughout: the knots are square roots of distances and the pyramid divides by their differences.
    private readonly record struct Vector3D(double X, double Y, double Z);
}
