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
/// voxel 5. Everything is computed in double from the float vertices, in the paper's form: the corners are first
/// moved so the box centre c is the origin (dᵢ = vᵢ − c, exact for float corners and half-integer centres in the
/// scene's range), then projected; on each axis a the box overlaps when <c>min a·dᵢ ≤ r</c> and
/// <c>max a·dᵢ ≥ −r</c> (r = ½ Σ|aⱼ| for a voxel). A triangle in a voxel's face plane therefore touches exactly
/// (the products are by ½), and on corners of 1/2ᵏ steps every touching case is decided exactly; otherwise rounding
/// can only move the decision for triangles within about 1e-12 voxel of touching.</para>
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
        public double U, V, W, R, InverseU;
    }

    [InlineArray(10)]
    private struct AxisSet
    {
        private Axis _first;
    }

    private AxisSet _axes;
    private int _count;
    private bool _hasNormal;

    // Corners in frame coordinates.
    private double _u0, _v0, _w0, _u1, _v1, _w1, _u2, _v2, _w2;

    /// <summary>World axis (0 x, 1 y, 2 z) that is the frame's u; v is the next axis cyclically, w the one after.</summary>
    public int RowAxis;

    /// <summary>The triangle's bounding box in frame coordinates.</summary>
    public double MinU, MaxU, MinV, MaxV, MinW, MaxW;

    /// <summary>Sets up the axes of the triangle (a, b, c), given in world coordinates.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
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
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static TriangleAxes Create(double ax, double ay, double az, double bx, double by, double bz,
        double cx, double cy, double cz, int rowAxis)
    {
        var t = new TriangleAxes { RowAxis = rowAxis };
        Span<double> p = [ax, ay, az, bx, by, bz, cx, cy, cz];
        // Frame coordinates: u = world[k], v = world[k+1], w = world[k+2].
        int iu = rowAxis, iv = (rowAxis + 1) % 3, iw = (rowAxis + 2) % 3;
        (t._u0, t._v0, t._w0) = (p[iu], p[iv], p[iw]);
        (t._u1, t._v1, t._w1) = (p[3 + iu], p[3 + iv], p[3 + iw]);
        (t._u2, t._v2, t._w2) = (p[6 + iu], p[6 + iv], p[6 + iw]);
        t.MinU = Math.Min(t._u0, Math.Min(t._u1, t._u2));
        t.MaxU = Math.Max(t._u0, Math.Max(t._u1, t._u2));
        t.MinV = Math.Min(t._v0, Math.Min(t._v1, t._v2));
        t.MaxV = Math.Max(t._v0, Math.Max(t._v1, t._v2));
        t.MinW = Math.Min(t._w0, Math.Min(t._w1, t._w2));
        t.MaxW = Math.Max(t._w0, Math.Max(t._w1, t._w2));

        double f0u = t._u1 - t._u0, f0v = t._v1 - t._v0, f0w = t._w1 - t._w0;
        double f1u = t._u2 - t._u1, f1v = t._v2 - t._v1, f1w = t._w2 - t._w1;
        double f2u = t._u0 - t._u2, f2v = t._v0 - t._v2, f2w = t._w0 - t._w2;
        // The triangle's normal first: it separates most often once the bounding boxes overlap.
        t.Add(f0v * f1w - f0w * f1v, f0w * f1u - f0u * f1w, f0u * f1v - f0v * f1u);
        t._hasNormal = t._count == 1;
        // Edge × box axis: e × û = (0, e_w, −e_v), e × v̂ = (−e_w, 0, e_u), e × ŵ = (e_v, −e_u, 0).
        t.AddEdge(f0u, f0v, f0w);
        t.AddEdge(f1u, f1v, f1w);
        t.AddEdge(f2u, f2v, f2w);
        return t;
    }

    /// <summary>Exact test of one voxel, given by its frame indices (u, v, w).</summary>
    public readonly bool OverlapsVoxel(int iu, int iv, int iw)
    {
        if (iu > MaxU || iu + 1 < MinU || iv > MaxV || iv + 1 < MinV || iw > MaxW || iw + 1 < MinW)
            return false;
        double cu = iu + 0.5, cv = iv + 0.5, cw = iw + 0.5;
        double du0 = _u0 - cu, du1 = _u1 - cu, du2 = _u2 - cu;
        double dv0 = _v0 - cv, dv1 = _v1 - cv, dv2 = _v2 - cv, dw0 = _w0 - cw, dw1 = _w1 - cw, dw2 = _w2 - cw;
        for (int i = 0; i < _count; i++)
        {
            ref readonly Axis a = ref _axes[i];
            double p0 = a.U * du0 + (a.V * dv0 + a.W * dw0);
            double p1 = a.U * du1 + (a.V * dv1 + a.W * dw1);
            double p2 = a.U * du2 + (a.V * dv2 + a.W * dw2);
            if (Math.Min(p0, Math.Min(p1, p2)) > a.R || Math.Max(p0, Math.Max(p1, p2)) < -a.R)
                return false;
        }
        return true;
    }

    /// <summary>
    /// Narrows [<paramref name="lo"/>, <paramref name="hi"/>] (u indices) to the voxels of the row (v, w) that the
    /// triangle overlaps; false when there are none.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public readonly bool RowSpan(int iv, int iw, ref int lo, ref int hi)
    {
        if (iv > MaxV || iv + 1 < MinV || iw > MaxW || iw + 1 < MinW)
            return false;
        lo = Math.Max(lo, (int)Math.Ceiling(MinU) - 1);
        hi = Math.Min(hi, (int)Math.Floor(MaxU));
        double cv = iv + 0.5, cw = iw + 0.5;
        double dv0 = _v0 - cv, dv1 = _v1 - cv, dv2 = _v2 - cv, dw0 = _w0 - cw, dw1 = _w1 - cw, dw2 = _w2 - cw;
        for (int i = 0; i < _count && lo <= hi; i++)
        {
            ref readonly Axis a = ref _axes[i];
            var row = new Row(a, _u0, _u1, _u2, a.V * dv0 + a.W * dw0, a.V * dv1 + a.W * dw1, a.V * dv2 + a.W * dw2);
            if (a.U == 0)
            {
                // The axis lies across the row: one answer for the whole row.
                if (!row.ReachesBelow(lo) || !row.ReachesAbove(lo))
                    return false;
                continue;
            }
            // Each corner's projection falls along +u when U > 0 (rises when U < 0), so "the lowest projection is at
            // most r" holds from some index on and "the highest is at least −r" up to some index (the reverse for U < 0).
            double r0 = row.Crossing(0, a.R), r1 = row.Crossing(1, a.R), r2 = row.Crossing(2, a.R);
            double m0 = row.Crossing(0, -a.R), m1 = row.Crossing(1, -a.R), m2 = row.Crossing(2, -a.R);
            double toBelow = a.U > 0 ? Math.Min(r0, Math.Min(r1, r2)) : Math.Min(m0, Math.Min(m1, m2));
            double toAbove = a.U > 0 ? Math.Max(m0, Math.Max(m1, m2)) : Math.Max(r0, Math.Max(r1, r2));
            // toBelow: the centre position from which the lower end's test holds; toAbove: up to which the upper end's
            // does. A bound more than a voxel outside the run cannot be moved by rounding, so only near ends are settled.
            if (toBelow > lo - 1)
                lo = row.FirstFrom(lo, hi, Guess(toBelow, lo, hi), below: a.U > 0);
            if (toAbove < hi + 2)
                hi = row.LastUpTo(lo, hi, Guess(toAbove, lo, hi), below: a.U < 0);
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
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
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
            double p0 = a.U * (_u0 - cu) + (a.V * (_v0 - cv) + a.W * (_w0 - cw));
            double p1 = a.U * (_u1 - cu) + (a.V * (_v1 - cv) + a.W * (_w1 - cw));
            double p2 = a.U * (_u2 - cu) + (a.V * (_v2 - cv) + a.W * (_w2 - cw));
            double r = Math.Abs(a.U) * hu + Math.Abs(a.V) * hv + Math.Abs(a.W) * hw;
            if (Math.Min(p0, Math.Min(p1, p2)) > r || Math.Max(p0, Math.Max(p1, p2)) < -r)
                return i == 0 && _hasNormal ? Separation.TriangleNormal : Separation.EdgeCross;
        }
        return Separation.None;
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void AddEdge(double eu, double ev, double ew)
    {
        Add(0, ew, -ev);
        Add(-ew, 0, eu);
        Add(ev, -eu, 0);
    }

    private void Add(double au, double av, double aw)
    {
        // A zero axis (an edge along a box axis, or a zero-area triangle's normal) cannot separate anything.
        if (au == 0 && av == 0 && aw == 0)
            return;
        ref Axis a = ref _axes[_count++];
        a.U = au;
        a.V = av;
        a.W = aw;
        a.R = 0.5 * (Math.Abs(au) + Math.Abs(av) + Math.Abs(aw));
        // Only for guessing where a run ends (the end is then settled exactly), so a reciprocal is precise enough.
        a.InverseU = au == 0 ? 0 : 1 / au;
    }

    // A guessed index from a real-valued centre position t along u, kept within [lo − 1, hi + 1].
    private static int Guess(double t, int lo, int hi)
    {
        double i = Math.Round(t - 0.5);
        return i < lo - 1 ? lo - 1 : i > hi + 1 ? hi + 1 : (int)i;
    }

    /// <summary>One axis along one row: the corners' fixed parts, and the two halves of the axis test at an index.</summary>
    private readonly struct Row(in Axis a, double u0, double u1, double u2, double rest0, double rest1, double rest2)
    {
        private readonly double _au = a.U, _r = a.R, _inverse = a.InverseU;

        // The same expressions as OverlapsVoxel: a.U · (uᵢ − c) + (a.V · dvᵢ + a.W · dwᵢ).
        private double P(int corner, int i)
        {
            double c = i + 0.5;
            return corner switch
            {
                0 => _au * (u0 - c) + rest0,
                1 => _au * (u1 - c) + rest1,
                _ => _au * (u2 - c) + rest2,
            };
        }

        /// <summary>The lowest corner projection at index i is at most r.</summary>
        public bool ReachesBelow(int i) => Math.Min(P(0, i), Math.Min(P(1, i), P(2, i))) <= _r;

        /// <summary>The highest corner projection at index i is at least −r.</summary>
        public bool ReachesAbove(int i) => Math.Max(P(0, i), Math.Max(P(1, i), P(2, i))) >= -_r;

        /// <summary>The centre position along u where corner k's projection equals <paramref name="bound"/>.</summary>
        public double Crossing(int corner, double bound)
        {
            double u = corner == 0 ? u0 : corner == 1 ? u1 : u2, rest = corner == 0 ? rest0 : corner == 1 ? rest1 : rest2;
            return u + (rest - bound) * _inverse;
        }

        private bool Test(int i, bool below) => below ? ReachesBelow(i) : ReachesAbove(i);

        // First index in [lo, hi + 1] from which a test that holds from some index on holds.
        [MethodImpl(MethodImplOptions.AggressiveOptimization)]
        public int FirstFrom(int lo, int hi, int guess, bool below)
        {
            int i = Math.Clamp(guess, lo, hi + 1);
            while (i > lo && Test(i - 1, below))
                i--;
            while (i <= hi && !Test(i, below))
                i++;
            return i;
        }

        // Last index in [lo − 1, hi] up to which a test that holds up to some index holds.
        [MethodImpl(MethodImplOptions.AggressiveOptimization)]
        public int LastUpTo(int lo, int hi, int guess, bool below)
        {
            int i = Math.Clamp(guess, lo - 1, hi);
            while (i < hi && Test(i + 1, below))
                i++;
            while (i >= lo && !Test(i, below))
                i--;
            return i;
        }
    }
}
