namespace VoxProf.Core.Scenes.Meshes;

/// <summary>
/// One triangle as seen by rays along +x: its projection on the (y, z) plane, turned counter-clockwise, and its plane.
/// A ray through (y, z) crosses the triangle when the point lies inside the projection, where a point exactly on an
/// edge belongs to the triangle on one fixed side of that edge (as if the point were nudged by an infinitesimal step
/// towards +y, then +z). Two triangles sharing an edge therefore never both count a ray through it, and never both
/// miss it, so every ray crosses a closed mesh an even number of times.
/// </summary>
/// <remarks>
/// Edge tests are 2×2 determinants computed with Kahan's algorithm (one fused multiply-add recovers the rounding of
/// the first product), whose sign is exact when the coordinate differences are, as they are for float vertices and
/// half-integer ray positions in the scene's range; each edge is evaluated from its lexicographically smaller end, so
/// the two triangles sharing it see the same number with opposite signs.
/// </remarks>
internal readonly struct RayCrossing
{
    private readonly double _ay, _az, _by, _bz, _cy, _cz;
    private readonly double _px, _nx, _ny, _nz;
    private readonly double _minY, _maxY, _minZ, _maxZ;

    /// <summary>+1 when the triangle faces +x (the ray leaves the solid through it for outward winding), −1 otherwise.</summary>
    public readonly int Sign;

    private RayCrossing(double ax, double ay, double az, double bx, double by, double bz, double cx, double cy, double cz, int sign)
    {
        (_ay, _az, _by, _bz, _cy, _cz) = (ay, az, by, bz, cy, cz);
        Sign = sign;
        _px = ax;
        double e0x = bx - ax, e0y = by - ay, e0z = bz - az, e1x = cx - ax, e1y = cy - ay, e1z = cz - az;
        _nx = e0y * e1z - e0z * e1y;
        _ny = e0z * e1x - e0x * e1z;
        _nz = e0x * e1y - e0y * e1x;
        _minY = Math.Min(ay, Math.Min(by, cy));
        _maxY = Math.Max(ay, Math.Max(by, cy));
        _minZ = Math.Min(az, Math.Min(bz, cz));
        _maxZ = Math.Max(az, Math.Max(bz, cz));
    }

    public double MinY => _minY;
    public double MaxY => _maxY;
    public double MinZ => _minZ;
    public double MaxZ => _maxZ;

    /// <summary>Sets up the triangle (a, b, c); false when its projection on (y, z) has no area (rays along +x graze it).</summary>
    public static bool TryCreate(float[] v, int ia, int ib, int ic, out RayCrossing crossing)
    {
        int a = 3 * ia, b = 3 * ib, c = 3 * ic;
        double orient = Det(v[b + 1] - (double)v[a + 1], v[b + 2] - (double)v[a + 2], v[c + 1] - (double)v[a + 1], v[c + 2] - (double)v[a + 2]);
        if (orient == 0)
        {
            crossing = default;
            return false;
        }
        // Store counter-clockwise in (y, z); the plane comes from the original order, which only changes the normal's sign.
        crossing = orient > 0
            ? new RayCrossing(v[a], v[a + 1], v[a + 2], v[b], v[b + 1], v[b + 2], v[c], v[c + 1], v[c + 2], +1)
            : new RayCrossing(v[a], v[a + 1], v[a + 2], v[c], v[c + 1], v[c + 2], v[b], v[b + 1], v[b + 2], -1);
        return true;
    }

    /// <summary>Whether the ray along +x through (y, z) crosses the triangle, and at which x.</summary>
    public bool Crosses(double y, double z, out double x)
    {
        x = 0;
        if (y < _minY || y > _maxY || z < _minZ || z > _maxZ)
            return false;
        if (!Inside(_ay, _az, _by, _bz, y, z) || !Inside(_by, _bz, _cy, _cz, y, z) || !Inside(_cy, _cz, _ay, _az, y, z))
            return false;
        x = _px - (_ny * (y - _ay) + _nz * (z - _az)) / _nx;
        return true;
    }

    // The point (y, z) against the directed edge p → q of a counter-clockwise triangle: inside is to the left.
    private static bool Inside(double py, double pz, double qy, double qz, double y, double z)
    {
        bool forward = py < qy || (py == qy && pz < qz);
        double e = forward ? Det(qy - py, qz - pz, y - py, z - pz) : -Det(py - qy, pz - qz, y - qy, z - qz);
        if (e != 0)
            return e > 0;
        // On the edge's line: nudging the point by (ε, ε²) moves it to the left of the edge when dz < 0, or dz = 0 and dy > 0.
        double dy = qy - py, dz = qz - pz;
        return dz < 0 || (dz == 0 && dy > 0);
    }

    /// <summary>a·d − b·c with Kahan's fused multiply-add correction: correctly signed for exact inputs.</summary>
    internal static double Det(double a, double b, double c, double d)
    {
        double w = b * c;
        double err = Math.FusedMultiplyAdd(-b, c, w);
        double f = Math.FusedMultiplyAdd(a, d, -w);
        return f + err;
    }
}
