namespace VoxProf.Core.Scenes.Import;

/// <summary>
/// A triangle soup kept compact: 32-bit float positions (x, y, z per vertex, identical positions welded into one
/// vertex) and 32-bit indices (three per triangle, in the file's winding order).
/// </summary>
public sealed class TriangleMesh
{
    /// <summary>Largest triangle count accepted from any file (after polygons are split into triangles).</summary>
    public const int MaxTriangles = 1 << 25;

    /// <summary>Largest distinct-vertex count accepted from any file.</summary>
    public const int MaxVertices = 1 << 25;

    /// <param name="vertexCount">
    /// Vertices in use, when <paramref name="positions"/> has room for a few more (a reader's array is handed over
    /// rather than copied); −1 when every position is used.
    /// </param>
    public TriangleMesh(float[] positions, int[] indices, int vertexCount = -1)
    {
        if (positions.Length % 3 != 0 || indices.Length % 3 != 0 || vertexCount > positions.Length / 3)
            throw new ArgumentException("positions and indices come in threes");
        Positions = positions;
        Indices = indices;
        VertexCount = vertexCount < 0 ? positions.Length / 3 : vertexCount;
    }

    /// <summary>x, y, z of each vertex (the array may run past <see cref="VertexCount"/>; the tail is unused).</summary>
    public float[] Positions { get; private set; }

    /// <summary>Three vertex indices per triangle.</summary>
    public int[] Indices { get; private set; }

    public int VertexCount { get; }
    public int TriangleCount => Indices.Length / 3;

    /// <summary>
    /// Drops triangles of zero area and returns how many there were. Zero area is decided in the file's own
    /// coordinates: the cross product of two edges, computed in double from the float positions, is exactly zero
    /// (two corners coincide or all three lie on a line).
    /// </summary>
    public int DropZeroArea()
    {
        int kept = 0;
        int[] idx = Indices;
        float[] p = Positions;
        for (int t = 0; t < idx.Length; t += 3)
        {
            int a = 3 * idx[t], b = 3 * idx[t + 1], c = 3 * idx[t + 2];
            double ux = (double)p[b] - p[a], uy = (double)p[b + 1] - p[a + 1], uz = (double)p[b + 2] - p[a + 2];
            double vx = (double)p[c] - p[a], vy = (double)p[c + 1] - p[a + 1], vz = (double)p[c + 2] - p[a + 2];
            double nx = uy * vz - uz * vy, ny = uz * vx - ux * vz, nz = ux * vy - uy * vx;
            if (nx == 0 && ny == 0 && nz == 0)
                continue;
            idx[kept] = idx[t];
            idx[kept + 1] = idx[t + 1];
            idx[kept + 2] = idx[t + 2];
            kept += 3;
        }
        int dropped = (idx.Length - kept) / 3;
        if (dropped > 0)
            Indices = idx[..kept];
        return dropped;
    }
}
