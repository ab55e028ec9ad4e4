using System.Buffers.Binary;
using System.Globalization;
using System.Text;

namespace VoxProf.Tests.Scenes.Meshes;

/// <summary>
/// Closed, outward-wound triangle meshes made from formulas (spheres, tori, boxes, a torus-knot tube) and writers
/// for the file formats, used by the tests, the sample generator and the benchmark.
/// </summary>
public static class MeshShapes
{
    public sealed record Mesh(double[] Positions, int[] Indices)
    {
        public int TriangleCount => Indices.Length / 3;

        /// <summary>Volume by the divergence theorem; positive for outward winding.</summary>
        public double SignedVolume()
        {
            double v = 0;
            for (int t = 0; t < Indices.Length; t += 3)
            {
                double[] a = P(Indices[t]), b = P(Indices[t + 1]), c = P(Indices[t + 2]);
                v += a[0] * (b[1] * c[2] - b[2] * c[1]) - a[1] * (b[0] * c[2] - b[2] * c[0]) + a[2] * (b[0] * c[1] - b[1] * c[0]);
            }
            return v / 6;
        }

        public double[] P(int i) => Positions[(3 * i)..(3 * i + 3)];

        /// <summary>The same mesh wound the other way.</summary>
        public Mesh Flipped()
        {
            int[] idx = [.. Indices];
            for (int t = 0; t < idx.Length; t += 3)
                (idx[t + 1], idx[t + 2]) = (idx[t + 2], idx[t + 1]);
            return this with { Indices = idx };
        }

        /// <summary>Outward winding whatever order the generator used.</summary>
        public Mesh Outward() => SignedVolume() < 0 ? Flipped() : this;
    }

    public static Mesh Merge(params Mesh[] parts)
    {
        var positions = new List<double>();
        var indices = new List<int>();
        foreach (Mesh m in parts)
        {
            int b = positions.Count / 3;
            positions.AddRange(m.Positions);
            indices.AddRange(m.Indices.Select(i => i + b));
        }
        return new Mesh([.. positions], [.. indices]);
    }

    public static Mesh Box(double x0, double y0, double z0, double x1, double y1, double z1)
    {
        double[] p = [x0, y0, z0, x1, y0, z0, x1, y1, z0, x0, y1, z0, x0, y0, z1, x1, y0, z1, x1, y1, z1, x0, y1, z1];
        int[] q = [0, 3, 2, 1, 4, 5, 6, 7, 0, 1, 5, 4, 2, 3, 7, 6, 1, 2, 6, 5, 0, 4, 7, 3];
        return new Mesh(p, Quads(q)).Outward();
    }

    /// <summary>A latitude–longitude sphere: every vertex on the sphere, poles shared.</summary>
    public static Mesh Sphere(double cx, double cy, double cz, double r, int slices, int stacks)
    {
        var p = new List<double> { cx, cy + r, cz };
        for (int i = 1; i < stacks; i++)
        {
            double theta = Math.PI * i / stacks;
            for (int j = 0; j < slices; j++)
            {
                double phi = 2 * Math.PI * j / slices;
                p.AddRange([cx + r * Math.Sin(theta) * Math.Cos(phi), cy + r * Math.Cos(theta), cz + r * Math.Sin(theta) * Math.Sin(phi)]);
            }
        }
        p.AddRange([cx, cy - r, cz]);
        int bottom = p.Count / 3 - 1;
        int Ring(int i, int j) => 1 + (i - 1) * slices + (j % slices);
        var t = new List<int>();
        for (int j = 0; j < slices; j++)
        {
            t.AddRange([0, Ring(1, j + 1), Ring(1, j)]);
            t.AddRange([bottom, Ring(stacks - 1, j), Ring(stacks - 1, j + 1)]);
            for (int i = 1; i < stacks - 1; i++)
                t.AddRange([Ring(i, j), Ring(i, j + 1), Ring(i + 1, j + 1), Ring(i, j), Ring(i + 1, j + 1), Ring(i + 1, j)]);
        }
        return new Mesh([.. p], [.. t]).Outward();
    }

    /// <summary>A torus around the y axis: major radius <paramref name="major"/>, tube radius <paramref name="minor"/>.</summary>
    public static Mesh Torus(double cx, double cy, double cz, double major, double minor, int around, int tube)
    {
        var p = new double[3 * around * tube];
        for (int i = 0; i < around; i++)
        {
            double phi = 2 * Math.PI * i / around;
            for (int j = 0; j < tube; j++)
            {
                double theta = 2 * Math.PI * j / tube, ring = major + minor * Math.Cos(theta);
                int k = 3 * (i * tube + j);
                (p[k], p[k + 1], p[k + 2]) = (cx + ring * Math.Cos(phi), cy + minor * Math.Sin(theta), cz + ring * Math.Sin(phi));
            }
        }
        return new Mesh(p, Grid(around, tube)).Outward();
    }

    /// <summary>
    /// A tube of radius <paramref name="tube"/> around the (p, q) torus knot (x, z) = (R + a·cos qt)(cos pt, sin pt),
    /// y = a·sin qt: 2 · <paramref name="along"/> · <paramref name="around"/> triangles, closed, winding as generated.
    /// </summary>
    public static Mesh TorusKnot(double cx, double cy, double cz, double major, double a, double tube, int p, int q, int along, int around)
    {
        double[] Curve(double t) =>
        [
            cx + (major + a * Math.Cos(q * t)) * Math.Cos(p * t),
            cy + a * Math.Sin(q * t),
            cz + (major + a * Math.Cos(q * t)) * Math.Sin(p * t),
        ];
        var pos = new double[3 * along * around];
        for (int i = 0; i < along; i++)
        {
            double t = 2 * Math.PI * i / along, h = 1e-4;
            double[] c = Curve(t), f = Curve(t + h), b = Curve(t - h);
            double[] tan = Normalize([f[0] - b[0], f[1] - b[1], f[2] - b[2]]);
            double[] acc = [f[0] - 2 * c[0] + b[0], f[1] - 2 * c[1] + b[1], f[2] - 2 * c[2] + b[2]];
            double along0 = Dot(acc, tan);
            double[] n = Normalize([acc[0] - along0 * tan[0], acc[1] - along0 * tan[1], acc[2] - along0 * tan[2]]);
            double[] bi = Cross(tan, n);
            for (int j = 0; j < around; j++)
            {
                double th = 2 * Math.PI * j / around, cs = Math.Cos(th) * tube, sn = Math.Sin(th) * tube;
                int k = 3 * (i * around + j);
                for (int d = 0; d < 3; d++)
                    pos[k + d] = c[d] + cs * n[d] + sn * bi[d];
            }
        }
        return new Mesh(pos, Grid(along, around));
    }

    private static int[] Grid(int rows, int cols)
    {
        var t = new int[6 * rows * cols];
        int k = 0;
        for (int i = 0; i < rows; i++)
        {
            for (int j = 0; j < cols; j++)
            {
                int a = i * cols + j, b = i * cols + (j + 1) % cols, c = (i + 1) % rows * cols + (j + 1) % cols, d = (i + 1) % rows * cols + j;
                (t[k], t[k + 1], t[k + 2], t[k + 3], t[k + 4], t[k + 5]) = (a, b, c, a, c, d);
                k += 6;
            }
        }
        return t;
    }

    private static int[] Quads(int[] q)
    {
        var t = new List<int>();
        for (int i = 0; i < q.Length; i += 4)
            t.AddRange([q[i], q[i + 1], q[i + 2], q[i], q[i + 2], q[i + 3]]);
        return [.. t];
    }

    private static double Dot(double[] a, double[] b) => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];

    private static double[] Cross(double[] a, double[] b) =>
        [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];

    private static double[] Normalize(double[] v)
    {
        double l = Math.Sqrt(Dot(v, v));
        return [v[0] / l, v[1] / l, v[2] / l];
    }

    /// <summary>Wavefront OBJ text: one "v" line per vertex, one "f" line per triangle, indices from 1.</summary>
    public static string Obj(Mesh m, string? header = null)
    {
        var sb = new StringBuilder();
        if (header is not null)
            sb.Append(header);
        for (int i = 0; i < m.Positions.Length; i += 3)
            sb.Append(CultureInfo.InvariantCulture, $"v {(float)m.Positions[i]:R} {(float)m.Positions[i + 1]:R} {(float)m.Positions[i + 2]:R}\n");
        for (int t = 0; t < m.Indices.Length; t += 3)
            sb.Append(CultureInfo.InvariantCulture, $"f {m.Indices[t] + 1} {m.Indices[t + 1] + 1} {m.Indices[t + 2] + 1}\n");
        return sb.ToString();
    }

    /// <summary>Binary STL as its format defines it: 80-byte header, uint32 count, 50-byte little-endian records.</summary>
    public static void WriteBinaryStl(Stream s, Mesh m, string header = "VoxProf test mesh")
    {
        var head = new byte[84];
        Encoding.ASCII.GetBytes(header).AsSpan(0, Math.Min(header.Length, 80)).CopyTo(head);
        BinaryPrimitives.WriteUInt32LittleEndian(head.AsSpan(80), (uint)m.TriangleCount);
        s.Write(head);
        var record = new byte[50];
        for (int t = 0; t < m.Indices.Length; t += 3)
        {
            record.AsSpan().Clear();
            for (int k = 0; k < 3; k++)
            {
                double[] p = m.P(m.Indices[t + k]);
                for (int a = 0; a < 3; a++)
                    BinaryPrimitives.WriteSingleLittleEndian(record.AsSpan(12 + 12 * k + 4 * a), (float)p[a]);
            }
            s.Write(record);
        }
    }

    public static byte[] BinaryStl(Mesh m)
    {
        using var ms = new MemoryStream();
        WriteBinaryStl(ms, m);
        return ms.ToArray();
    }
}
