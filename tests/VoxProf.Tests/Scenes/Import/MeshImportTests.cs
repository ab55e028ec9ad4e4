using System.Buffers.Binary;
using System.Numerics;
using System.Runtime.InteropServices;
using System.Text;
using SharpGLTF.Schema2;
using VoxProf.Core;
using VoxProf.Core.Scenes.Import;
using VoxProf.Tests.Scenes.Meshes;

namespace VoxProf.Tests.Scenes.Import;

public sealed class MeshImportTests : IDisposable
{
    private readonly string _dir = Path.Combine(Path.GetTempPath(), "voxprof-import-" + Guid.NewGuid().ToString("N"));

    public MeshImportTests() => Directory.CreateDirectory(_dir);

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    private string Write(string name, byte[] bytes)
    {
        string path = Path.Combine(_dir, name);
        Directory.CreateDirectory(Path.GetDirectoryName(path)!);
        File.WriteAllBytes(path, bytes);
        return path;
    }

    private string Write(string name, string text) => Write(name, Encoding.ASCII.GetBytes(text));

    private TriangleMesh Read(string path, string? format = null) =>
        MeshFiles.Read(path, format ?? MeshFiles.FormatOf(path)!, _dir);

    private SceneFormatException Reject(string path, string? format = null)
    {
        var ex = FluentActions.Invoking(() => Read(path, format)).Should().Throw<SceneFormatException>().Which;
        ex.File.Should().Be(path);
        ex.Message.Should().StartWith($"{path}: {ex.Where}: ").And.NotContain("\n");
        return ex;
    }

    /// <summary>Triangles as corner positions, so meshes from different formats compare whatever their numbering.</summary>
    private static float[][] Corners(TriangleMesh m) =>
        [.. Enumerable.Range(0, m.TriangleCount).Select(t => Enumerable.Range(0, 3)
            .SelectMany(k => m.Positions.AsSpan(3 * m.Indices[3 * t + k], 3).ToArray()).ToArray())];

    private static readonly MeshShapes.Mesh Box = MeshShapes.Box(0.5, 1, 2, 3, 4.25, 6);

    // Binary STL as its format description defines it (3D Systems, "StereoLithography Interface Specification", 1988;
    // cited from memory): an 80-byte header, a little-endian uint32 triangle count, and per triangle a 50-byte record of
    // twelve float32 (normal, three corners) and a uint16 attribute byte count.
    [Fact]
    public void Binary_stl_reads_the_documented_layout_and_welds_shared_corners()
    {
        byte[] bytes = MeshShapes.BinaryStl(Box);
        bytes.Length.Should().Be(80 + 4 + 50 * 12);
        BinaryPrimitives.ReadUInt32LittleEndian(bytes.AsSpan(80)).Should().Be(12);
        BinaryPrimitives.ReadSingleLittleEndian(bytes.AsSpan(84 + 12)).Should().Be((float)Box.P(Box.Indices[0])[0]);
        TriangleMesh mesh = Read(Write("box.stl", bytes));
        mesh.TriangleCount.Should().Be(12);
        mesh.VertexCount.Should().Be(8, "the 36 corners of a box's triangles are 8 distinct points");
        Corners(mesh)[0].Should().Equal(Box.P(Box.Indices[0]).Concat(Box.P(Box.Indices[1])).Concat(Box.P(Box.Indices[2])).Select(d => (float)d));
    }

    [Fact]
    public void Ascii_stl_obj_and_every_ply_encoding_give_the_same_triangles()
    {
        float[][] expected = Corners(Read(Write("box.stl", MeshShapes.BinaryStl(Box))));
        Corners(Read(Write("box-ascii.stl", AsciiStl(Box)))).Should().BeEquivalentTo(expected, o => o.WithStrictOrdering());
        Corners(Read(Write("box.obj", MeshShapes.Obj(Box, "# a box\no box\ng sides\nusemtl stone\ns off\n")))).Should()
            .BeEquivalentTo(expected, o => o.WithStrictOrdering());
        foreach (string format in (string[])["ascii", "binary_little_endian", "binary_big_endian"])
        {
            Corners(Read(Write($"box-{format}.ply", Ply(Box, format)))).Should()
                .BeEquivalentTo(expected, o => o.WithStrictOrdering(), format);
        }
        // A "format" key overrides the extension.
        Corners(Read(Write("box.mesh", MeshShapes.BinaryStl(Box)), "stl")).Should().BeEquivalentTo(expected, o => o.WithStrictOrdering());
    }

    [Fact]
    public void Obj_polygons_become_fans_and_negative_indices_count_back()
    {
        string obj = "v 0 0 0\nv 1 0 0\nv 1 1 0\nv 0 1 0\nvt 0 0\nvn 0 0 1\nf 1/1/1 2/1/1 3//1 4\nv 0 0 1\nf -1 -5 -4\n";
        TriangleMesh mesh = Read(Write("quad.obj", obj));
        mesh.Indices.Should().Equal(0, 1, 2, 0, 2, 3, 4, 0, 1);
    }

    [Fact]
    public void Gltf_written_by_sharpgltf_reads_back_with_node_transforms_as_text_and_binary()
    {
        ModelRoot model = GltfModel(Box, Matrix4x4.CreateTranslation(10, 20, 30));
        string gltf = Path.Combine(_dir, "box.gltf"), glb = Path.Combine(_dir, "box.glb");
        model.SaveGLTF(gltf);
        model.SaveGLB(glb);
        File.Exists(Path.ChangeExtension(gltf, "bin")).Should().BeTrue("a .gltf keeps its buffer in a separate file");
        float[][] expected = Corners(Read(Write("moved.obj", MeshShapes.Obj(Box with
        {
            Positions = [.. Box.Positions.Select((p, i) => p + (i % 3 == 0 ? 10 : i % 3 == 1 ? 20 : 30))],
        }))));
        Corners(Read(gltf)).Should().BeEquivalentTo(expected, o => o.WithStrictOrdering());
        Corners(Read(glb)).Should().BeEquivalentTo(expected, o => o.WithStrictOrdering());
    }

    [Fact]
    public void Gltf_buffer_uri_outside_the_scene_folder_is_refused()
    {
        string outside = Path.Combine(Path.GetTempPath(), "voxprof-outside-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(outside);
        try
        {
            ModelRoot model = GltfModel(Box, Matrix4x4.Identity);
            model.SaveGLTF(Path.Combine(outside, "box.gltf"));
            string text = File.ReadAllText(Path.Combine(outside, "box.gltf"))
                .Replace("\"box.bin\"", $"\"../{Path.GetFileName(outside)}/box.bin\"", StringComparison.Ordinal);
            string path = Write("scene/inner.gltf", text);
            var ex = FluentActions.Invoking(() => MeshFiles.Read(path, "gltf", Path.Combine(_dir, "scene")))
                .Should().Throw<SceneFormatException>().Which;
            ex.Where.Should().Contain("box.bin");
            ex.Problem.Should().Contain("outside the scene's folder");
        }
        finally
        {
            Directory.Delete(outside, recursive: true);
        }
    }

    [Theory]
    [InlineData("v 0 0 0\nv 1 0 0\nv 1 abc 0\nf 1 2 3\n", "line 3", "expected \"v x y z\" with three numbers")]
    [InlineData("v 0 0 0\nv 1 0 0\nv 1 1 0\nf 1 2 4\n", "line 4", "vertex index 4 is out of range; expected 1 to 3")]
    [InlineData("v 0 0 0\nv 1 0 0\nv 1 1 0\nf 1 2 -4\n", "line 4", "vertex index -4 is out of range")]
    [InlineData("v 0 0 0\nv nan 0 0\nv 1 1 0\nf 1 2 3\n", "line 2", "is not finite; expected finite coordinates")]
    [InlineData("v 0 0 0\nv 1 0 0\nf 1 2\n", "line 3", "expected a face of at least three corners")]
    [InlineData("v 0 0 0\ncurv 0 1 1 2\n", "line 2", "unknown statement \"curv\"")]
    public void Malformed_obj_names_the_line_and_what_was_expected(string obj, string where, string problem)
    {
        var ex = Reject(Write("bad.obj", obj));
        ex.Where.Should().Be(where);
        ex.Problem.Should().Contain(problem);
    }

    [Fact]
    public void Truncated_binary_stl_is_refused_before_reading_naming_the_missing_record()
    {
        byte[] bytes = MeshShapes.BinaryStl(Box)[..(84 + 50 * 5 + 20)];
        var ex = Reject(Write("short.stl", bytes));
        ex.Where.Should().Be("byte offset 334", "records 0 to 4 end at 84 + 250; record 5 is cut short");
        ex.Problem.Should().Contain("expected 84 + 50 × 12 = 684");
    }

    [Fact]
    public void Nan_in_a_binary_stl_names_the_corner_offset()
    {
        byte[] bytes = MeshShapes.BinaryStl(Box);
        BinaryPrimitives.WriteSingleLittleEndian(bytes.AsSpan(84 + 50 * 2 + 24 + 4), float.NaN);
        var ex = Reject(Write("nan.stl", bytes));
        ex.Where.Should().Be($"byte offset {84 + 50 * 2 + 24}", "the second corner of triangle 2");
        ex.Problem.Should().Contain("not finite");
    }

    [Fact]
    public void Truncated_binary_ply_and_bad_ply_headers_are_reported()
    {
        byte[] ply = Ply(Box, "binary_little_endian");
        var ex = Reject(Write("short.ply", ply[..^7]));
        ex.Where.Should().StartWith("byte offset ");
        ex.Problem.Should().Be("file ends with 1 of the 4 bytes of a face's vertex index; expected the whole record");

        ex = Reject(Write("type.ply", "ply\nformat ascii 1.0\nelement vertex 3\nproperty flt x\nend_header\n"));
        (ex.Where, ex.Problem).Should().Be(("line 4", "unknown type \"flt\"; expected char, uchar, short, ushort, int, uint, float, double (or int8, uint8, int16, uint16, int32, uint32, float32, float64)"));

        string text = Encoding.ASCII.GetString(Ply(Box, "ascii"));
        ex = Reject(Write("index.ply", text.Replace("\n3 0 3 2\n", "\n3 0 3 9\n", StringComparison.Ordinal)));
        ex.Where.Should().StartWith("line ");
        ex.Problem.Should().Contain("vertex index 9 is out of range; expected 0 to 7");
    }

    [Fact]
    public void Zero_area_triangles_are_dropped_and_counted()
    {
        string obj = "v 0 0 0\nv 1 0 0\nv 2 0 0\nv 0 1 0\nf 1 2 3\nf 1 2 4\nf 1 1 4\n";
        TriangleMesh mesh = Read(Write("slivers.obj", obj));
        mesh.DropZeroArea().Should().Be(2, "three corners on a line, and a repeated corner");
        mesh.Indices.Should().Equal(0, 1, 3);
    }

    internal static ModelRoot GltfModel(MeshShapes.Mesh m, Matrix4x4 transform)
    {
        ModelRoot model = ModelRoot.CreateModel();
        SharpGLTF.Schema2.Mesh mesh = model.CreateMesh("mesh");
        MeshPrimitive primitive = mesh.CreatePrimitive();
        float[] positions = [.. m.Positions.Select(p => (float)p)];
        Accessor position = model.CreateAccessor("position");
        position.SetVertexData(model.UseBufferView(MemoryMarshal.AsBytes(positions.AsSpan()).ToArray(), 0, null, 0, BufferMode.ARRAY_BUFFER),
            0, positions.Length / 3, SharpGLTF.Memory.AttributeFormat.Float3);
        primitive.SetVertexAccessor("POSITION", position);
        uint[] indices = [.. m.Indices.Select(i => (uint)i)];
        Accessor index = model.CreateAccessor("indices");
        index.SetIndexData(model.UseBufferView(MemoryMarshal.AsBytes(indices.AsSpan()).ToArray(), 0, null, 0, BufferMode.ELEMENT_ARRAY_BUFFER),
            0, indices.Length, IndexEncodingType.UNSIGNED_INT);
        primitive.SetIndexAccessor(index);
        primitive.DrawPrimitiveType = PrimitiveType.TRIANGLES;
        Node node = model.UseScene(0).CreateNode("node");
        node.Mesh = mesh;
        node.LocalMatrix = transform;
        return model;
    }

    private static string AsciiStl(MeshShapes.Mesh m)
    {
        var sb = new StringBuilder("solid box\n");
        for (int t = 0; t < m.Indices.Length; t += 3)
        {
            sb.Append("  facet normal 0 0 0\n    outer loop\n");
            for (int k = 0; k < 3; k++)
            {
                double[] p = m.P(m.Indices[t + k]);
                sb.Append(System.Globalization.CultureInfo.InvariantCulture, $"      vertex {(float)p[0]:R} {(float)p[1]:R} {(float)p[2]:R}\n");
            }
            sb.Append("    endloop\n  endfacet\n");
        }
        return sb.Append("endsolid box\n").ToString();
    }

    // PLY as described by Turk (1994): header lines, then the vertex records (here x, y, z as float and an extra uchar),
    // then face records (a uchar count and int indices), as text or as packed binary in the stated byte order.
    private static byte[] Ply(MeshShapes.Mesh m, string format)
    {
        int vertices = m.Positions.Length / 3;
        string header = $"ply\nformat {format} 1.0\ncomment written by a test\nelement vertex {vertices}\nproperty float x\nproperty float y\n"
            + $"property float z\nproperty uchar quality\nelement face {m.TriangleCount}\nproperty list uchar int vertex_indices\nend_header\n";
        using var ms = new MemoryStream();
        ms.Write(Encoding.ASCII.GetBytes(header));
        bool big = format == "binary_big_endian";
        var b = new byte[4];
        void Int(int v)
        {
            if (big)
                BinaryPrimitives.WriteInt32BigEndian(b, v);
            else
                BinaryPrimitives.WriteInt32LittleEndian(b, v);
            ms.Write(b);
        }
        void Float(float v) => Int(BitConverter.SingleToInt32Bits(v));
        var text = new StringBuilder();
        for (int v = 0; v < vertices; v++)
        {
            double[] p = m.P(v);
            if (format == "ascii")
            {
                text.Append(System.Globalization.CultureInfo.InvariantCulture, $"{(float)p[0]:R} {(float)p[1]:R} {(float)p[2]:R} 7\n");
                continue;
            }
            Float((float)p[0]);
            Float((float)p[1]);
            Float((float)p[2]);
            ms.WriteByte(7);
        }
        for (int t = 0; t < m.Indices.Length; t += 3)
        {
            if (format == "ascii")
            {
                text.Append(System.Globalization.CultureInfo.InvariantCulture, $"3 {m.Indices[t]} {m.Indices[t + 1]} {m.Indices[t + 2]}\n");
                continue;
            }
            ms.WriteByte(3);
            Int(m.Indices[t]);
            Int(m.Indices[t + 1]);
            Int(m.Indices[t + 2]);
        }
        ms.Write(Encoding.ASCII.GetBytes(text.ToString()));
        return ms.ToArray();
    }
}
