using System.Globalization;
using System.IO.Compression;
using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes.Import;
using VoxProf.Core.Scenes.Layers;
using VoxProf.Core.Scenes.Meshes;

namespace VoxProf.Core.Scenes.Loading;

/// <summary>The layer kinds that read a file: mesh, heightmap and raw (typed samples or NRRD).</summary>
internal sealed partial class LayerReader
{
    /// <summary>Largest heightmap image file read (a PNG of the largest footprint is far smaller).</summary>
    public const long MaxImageBytes = 1L << 30;

    private MeshLayer ReadMesh(JsonObjectReader o, LayerOp op, byte material)
    {
        (JsonValue fileValue, string file, string full) = FilePath(o, "a mesh file path");
        string? format = o.Optional("format") is { } f ? f.Choice(MeshFiles.Formats) : MeshFiles.FormatOf(file);
        if (format is null)
        {
            throw fileValue.Error($"no known mesh extension on {file}; expected .obj, .stl, .ply, .gltf or .glb, "
                + "or a \"format\" key naming one of: " + string.Join(", ", MeshFiles.Formats));
        }
        JsonValue? fillValue = o.Optional("fill");
        MeshFill fill = (fillValue?.Choice("surface", "solid") ?? "surface") == "surface" ? MeshFill.Surface : MeshFill.Solid;
        MeshPlacement placement = ReadPlacement(o);
        RequireFile(fileValue, full, "mesh file");

        TriangleMesh mesh = MeshFiles.Read(full, format, sceneDirectory, hash, confineFiles);
        InsideRule rule = InsideRule.None;
        if (fill == MeshFill.Solid)
        {
            (rule, long open) = MeshTopology.Analyse(mesh.Indices);
            if (open > 0)
            {
                throw fillValue!.Value.Error(string.Create(CultureInfo.InvariantCulture,
                    $"{file} is not closed: {open} edges belong to an odd number of triangles; expected a closed mesh for \"solid\", or use \"fill\": \"surface\""));
            }
        }
        int zeroArea = mesh.DropZeroArea();
        int bad = placement.Apply(mesh.Positions, mesh.Indices, mesh.VertexCount);
        if (bad >= 0)
        {
            JsonValue at = o.Optional("fit") ?? o.Optional("scale") ?? o.Optional("offset") ?? fileValue;
            throw at.Error(string.Create(CultureInfo.InvariantCulture,
                $"vertex {bad} of {file} lands outside ±{MeshPlacement.MaxCoordinate:0e0} voxels; expected a placement that keeps the mesh near the scene"));
        }
        return new MeshLayer(op, material, mesh.Positions, mesh.Indices, fill, rule, extent) { ZeroAreaTriangles = zeroArea };
    }

    private static MeshPlacement ReadPlacement(JsonObjectReader o)
    {
        double[] scale = [1, 1, 1], offset = [0, 0, 0], rotate = [0, 0, 0], fitOrigin = [0, 0, 0];
        double? fitSize = null;
        if (o.Optional("scale") is { } s)
        {
            const string What = "a scale: a number or [sx, sy, sz], none of them 0";
            scale = s.Element.ValueKind == System.Text.Json.JsonValueKind.Number ? [s.Number(What), 0, 0] : s.Numbers(What, 3);
            if (s.Element.ValueKind == System.Text.Json.JsonValueKind.Number)
                scale[1] = scale[2] = scale[0];
            if (scale.Any(v => v == 0))
                throw s.Error("a scale of 0 flattens the mesh; expected " + What);
        }
        if (o.Optional("offset") is { } off)
            offset = off.Numbers("[x, y, z] offset in voxels", 3);
        if (o.Optional("rotate") is { } rot)
            rotate = rot.Numbers("[rx, ry, rz] rotation in degrees", 3);
        bool upZ = (o.Optional("up")?.Choice("y", "z") ?? "y") == "z";
        if (o.Optional("fit") is { } fit)
        {
            if (o.Has("scale") || o.Has("offset"))
                throw fit.Error("fit sets the scale and the offset itself; expected either \"fit\" or \"scale\"/\"offset\", not both");
            JsonObjectReader r = fit.AsObject("an object with \"size\" and \"origin\"");
            r.AllowOnly("in a fit", "size", "origin");
            fitSize = r.Required("size", "the largest side in voxels").Number("the largest side in voxels, > 0", 0, Scene.MaxExtent, exclusiveMin: true);
            fitOrigin = r.Required("origin", "[x, y, z] voxel of the low corner").Numbers("[x, y, z] voxel of the low corner", 3);
        }
        return new MeshPlacement { Scale = scale, Offset = offset, RotateDegrees = rotate, UpZ = upZ, FitSize = fitSize, FitOrigin = fitOrigin };
    }

    private HeightmapLayer ReadHeightmap(JsonObjectReader o, LayerOp op, byte material)
    {
        (JsonValue fileValue, string file, string full) = FilePath(o, "a greyscale PNG path");
        int[] origin = o.Optional("origin") is { } ov ? Origin(ov, "[x, y, z] voxel of the image's first pixel and of the columns' base") : [0, 0, 0];
        int cell = o.Optional("cellSize")?.Int($"an integer from 1 to {Scene.MaxExtent.ToString(CultureInfo.InvariantCulture)}", 1, Scene.MaxExtent) ?? 1;
        double[] height = o.Required("height", "[low, high] heights in voxels for black and white").Numbers("[low, high] heights in voxels for black and white", 2);
        RequireFile(fileValue, full, "heightmap file");
        byte[] bytes = SceneLoader.ReadFile(sceneFile, full, fileValue.Path, "heightmap file", MaxImageBytes);
        hash.AppendData(bytes);
        PngHeights png = PngHeights.Read(bytes, full, LayerReader.MaxTerrainColumns);
        long columns = new Box3i(origin[0], 0, origin[2], (int)Math.Min(origin[0] + (long)png.Width * cell, int.MaxValue), 1,
            (int)Math.Min(origin[2] + (long)png.Height * cell, int.MaxValue)).Intersect(extent with { MinY = 0, MaxY = 1 }).Volume;
        if (columns > MaxTerrainColumns)
        {
            throw o.Error(string.Create(CultureInfo.InvariantCulture,
                $"the heightmap covers {columns} columns of the scene; expected at most {MaxTerrainColumns} (a smaller cellSize or image)"));
        }
        return new HeightmapLayer(op, material, png.Values, png.Width, png.Height, png.MaxValue, origin[0], origin[1], origin[2],
            cell, height[0], height[1], extent);
    }

    private RawLayer ReadRaw(JsonObjectReader o, LayerOp op, byte material)
    {
        (JsonValue fileValue, string file, string full) = FilePath(o, "a raw volume file path");
        int[] origin = o.Optional("origin") is { } ov ? Origin(ov, "[x, y, z] voxel where the volume starts") : [0, 0, 0];
        double threshold = o.Optional("threshold")?.Number("a threshold (a voxel is solid when its value is above it)") ?? 0;
        if (file.EndsWith(".nrrd", StringComparison.OrdinalIgnoreCase))
        {
            foreach (string key in (string[])["size", "type", "endian"])
            {
                if (o.Optional(key) is { } given)
                    throw given.Error($"an NRRD file states its own {key} in its header; remove the key");
            }
            RequireFile(fileValue, full, "raw volume file");
            return ReadNrrd(full, threshold, origin, op, material);
        }

        JsonValue sizeValue = o.Required("size", "[x, y, z] dimensions of the raw volume");
        int[] size = sizeValue.Ints("[x, y, z] dimensions of the raw volume", 3, 1, Scene.MaxExtent,
            $"an integer from 1 to {Scene.MaxExtent.ToString(CultureInfo.InvariantCulture)}");
        long voxels = (long)size[0] * size[1] * size[2];
        if (voxels > RawLayer.MaxVoxels)
            throw sizeValue.Error($"volume too large; expected at most {RawLayer.MaxVoxels.ToString(CultureInfo.InvariantCulture)} voxels");
        VoxelType type = (o.Optional("type")?.Choice("u8", "u16", "f32") ?? "u8") switch
        {
            "u8" => VoxelType.U8,
            "u16" => VoxelType.U16,
            _ => VoxelType.F32,
        };
        bool big = (o.Optional("endian")?.Choice("little", "big") ?? "little") == "big";
        int bytesEach = VolumeFiles.SizeOf(type);
        // Check the length before reading, so a wrong multi-gigabyte file is refused without loading it.
        RequireFile(fileValue, full, "raw volume file");
        long length = new FileInfo(full).Length;
        if (length != voxels * bytesEach)
        {
            string each = bytesEach == 1 ? "" : string.Create(CultureInfo.InvariantCulture, $", {bytesEach} bytes each");
            throw fileValue.Error(string.Create(CultureInfo.InvariantCulture,
                $"raw volume file {file} holds {length} bytes; expected {voxels * bytesEach} ({size[0]} × {size[1]} × {size[2]} from {sizeValue.Path}{each})"));
        }
        using var stream = new HashingStream(OpenRead(full, fileValue), hash);
        ulong[] mask = VolumeFiles.ReadMask(stream, voxels, type, big, threshold, full, 0);
        stream.Drain();
        return new RawLayer(op, material, mask, size[0], size[1], size[2], origin[0], origin[1], origin[2], extent);
    }

    private RawLayer ReadNrrd(string full, double threshold, int[] origin, LayerOp op, byte material)
    {
        long length = new FileInfo(full).Length;
        using var stream = new HashingStream(new FileStream(full, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 16), hash);
        var lines = new TextLines(stream, full);
        NrrdHeader header = NrrdHeader.Read(lines);
        int[] size = header.Sizes;
        long voxels = (long)size[0] * size[1] * size[2];
        if (voxels > RawLayer.MaxVoxels)
        {
            throw new SceneFormatException(full, "header", string.Create(CultureInfo.InvariantCulture,
                $"sizes {size[0]} × {size[1]} × {size[2]} make {voxels} voxels; expected at most {RawLayer.MaxVoxels}"));
        }
        long dataBytes = voxels * VolumeFiles.SizeOf(header.Type);
        if (!header.Gzip && length - header.Length != dataBytes)
        {
            throw new SceneFormatException(full, FilePlace.Offset(header.Length), string.Create(CultureInfo.InvariantCulture,
                $"raw data holds {length - header.Length} bytes; expected {dataBytes} ({size[0]} × {size[1]} × {size[2]} samples of {VolumeFiles.SizeOf(header.Type)} bytes)"));
        }
        Stream data = new PrefixedStream(lines.Leftover, stream);
        ulong[] mask;
        try
        {
            if (header.Gzip)
                data = new GZipStream(data, CompressionMode.Decompress);
            mask = VolumeFiles.ReadMask(data, voxels, header.Type, header.BigEndian, threshold, full, header.Length);
        }
        catch (InvalidDataException ex)
        {
            throw new SceneFormatException(full, FilePlace.Offset(header.Length), "gzip data is corrupt (" + ex.Message + "); expected a gzip stream of the samples");
        }
        stream.Drain();
        return new RawLayer(op, material, mask, size[0], size[1], size[2], origin[0], origin[1], origin[2], extent);
    }

    /// <summary>
    /// The <c>file</c> key: relative to the scene file's folder (or absolute), resolved to its real path with every
    /// symbolic link followed, and with <see cref="SceneLoadOptions.ConfineFiles"/> kept inside that folder.
    /// </summary>
    private (JsonValue Value, string File, string Full) FilePath(JsonObjectReader o, string what)
    {
        JsonValue value = o.Required("file", what);
        string file = value.String(what + " (relative to the scene file's folder)");
        if (file.Length == 0)
            throw value.Error($"empty; expected {what} relative to the scene file's folder");
        if (file.Contains('\0', StringComparison.Ordinal))
            throw value.Error($"contains a NUL character; expected {what} relative to the scene file's folder");
        string real;
        try
        {
            real = ScenePaths.Real(Path.Combine(sceneDirectory, file));
        }
        catch (IOException ex)
        {
            throw value.Error($"{MessageText.Excerpt(file)} cannot be resolved ({ex.Message}); expected {what}");
        }
        if (confineFiles)
        {
            string folder = ScenePaths.Real(sceneDirectory);
            if (!ScenePaths.IsInside(real, folder))
                throw value.Error($"{MessageText.Excerpt(file, 200)} resolves to {real}, outside the scene file's folder {folder}; files are confined to that folder");
        }
        return (value, file, real);
    }

    private static void RequireFile(JsonValue value, string full, string what)
    {
        if (Directory.Exists(full))
            throw value.Error($"{what} {full} is a folder; expected a file");
        if (!File.Exists(full))
            throw value.Error($"{what} not found: {full} (paths are relative to the scene file's folder)");
        // A device or a pipe reports no length: reading one could block or never end.
        if (new FileInfo(full).Length == 0)
            throw value.Error($"{what} {full} holds no bytes (an empty file, a device or a pipe); expected a {what}");
    }

    private Stream OpenRead(string full, JsonValue where)
    {
        try
        {
            return new FileStream(full, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 16);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            throw new SceneFormatException(sceneFile, where.Path, $"cannot be read: {full} ({ex.Message})");
        }
    }

    private static int[] Origin(JsonValue value, string what) =>
        value.Ints(what, 3, -Scene.MaxExtent, Scene.MaxExtent,
            $"an integer from {(-Scene.MaxExtent).ToString(CultureInfo.InvariantCulture)} to {Scene.MaxExtent.ToString(CultureInfo.InvariantCulture)}");
}
