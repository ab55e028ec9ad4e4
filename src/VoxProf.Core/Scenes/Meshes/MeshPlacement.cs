namespace VoxProf.Core.Scenes.Meshes;

/// <summary>
/// Where a mesh lands in voxel coordinates. In order: an up-axis turn (z-up meshes are turned so their +z becomes +y:
/// (x, y, z) → (x, z, −y)), the rotation (degrees about x, then y, then z, through the mesh's own origin), then either
/// scale and offset (voxel = position × scale + offset) or a fit (the largest side of the rotated bounding box
/// becomes <see cref="FitSize"/> voxels and its low corner lands on <see cref="FitOrigin"/>).
/// </summary>
public sealed class MeshPlacement
{
    /// <summary>Largest magnitude of a placed coordinate, in voxels.</summary>
    public const double MaxCoordinate = 1e9;

    public double[] Scale { get; init; } = [1, 1, 1];
    public double[] Offset { get; init; } = [0, 0, 0];
    public double[] RotateDegrees { get; init; } = [0, 0, 0];
    public bool UpZ { get; init; }
    public double? FitSize { get; init; }
    public double[] FitOrigin { get; init; } = [0, 0, 0];

    /// <summary>
    /// Places the vertices in place (the triangles only choose which vertices count for a fit). Returns −1, or the
    /// first vertex that lands outside ±<see cref="MaxCoordinate"/> (or on a non-finite value).
    /// </summary>
    public int Apply(float[] positions, ReadOnlySpan<int> triangles, int vertices = -1)
    {
        double[] m = Rotation();
        if (vertices < 0)
            vertices = positions.Length / 3;
        double[] scale = Scale, offset = Offset;
        if (FitSize is double size)
        {
            Span<double> lo = [double.MaxValue, double.MaxValue, double.MaxValue];
            Span<double> hi = [double.MinValue, double.MinValue, double.MinValue];
            Span<double> p = stackalloc double[3];
            foreach (int v in triangles)
            {
                Rotate(m, positions, v, p);
                for (int a = 0; a < 3; a++)
                {
                    lo[a] = Math.Min(lo[a], p[a]);
                    hi[a] = Math.Max(hi[a], p[a]);
                }
            }
            double side = Math.Max(hi[0] - lo[0], Math.Max(hi[1] - lo[1], hi[2] - lo[2]));
            double s = side > 0 ? size / side : 1;
            scale = [s, s, s];
            offset = [FitOrigin[0] - s * lo[0], FitOrigin[1] - s * lo[1], FitOrigin[2] - s * lo[2]];
        }
        Span<double> q = stackalloc double[3];
        int bad = -1;
        for (int v = 0; v < vertices; v++)
        {
            Rotate(m, positions, v, q);
            for (int a = 0; a < 3; a++)
            {
                double c = q[a] * scale[a] + offset[a];
                if (!(Math.Abs(c) <= MaxCoordinate) && bad < 0)
                    bad = v;
                positions[3 * v + a] = (float)c;
            }
        }
        return bad;
    }

    /// <summary>The 3×3 matrix (row-major) of the up turn followed by the rotations about x, y and z.</summary>
    private double[] Rotation()
    {
        double[] m = UpZ ? [1, 0, 0, 0, 0, 1, 0, -1, 0] : [1, 0, 0, 0, 1, 0, 0, 0, 1];
        for (int axis = 0; axis < 3; axis++)
        {
            double deg = RotateDegrees[axis];
            if (deg == 0)
                continue;
            double r = deg * Math.PI / 180, c = Math.Cos(r), s = Math.Sin(r);
            // Whole quarter turns are exact.
            if (deg % 90 == 0)
            {
                c = Math.Round(c);
                s = Math.Round(s);
            }
            double[] turn = axis switch
            {
                0 => [1, 0, 0, 0, c, -s, 0, s, c],
                1 => [c, 0, s, 0, 1, 0, -s, 0, c],
                _ => [c, -s, 0, s, c, 0, 0, 0, 1],
            };
            m = Multiply(turn, m);
        }
        return m;
    }

    private static double[] Multiply(double[] a, double[] b)
    {
        var r = new double[9];
        for (int i = 0; i < 3; i++)
            for (int j = 0; j < 3; j++)
                r[3 * i + j] = a[3 * i] * b[j] + a[3 * i + 1] * b[3 + j] + a[3 * i + 2] * b[6 + j];
        return r;
    }

    private static void Rotate(double[] m, float[] positions, int v, Span<double> result)
    {
        double x = positions[3 * v], y = positions[3 * v + 1], z = positions[3 * v + 2];
        for (int a = 0; a < 3; a++)
            result[a] = m[3 * a] * x + m[3 * a + 1] * y + m[3 * a + 2] * z;
    }
}
