using System.Buffers.Binary;
using System.IO.Compression;
using System.Text;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;
using VoxProf.Core;
using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes;
using VoxProf.Core.Scenes.Layers;
using VoxProf.Tests.Scenes.Meshes;

namespace VoxProf.Tests.Scenes;

/// <summary>The layer kinds that read files, through the scene loader: mesh placement, heightmaps, typed volumes.</summary>
public class FileLayerTests
{
    private static readonly MeshShapes.Mesh Unit = MeshShapes.Box(0, 0, 0, 2, 1, 3);

    private static Scene Load(TempScene scene) => SceneLoader.Load(scene.Path);

    private static Box3i MeshBounds(string placement, string extra = "")
    {
        using TempScene scene = TempScene.With($"{{'kind': 'mesh', 'material': 2, 'file': 'm.obj', {placement}{extra}}}", extent: "[64, 64, 64]");
        scene.WriteSideFile("m.obj", Encoding.ASCII.GetBytes(MeshShapes.Obj(Unit)));
        return Load(scene).Layers[0].Bounds;
    }

    // The 2 × 1 × 3 box from the origin, placed; bounds hold the voxels whose closed cubes touch it, so a corner on a
    // whole number reaches one voxel below it.
    [Theory]
    [InlineData("'scale': 4, 'offset': [10.5, 20.5, 30.5]", 10, 20, 30, 19, 25, 43)]
    [InlineData("'scale': [2, 3, 1], 'offset': [5.5, 5.5, 5.5]", 5, 5, 5, 10, 9, 9)]
    [InlineData("'fit': {'size': 12, 'origin': [8.5, 8.5, 8.5]}", 8, 8, 8, 17, 13, 21)]
    [InlineData("'up': 'z', 'offset': [5.5, 5.5, 5.5]", 5, 5, 4, 8, 9, 6)]
    [InlineData("'rotate': [0, 90, 0], 'offset': [5.5, 5.5, 5.5]", 5, 5, 3, 9, 7, 6)]
    public void Mesh_placement_scales_rotates_and_offsets_in_the_documented_order(string placement,
        int x0, int y0, int z0, int x1, int y1, int z1)
    {
        MeshBounds(placement).Should().Be(new Box3i(x0, y0, z0, x1, y1, z1));
    }

    [Fact]
    public void A_solid_mesh_layer_fills_its_inside_and_counts_zero_area_triangles()
    {
        using TempScene scene = TempScene.With("{'kind': 'mesh', 'material': 2, 'file': 'm.obj', 'fill': 'solid', 'scale': 4, 'offset': [10.5, 10.5, 10.5]}",
            extent: "[32, 32, 32]");
        scene.WriteSideFile("m.obj", Encoding.ASCII.GetBytes(MeshShapes.Obj(Unit) + "f 1 1 2\n"));
        var layer = (MeshLayer)Load(scene).Layers[0];
        (layer.TriangleCount, layer.ZeroAreaTriangles, layer.Rule, layer.File).Should().Be((12, 1, InsideRule.Winding, "m.obj"));
        // The box spans x 10.5..18.5: centres 11.5..17.5 inside and the cubes 10 and 18 touch the faces.
        long solid = LayerChecks.CountInside(layer, new Box3i(0, 0, 0, 32, 32, 32));
        solid.Should().Be(9L * 5 * 13);
    }

    [Fact]
    public void Mesh_layer_errors_name_the_key_or_the_file_and_place()
    {
        using (TempScene scene = TempScene.With("{'kind': 'mesh', 'material': 2, 'file': 'm.txt'}"))
        {
            scene.WriteSideFile("m.txt", [1, 2, 3]);
            var ex = FluentActions.Invoking(() => Load(scene)).Should().Throw<SceneFormatException>().Which;
            ex.Where.Should().Be("$.layers[0].file");
            ex.Problem.Should().StartWith("no known mesh extension on m.txt");
        }
        using (TempScene scene = TempScene.With("{'kind': 'mesh', 'material': 2, 'file': 'm.obj', 'fill': 'solid'}"))
        {
            scene.WriteSideFile("m.obj", Encoding.ASCII.GetBytes(MeshShapes.Obj(Unit with { Indices = Unit.Indices[3..] })));
            var ex = FluentActions.Invoking(() => Load(scene)).Should().Throw<SceneFormatException>().Which;
            ex.Where.Should().Be("$.layers[0].fill");
            ex.Problem.Should().StartWith("m.obj is not closed: 3 edges belong to an odd number of triangles");
        }
        using (TempScene scene = TempScene.With("{'kind': 'mesh', 'material': 2, 'file': 'm.obj', 'scale': 2, 'fit': {'size': 4, 'origin': [0, 0, 0]}}"))
        {
            scene.WriteSideFile("m.obj", Encoding.ASCII.GetBytes(MeshShapes.Obj(Unit)));
            FluentActions.Invoking(() => Load(scene)).Should().Throw<SceneFormatException>().Which.Where.Should().Be("$.layers[0].fit");
        }
        using (TempScene scene = TempScene.With("{'kind': 'mesh', 'material': 2, 'file': 'm.obj'}"))
        {
            scene.WriteSideFile("m.obj", Encoding.ASCII.GetBytes("v 0 0 0\nv 1 0 0\nv 0 1 0\nf 1 2 7\n"));
            var ex = FluentActions.Invoking(() => Load(scene)).Should().Throw<SceneFormatException>().Which;
            (ex.File, ex.Where).Should().Be((Path.Combine(scene.Folder, "m.obj"), "line 4"));
        }
    }

    [Theory]
    [InlineData(false)]
    [InlineData(true)]
    public void Heightmap_columns_follow_the_grey_levels(bool sixteenBit)
    {
        using TempScene scene = TempScene.With("{'kind': 'heightmap', 'material': 3, 'file': 'h.png', 'origin': [4, 2, 6], 'cellSize': 2, 'height': [1, 21]}",
            extent: "[64, 32, 64]");
        // 3 × 2 pixels; white is 21 voxels above the base, black 1.
        ushort[] levels = [0, 65535, 32768, 13107, 0, 65535];
        byte[] png;
        using (var ms = new MemoryStream())
        {
            if (sixteenBit)
            {
                using var image = new Image<L16>(3, 2);
                for (int i = 0; i < 6; i++)
                    image[i % 3, i / 3] = new L16(levels[i]);
                image.SaveAsPng(ms, new SixLabors.ImageSharp.Formats.Png.PngEncoder { BitDepth = SixLabors.ImageSharp.Formats.Png.PngBitDepth.Bit16, ColorType = SixLabors.ImageSharp.Formats.Png.PngColorType.Grayscale });
            }
            else
            {
                using var image = new Image<L8>(3, 2);
                for (int i = 0; i < 6; i++)
                    image[i % 3, i / 3] = new L8((byte)(levels[i] >> 8));
                image.SaveAsPng(ms, new SixLabors.ImageSharp.Formats.Png.PngEncoder { BitDepth = SixLabors.ImageSharp.Formats.Png.PngBitDepth.Bit8, ColorType = SixLabors.ImageSharp.Formats.Png.PngColorType.Grayscale });
            }
            png = ms.ToArray();
        }
        scene.WriteSideFile("h.png", png);
        var layer = (HeightmapLayer)Load(scene).Layers[0];
        int max = sixteenBit ? 65535 : 255;
        for (int i = 0; i < 6; i++)
        {
            int value = sixteenBit ? levels[i] : levels[i] >> 8;
            int top = 2 + (int)Math.Floor(1 + 20.0 * value / max);
            int x = 4 + 2 * (i % 3), z = 6 + 2 * (i / 3);
            foreach (var (cx, cz) in new[] { (x, z), (x + 1, z + 1) })
            {
                layer.TopAt(cx, cz).Should().Be(top, $"pixel {i}");
                layer.Contains(cx, top - 1, cz).Should().BeTrue();
                layer.Contains(cx, top, cz).Should().BeFalse();
                layer.Contains(cx, 1, cz).Should().BeFalse("columns start at the origin's y");
            }
        }
        LayerChecks.ClassifyIsConservative(layer, new Box3i(0, 0, 0, 64, 32, 64), seed: 3, regions: 200, maxSize: 8);
        LayerChecks.FillAgreesWithContains(layer, new Box3i(0, 0, 0, 64, 32, 64), seed: 4, regions: 30, maxSize: 12);
    }

    [Fact]
    public void A_colour_png_is_refused_as_a_heightmap()
    {
        using TempScene scene = TempScene.With("{'kind': 'heightmap', 'material': 3, 'file': 'h.png', 'height': [0, 5]}");
        using (var ms = new MemoryStream())
        {
            using var image = new Image<Rgb24>(2, 2);
            image.SaveAsPng(ms);
            scene.WriteSideFile("h.png", ms.ToArray());
        }
        var ex = FluentActions.Invoking(() => Load(scene)).Should().Throw<SceneFormatException>().Which;
        ex.Problem.Should().EndWith("expected greyscale with 8 or 16 bits");
    }

    [Fact]
    public void Typed_raw_volumes_threshold_their_samples_in_either_byte_order()
    {
        // 2 × 1 × 1 samples; solid where the value is above 100.
        byte[] u16 = [0x00, 0x65, 0x00, 0x64]; // big endian 101, 100
        byte[] f32 = new byte[8];
        BinaryPrimitives.WriteSingleLittleEndian(f32, 99.5f);
        BinaryPrimitives.WriteSingleLittleEndian(f32.AsSpan(4), 100.5f);
        using TempScene scene = TempScene.With(
            "{'kind': 'raw', 'material': 1, 'file': 'a.raw', 'size': [2, 1, 1], 'type': 'u16', 'endian': 'big', 'threshold': 100}," +
            "{'kind': 'raw', 'material': 2, 'file': 'b.raw', 'size': [2, 1, 1], 'type': 'f32', 'threshold': 100, 'origin': [0, 1, 0]}");
        scene.WriteSideFile("a.raw", u16);
        scene.WriteSideFile("b.raw", f32);
        Scene s = Load(scene);
        (s.EvaluateMaterial(0, 0, 0), s.EvaluateMaterial(1, 0, 0), s.EvaluateMaterial(0, 1, 0), s.EvaluateMaterial(1, 1, 0))
            .Should().Be(((byte)1, (byte)0, (byte)0, (byte)2));
    }

    [Fact]
    public void A_typed_raw_file_of_the_wrong_length_is_refused_before_reading()
    {
        using TempScene scene = TempScene.With("{'kind': 'raw', 'material': 1, 'file': 'a.raw', 'size': [4, 4, 4], 'type': 'u16'}");
        scene.WriteSideFile("a.raw", new byte[64]);
        var ex = FluentActions.Invoking(() => Load(scene)).Should().Throw<SceneFormatException>().Which;
        ex.Problem.Should().Be("raw volume file a.raw holds 64 bytes; expected 128 (4 × 4 × 4 from $.layers[0].size, 2 bytes each)");
    }

    // NRRD as the Teem toolkit's format description defines it: magic line, "field: value" lines, a blank line, then the
    // samples x fastest, raw or gzip-compressed.
    [Theory]
    [InlineData("raw")]
    [InlineData("gzip")]
    public void Nrrd_volumes_are_read_raw_or_gzip(string encoding)
    {
        var samples = new byte[3 * 2 * 2 * 2];
        for (int i = 0; i < 12; i++)
            BinaryPrimitives.WriteUInt16LittleEndian(samples.AsSpan(2 * i), (ushort)(i * 1000));
        byte[] data = samples;
        if (encoding == "gzip")
        {
            using var ms = new MemoryStream();
            using (var gz = new GZipStream(ms, CompressionLevel.Optimal, leaveOpen: true))
                gz.Write(samples);
            data = ms.ToArray();
        }
        string header = $"NRRD0004\n# made by a test\ntype: unsigned short\ndimension: 3\nsizes: 3 2 2\nspacings: 1 1 1\nendian: little\nencoding: {encoding}\ncontent:=test\n\n";
        using TempScene scene = TempScene.With("{'kind': 'raw', 'material': 5, 'file': 'v.nrrd', 'threshold': 5500, 'origin': [1, 1, 1]}");
        scene.WriteSideFile("v.nrrd", [.. Encoding.ASCII.GetBytes(header), .. data]);
        Scene s = Load(scene);
        for (int i = 0; i < 12; i++)
            s.EvaluateMaterial(1 + i % 3, 1 + (i / 3) % 2, 1 + i / 6).Should().Be(i * 1000 > 5500 ? (byte)5 : (byte)0, $"sample {i}");
    }

    [Theory]
    [InlineData("NRRD0004\ntype: ushort\ndimension: 2\nsizes: 3 2\nendian: little\nencoding: raw\n\n", "line 3", "dimension 2; expected 3")]
    [InlineData("NRRD0004\ntype: double\ndimension: 3\nsizes: 1 1 1\nencoding: raw\n\n", "line 2", "type \"double\"; expected uchar, ushort or float")]
    [InlineData("NRRD0004\ntype: uchar\ndimension: 3\nsizes: 2 2 2\nencoding: raw\n\nabc", "byte offset 62", "raw data holds 3 bytes; expected 8")]
    [InlineData("NRRD0004\ntype: uchar\ndimension: 3\nsizes: 2 2 2\ndata file: x.raw\nencoding: raw\n\n", "line 5", "field \"data file\" is not supported")]
    public void Bad_nrrd_headers_name_the_line_or_offset(string file, string where, string problem)
    {
        using TempScene scene = TempScene.With("{'kind': 'raw', 'material': 5, 'file': 'v.nrrd'}");
        scene.WriteSideFile("v.nrrd", Encoding.ASCII.GetBytes(file));
        var ex = FluentActions.Invoking(() => Load(scene)).Should().Throw<SceneFormatException>().Which;
        ex.Where.Should().Be(where);
        ex.Problem.Should().Contain(problem);
        ex.Should().BeAssignableTo<InputException>();
    }

    [Fact]
    public void An_nrrd_layer_takes_no_size_key()
    {
        using TempScene scene = TempScene.With("{'kind': 'raw', 'material': 5, 'file': 'v.nrrd', 'size': [1, 1, 1]}");
        var ex = FluentActions.Invoking(() => Load(scene)).Should().Throw<SceneFormatException>().Which;
        (ex.Where, ex.Problem).Should().Be(("$.layers[0].size", "an NRRD file states its own size in its header; remove the key"));
    }
}
