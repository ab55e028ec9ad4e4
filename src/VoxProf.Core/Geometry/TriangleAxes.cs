using System.Runtime.CompilerServices;

namespace VoxProf.Core.Geometry;

/// <summary>
/// The separating-axis triangle–box test of Akenine-Möller ("Fast 3D Triangle-Box Overlap Testing", journal of
/// graphics tools 6(1), 2001): a triangle and an axis-aligned box are disjoint exactly when their projections are
/// disjoint on one of 13 axes: the box's three face normals, the triangle's normal, and the nine cross products of a
/// triangle edge with a box edge direction.
/// </summary>
/// <remarks>
/// <para>Boxes are closed: touching counts as overlap, so a triangle lying in the plane x = 5 overlaps both voxel 4 and
/// voxel 5. Everything is computed in double from the float vertices; each axis keeps the triangle's projection
/// interval [min, max] over its three corners, and a voxel with centre c overlaps on that axis when
/// <c>a·c + r ≥ min</c> and <c>a·c − r ≤ max</c> (r = ½ Σ|aᵢ|). On vertices of 1/2ᵏ steps of moderate size every
/// product and sum is exact, so touching cases are decided exactly; otherwise rounding can only move the decision for
/// triangles within about 1e-12 voxel of touching.</para>
/// <para>The axes are stored in a frame whose first axis u is the world axis along which voxel runs are swept
/// (<see cref="RowAxis"/>, the axis the triangle's normal leans least towards, so its runs are fewest); v and w
/// follow cyclically. <see cref="RowSpan"/> returns exactly the voxels <see cref="OverlapsVoxel"/> accepts: each
/// axis's test is monotone along u, so the division only guesses the end of the run and the end is then settled
/// by evaluating the same expression.</para>
/// </remarks>
internal struct TriangleAxes
{
    /// <summary>Which group of axes separated a triangle from a box first (faces, then normal, then edges).</summary>
    public enum Separation
    {
        None,
        BoxFace,
        TriangleNormal,
        EdgeCross,
    }

    private struct Axis
    {
        public double U, V, W, Min, Max, R;
    }

    [InlineArray(10)]
    private struct AxisSet
    {
        private Axis _first;
    }

    private AxisSet _axes;
    private int _count;
    private bool _hasNormal;

    /// <summary>World axis (0 x, 1 y, 2 z) that is the frame's u; v is the next axis cyclically, w the one after.</summary>
    public int RowAxis;

    /// <summary>The triangle's bounding box in frame coordinates.</summary>
    public double MinU, MaxU, MinV, MaxV, MinW, MaxW;

    /// <summary>Sets up the axes of the triangle (a, b, c), given in world coordinates.</summary>
    public static TriangleAxes Create(double ax, double ay, double az, double bx, double by, double bz,
        double cx, double cy, double cz)
    {
        // World normal, only to choose the row axis.
        double e0x = bx - ax, e0y = by - ay, e0z = bz - az, e1x = cx - bx, e1y = cy - by, e1z = cz - bz;
        double nx = Math.Abs(e0y * e1z - e0z * e1y), ny = Math.Abs(e0z * e1x - e0x * e1z), nz = Math.Abs(e0x * e1y - e0y * e1x);
        int k = nx <= ny && nx <= nz ? 0 : ny <= nz ? 1 : 2;
        return Create(ax, ay, az, bx, by, bz, cx, cy, cz, k);
    }

    /// <summary>Sets up the axes with a chosen row axis (tests compare frames).</summary>
    public static TriangleAxes Create(double ax, double ay, double az, double bx, double by, double bz,
        double cx, double cy, double cz, int rowAxis)
    {
        var t = new TriangleAxes { RowAxis = rowAxis };
        Span<double> p = [ax, ay, az, bx, by, bz, cx, cy, cz];
        // Frame coordinates: u = world[k], v = world[k+1], w = world[k+2].
        int iu = rowAxis, iv = (rowAxis + 1) % 3, iw = (rowAxis + 2) % 3;
        double u0 = p[iu], v0 = p[iv], w0 = p[iw];
        double u1 = p[3 + iu], v1 = p[3 + iv], w1 = p[3 + iw];
        double u2 = p[6 + iu], v2 = p[6 + iv], w2 = p[6 + iw];
        t.MinU = Math.Min(u0, Math.Min(u1, u2));
        t.MaxU = Math.Max(u0, Math.Max(u1, u2));
        t.MinV = Math.Min(v0, Math.Min(v1, v2));
        t.MaxV = Math.Max(v0, Math.Max(v1, v2));
        t.MinW = Math.Min(w0, Math.Min(w1, w2));
        t.MaxW = Math.Max(w0, Math.Max(w1, w2));

        double f0u = u1 - u0, f0v = v1 - v0, f0w = w1 - w0;
        double f1u = u2 - u1, f1v = v2 - v1, f1w = w2 - w1;
        double f2u = u0 - u2, f2v = v0 - v2, f2w = w0 - w2;
        // The triangle's normal first: it separates most often once the bounding boxes overlap.
        t.Add(f0v * f1w - f0w * f1v, f0w * f1u - f0u * f1w, f0u * f1v - f0v * f1u, u0, v0, w0, u1, v1, w1, u2, v2, w2);
        t._hasNormal = t._count == 1;
        // Edge × box axis: e × û = (0, e_w, −e_v), e × v̂ = (−e_w, 0, e_u), e × ŵ = (e_v, −e_u, 0).
        t.AddEdge(f0u, f0v, f0w, u0, v0, w0, u1, v1, w1, u2, v2, w2);
        t.AddEdge(f1u, f1v, f1w, u0, v0, w0, u1, v1, w1, u2, v2, w2);
        t.AddEdge(f2u, f2v, f2w, u0, v0, w0, u1, v1, w1, u2, v2, w2);
        return t;
    }

    /// <summary>Exact test of one voxel, given by its frame indices (u, v, w).</summary>
    public readonly bool OverlapsVoxel(int iu, int iv, int iw)
    {
        if (iu > MaxU || iu + 1 < MinU || iv > MaxV || iv + 1 < MinV || iw > MaxW || iw + 1 < MinW)
            return false;
        double cu = iu + 0.5, cv = iv + 0.5, cw = iw + 0.5;
        for (int i = 0; i < _count; i++)
        {
            ref readonly Axis a = ref _axes[i];
            double rest = a.V * cv + a.W * cw;
            double s = a.U * cu + rest;
            if (s + a.R < a.Min || s - a.R > a.Max)
                return false;
        }
        return true;
    }

    /// <summary>
    /// Narrows [<paramref name="lo"/>, <paramref name="hi"/>] (u indices) to the voxels of the row (v, w) that the
    /// triangle overlaps; false when there are none.
    /// </summary>
    public readonly bool RowSpan(int iv, int iw, ref int lo, ref int hi)
    {
        if (iv > MaxV || iv + 1 < MinV || iw > MaxW || iw + 1 < MinW)
            return false;
        lo = Math.Max(lo, (int)Math.Ceiling(MinU) - 1);
        hi = Math.Min(hi, (int)Math.Floor(MaxU));
        double cv = iv + 0.5, cw = iw + 0.5;
        for (int i = 0; i < _count && lo <= hi; i++)
        {
            ref readonly Axis a = ref _axes[i];
            double rest = a.V * cv + a.W * cw;
            if (a.U == 0)
            {
                // The axis lies across the row: one answer for the whole row.
                if (rest + a.R < a.Min || rest - a.R > a.Max)
                    return false;
                continue;
            }
            // "Reaches min" grows along +u when U > 0, "stays below max" shrinks; the reverse when U < 0.
            bool up = a.U > 0;
            double toMin = (a.Min - a.R - rest) / a.U, toMax = (a.Max + a.R - rest) / a.U;
            lo = FirstFrom(a, rest, lo, hi, Guess(up ? toMin : toMax, lo, hi), reachMin: up);
            hi = LastUpTo(a, rest, lo, hi, Guess(up ? toMax : toMin, lo, hi), reachMin: !up);
        }
        return lo <= hi;
    }

    /// <summary>
    /// Conservative test against the closed box [min, max] (world coordinates) grown by <paramref name="pad"/> on
    /// every side: never false when some voxel inside the box passes <see cref="OverlapsVoxel"/>, given a pad larger
    /// than the rounding of the projections (the callers use 1e-3 voxel).
    /// </summary>
    public readonly bool TouchesBox(double minX, double minY, double minZ, double maxX, double maxY, double maxZ, double pad) =>
        Separate(minX - pad, minY - pad, minZ - pad, maxX + pad, maxY + pad, maxZ + pad) == Separation.None;

    /// <summary>The first group of axes that separates the triangle from the closed box, or None when they overlap.</summary>
    public readonly Separation Separate(double minX, double minY, double minZ, double maxX, double maxY, double maxZ)
    {
        Span<double> lo = [minX, minY, minZ];
        Span<double> hi = [maxX, maxY, maxZ];
        int iu = RowAxis, iv = (RowAxis + 1) % 3, iw = (RowAxis + 2) % 3;
        if (MinU > hi[iu] || MaxU < lo[iu] || MinV > hi[iv] || MaxV < lo[iv] || MinW > hi[iw] || MaxW < lo[iw])
            return Separation.BoxFace;
        double cu = 0.5 * (lo[iu] + hi[iu]), cv = 0.5 * (lo[iv] + hi[iv]), cw = 0.5 * (lo[iw] + hi[iw]);
        double hu = 0.5 * (hi[iu] - lo[iu]), hv = 0.5 * (hi[iv] - lo[iv]), hw = 0.5 * (hi[iw] - lo[iw]);
        for (int i = 0; i < _count; i++)
        {
            ref readonly Axis a = ref _axes[i];
            double s = a.U * cu + a.V * cv + a.W * cw;
            double r = Math.Abs(a.U) * hu + Math.Abs(a.V) * hv + Math.Abs(a.W) * hw;
            if (s + r < a.Min || s - r > a.Max)
                return i == 0 && _hasNormal ? Separation.TriangleNormal : Separation.EdgeCross;
        }
        return Separation.None;
    }

    private void AddEdge(double eu, double ev, double ew, double u0, double v0, double w0, double u1, double v1, double w1,
        double u2, double v2, double w2)
    {
        Add(0, ew, -ev, u0, v0, w0, u1, v1, w1, u2, v2, w2);
        Add(-ew, 0, eu, u0, v0, w0, u1, v1, w1, u2, v2, w2);
        Add(ev, -eu, 0, u0, v0, w0, u1, v1, w1, u2, v2, w2);
    }

    private void Add(double au, double av, double aw, double u0, double v0, double w0, double u1, double v1, double w1,
        double u2, double v2, double w2)
    {
        // A zero axis (an edge along a box axis, or a zero-area triangle's normal) cannot separate anything.
        if (au == 0 && av == 0 && aw == 0)
            return;
        double p0 = au * u0 + av * v0 + aw * w0, p1 = au * u1 + av * v1 + aw * w1, p2 = au * u2 + av * v2 + aw * w2;
        ref Axis a = ref _axes[_count++];
        a.U = au;
        a.V = av;
        a.W = aw;
        a.Min = Math.Min(p0, Math.Min(p1, p2));
        a.Max = Math.Max(p0, Math.Max(p1, p2));
        a.R = 0.5 * (Math.Abs(au) + Math.Abs(av) + Math.Abs(aw));
    }

    // A guessed index from a real-valued solution t of a·(i + ½) + rest = bound, kept within [lo − 1, hi + 1].
    private static int Guess(double t, int lo, int hi)
    {
        double i = Math.Round(t - 0.5);
        return i < lo - 1 ? lo - 1 : i > hi + 1 ? hi + 1 : (int)i;
    }

    // The same expression as OverlapsVoxel: one half of an axis's test at index i of the row.
    private static bool Passes(in Axis a, double rest, int i, bool reachMin)
    {
        double s = a.U * (i + 0.5) + rest;
        return reachMin ? s + a.R >= a.Min : s - a.R <= a.Max;
    }

    // First index in [lo, hi + 1] from which the test holds, for a test that holds from some index on.
    private static int FirstFrom(in Axis a, double rest, int lo, int hi, int guess, bool reachMin)
    {
        int i = Math.Clamp(guess, lo, hi + 1);
        while (i > lo && Passes(a, rest, i - 1, reachMin))
            i--;
        while (i <= hi && !Passes(a, rest, i, reachMin))
            i++;
        return i;
    }

    // Last index in [lo − 1, hi] up to which the test holds, for a test that holds up to some index.
    private static int LastUpTo(in Axis a, double rest, int lo, int hi, int guess, bool reachMin)
    {
        int i = Math.Clamp(guess, lo - 1, hi);
        while (i < hi && Passes(a, rest, i + 1, reachMin))
            i++;
        while (i >= lo && !Passes(a, rest, i, reachMin))
            i--;
        return i;
    }
}
