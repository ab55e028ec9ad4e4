using System.Globalization;
using System.Runtime.CompilerServices;

namespace VoxProf.Core.Scenes.Import;

/// <summary>
/// Collects a mesh while a file is read: welds vertices with identical positions (bit for bit, with −0 taken as 0)
/// through an open-addressing table, so a triangle soup such as STL becomes an indexed mesh whose shared edges can be
/// found, and refuses to grow past <see cref="TriangleMesh.MaxTriangles"/> or <see cref="TriangleMesh.MaxVertices"/>.
/// </summary>
internal sealed class MeshBuilder
{
    private readonly string _file;
    private float[] _positions;
    private int _vertices;
    private int[] _indices;
    private int _indexCount;
    private int[] _slots;

    /// <param name="expectedTriangles">
    /// The triangle count when the file states it: the index array is then allocated once at its final size, and
    /// room for about half as many vertices (a closed mesh has about T/2), so a large file is not copied while it grows.
    /// </param>
    public MeshBuilder(string file, int expectedTriangles = 0)
    {
        _file = file;
        int triangles = Math.Max(expectedTriangles, 1024);
        int vertices = triangles / 2 + 64;
        _indices = new int[3 * triangles];
        _positions = new float[3 * vertices];
        _slots = NewSlots((int)Math.Min(1L << 30, (long)System.Numerics.BitOperations.RoundUpToPowerOf2((uint)(2 * vertices))));
    }

    public int VertexCount => _vertices;
    public int TriangleCount => _indexCount / 3;

    /// <summary>Returns the index of the vertex at this position, adding it if new; <paramref name="where"/> names the place for errors.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public int AddVertex(float x, float y, float z, string where)
    {
        if (!float.IsFinite(x) || !float.IsFinite(y) || !float.IsFinite(z))
        {
            throw new SceneFormatException(_file, where, string.Create(CultureInfo.InvariantCulture,
                $"vertex ({x}, {y}, {z}) is not finite; expected finite coordinates (no NaN or infinity)"));
        }
        // −0 and +0 are one position.
        x += 0f;
        y += 0f;
        z += 0f;
        uint bx = BitConverter.SingleToUInt32Bits(x), by = BitConverter.SingleToUInt32Bits(y), bz = BitConverter.SingleToUInt32Bits(z);
        int mask = _slots.Length - 1;
        for (int slot = Hash(bx, by, bz) & mask; ; slot = (slot + 1) & mask)
        {
            int v = _slots[slot];
            if (v < 0)
                break;
            int p = 3 * v;
            if (BitConverter.SingleToUInt32Bits(_positions[p]) == bx && BitConverter.SingleToUInt32Bits(_positions[p + 1]) == by
                && BitConverter.SingleToUInt32Bits(_positions[p + 2]) == bz)
                return v;
        }
        if (_vertices >= TriangleMesh.MaxVertices)
        {
            throw new SceneFormatException(_file, where, string.Create(CultureInfo.InvariantCulture,
                $"more than {TriangleMesh.MaxVertices} distinct vertices; expected at most that many"));
        }
        if (3 * _vertices + 3 > _positions.Length)
            Array.Resize(ref _positions, _positions.Length * 2);
        int id = _vertices++;
        _positions[3 * id] = x;
        _positions[3 * id + 1] = y;
        _positions[3 * id + 2] = z;
        // Keep the table at most half full so probes stay short.
        if (2 * _vertices > _slots.Length)
            Rehash();
        else
            Insert(_slots, id, bx, by, bz);
        return id;
    }

    /// <summary>Adds one triangle of vertex indices already checked by the caller.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void AddTriangle(int a, int b, int c, string where)
    {
        if (_indexCount / 3 >= TriangleMesh.MaxTriangles)
        {
            throw new SceneFormatException(_file, where, string.Create(CultureInfo.InvariantCulture,
                $"more than {TriangleMesh.MaxTriangles} triangles; expected at most that many"));
        }
        if (_indexCount + 3 > _indices.Length)
            Array.Resize(ref _indices, _indices.Length * 2);
        _indices[_indexCount++] = a;
        _indices[_indexCount++] = b;
        _indices[_indexCount++] = c;
    }

    /// <summary>Splits a polygon of <paramref name="corners"/> into a fan of triangles from its first corner.</summary>
    public void AddPolygon(ReadOnlySpan<int> corners, string where)
    {
        for (int i = 1; i + 1 < corners.Length; i++)
            AddTriangle(corners[0], corners[i], corners[i + 1], where);
    }

    /// <summary>The mesh; arrays already at their final size are handed over without a copy.</summary>
    public TriangleMesh Build()
    {
        _slots = [];
        // A few spare vertices cost less than a copy of a large array (the estimate for closed meshes is close).
        float[] positions = _positions.Length - 3 * _vertices <= _positions.Length / 8 ? _positions : _positions[..(3 * _vertices)];
        int[] indices = _indices.Length == _indexCount ? _indices : _indices[.._indexCount];
        return new TriangleMesh(positions, indices, _vertices);
    }

    private static int[] NewSlots(int size)
    {
        var slots = new int[size];
        slots.AsSpan().Fill(-1);
        return slots;
    }

    private void Rehash()
    {
        int[] slots = NewSlots(_slots.Length * 2);
        for (int v = 0; v < _vertices; v++)
        {
            int p = 3 * v;
            Insert(slots, v, BitConverter.SingleToUInt32Bits(_positions[p]), BitConverter.SingleToUInt32Bits(_positions[p + 1]),
                BitConverter.SingleToUInt32Bits(_positions[p + 2]));
        }
        _slots = slots;
    }

    private static void Insert(int[] slots, int id, uint bx, uint by, uint bz)
    {
        int mask = slots.Length - 1;
        int slot = Hash(bx, by, bz) & mask;
        while (slots[slot] >= 0)
            slot = (slot + 1) & mask;
        slots[slot] = id;
    }

    // A fixed multiply-xorshift mix: the same on every run, so welding (and vertex numbering) is reproducible.
    private static int Hash(uint x, uint y, uint z)
    {
        ulong h = x * 0x9E3779B97F4A7C15UL ^ (y + 0x632BE59BD9B4E019UL) * 0xC2B2AE3D27D4EB4FUL ^ (z + 0x165667B19E3779F9UL) * 0x94D049BB133111EBUL;
        h ^= h >> 29;
        h *= 0xBF58476D1CE4E5B9UL;
        h ^= h >> 32;
        return (int)(h & 0x7FFFFFFF);
    }
}
