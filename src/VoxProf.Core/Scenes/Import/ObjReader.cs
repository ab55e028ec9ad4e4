using System.Globalization;

namespace VoxProf.Core.Scenes.Import;

/// <summary>
/// Wavefront OBJ: <c>v x y z [w]</c> vertices (extra numbers such as vertex colours are ignored) and
/// <c>f</c> polygons of <c>v</c>, <c>v/vt</c>, <c>v//vn</c> or <c>v/vt/vn</c> corners, indices from 1 or negative
/// (counted back from the latest vertex), split into triangle fans. Groups, objects, materials, smoothing, texture
/// coordinates, normals, lines and points are read past; free-form curve and surface statements are refused.
/// </summary>
internal static class ObjReader
{
    // Statements a polygon mesh may carry that do not change its triangles.
    private static readonly string[] Ignored =
        ["vt", "vn", "vp", "o", "g", "s", "mg", "usemtl", "mtllib", "usemap", "maplib", "l", "p", "lod", "bevel",
         "c_interp", "d_interp", "shadow_obj", "trace_obj"];

    public static TriangleMesh Read(Stream stream, string file)
    {
        var builder = new MeshBuilder(file);
        var lines = new TextLines(stream, file);
        var vertexIds = new List<int>();
        var corners = new List<int>();
        Span<float> p = stackalloc float[3];
        while (lines.Next(out ReadOnlySpan<byte> line))
        {
            var words = new Words(line);
            if (!words.Next(out ReadOnlySpan<byte> key) || key[0] == '#')
                continue;
            if (key.SequenceEqual("v"u8))
            {
                for (int k = 0; k < 3; k++)
                {
                    if (!words.Next(out ReadOnlySpan<byte> w) || !Words.TryFloat(w, out p[k]))
                        throw lines.Error($"expected \"v x y z\" with three numbers, found {Words.Show(line)}");
                }
                vertexIds.Add(builder.AddVertex(p[0], p[1], p[2], lines.Where));
            }
            else if (key.SequenceEqual("f"u8) || key.SequenceEqual("fo"u8))
            {
                corners.Clear();
                while (words.Next(out ReadOnlySpan<byte> w))
                    corners.Add(vertexIds[Corner(w, vertexIds.Count, lines)]);
                if (corners.Count < 3)
                    throw lines.Error($"expected a face of at least three corners, found {Words.Show(line)}");
                builder.AddPolygon(System.Runtime.InteropServices.CollectionsMarshal.AsSpan(corners), lines.Where);
            }
            else if (!IsIgnored(key))
            {
                throw lines.Error($"unknown statement {Words.Show(key)}; expected v, f, or one of {string.Join(", ", Ignored)} (polygon meshes only)");
            }
        }
        if (builder.TriangleCount == 0)
            throw new SceneFormatException(file, "$", "no faces; expected \"f\" statements");
        return builder.Build();
    }

    /// <summary>The zero-based vertex a corner such as <c>7/2/5</c> or <c>-1//3</c> names.</summary>
    private static int Corner(ReadOnlySpan<byte> word, int count, TextLines lines)
    {
        int slash = word.IndexOf((byte)'/');
        ReadOnlySpan<byte> first = slash < 0 ? word : word[..slash];
        if (!Words.TryLong(first, out long index))
            throw lines.Error($"expected a vertex index in face corner {Words.Show(word)}");
        long v = index > 0 ? index - 1 : count + index;
        if (count == 0)
            throw lines.Error($"face corner {Words.Show(word)} before any vertex; expected \"v\" statements first");
        if (index == 0 || v < 0 || v >= count)
        {
            throw lines.Error(string.Create(CultureInfo.InvariantCulture,
                $"vertex index {index} is out of range; expected 1 to {count} or -1 to -{count} (vertices so far)"));
        }
        return (int)v;
    }

    private static bool IsIgnored(ReadOnlySpan<byte> key)
    {
        foreach (string s in Ignored)
        {
            if (Words.Is(key, s))
                return true;
        }
        return false;
    }
}
