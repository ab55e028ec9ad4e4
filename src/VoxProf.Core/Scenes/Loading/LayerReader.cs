using System.Diagnostics;
using System.Globalization;
using System.Security.Cryptography;
using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes.Layers;

namespace VoxProf.Core.Scenes.Loading;

/// <summary>Turns one entry of <c>"layers"</c> into a <see cref="Layer"/>, checking every key.</summary>
internal sealed partial class LayerReader(string sceneFile, string sceneDirectory, Box3i extent, IncrementalHash hash,
    bool confineFiles = false)
{
    public static readonly string[] Kinds = ["box", "sphere", "cylinder", "terrain", "caves", "scatter", "raw", "mesh", "heightmap"];

    /// <summary>Largest terrain footprint in columns (the heights are kept in one array).</summary>
    public const long MaxTerrainColumns = 1L << 30;

    private static readonly string[] Common = ["kind", "op", "material", "label"];

    public Layer Read(JsonValue value)
    {
        long start = Stopwatch.GetTimestamp();
        JsonObjectReader o = value.AsObject("an object holding a layer");
        string kind = o.Required("kind", "a layer kind: " + string.Join(", ", Kinds)).Choice(Kinds);
        o.AllowOnly($"for a {kind} layer", [.. Common, .. KeysOf(kind)]);
        string? label = o.Optional("label")?.String();
        var op = (o.Optional("op")?.Choice("add", "carve") ?? "add") == "add" ? LayerOp.Add : LayerOp.Carve;
        byte material = 0;
        if (op == LayerOp.Add)
            material = (byte)o.Required("material", "a material from 1 to 255").Int("a material from 1 to 255", 1, 255);
        else if (o.Optional("material") is { } m)
            throw m.Error("a carve layer takes no material; remove the key or use \"op\": \"add\"");

        Layer layer = kind switch
        {
            "box" => ReadBox(o, op, material),
            "sphere" => ReadSphere(o, op, material),
            "cylinder" => ReadCylinder(o, op, material),
            "terrain" => ReadTerrain(o, op, material),
            "caves" => ReadCaves(o, op, material),
            "scatter" => ReadScatter(o, op, material),
            "mesh" => ReadMesh(o, op, material),
            "heightmap" => ReadHeightmap(o, op, material),
            _ => ReadRaw(o, op, material),
        };
        layer.Label = label;
        layer.File = o.Optional("file")?.String();
        layer.LoadTime = Stopwatch.GetElapsedTime(start);
        return layer;
    }

    /// <summary>Keys each kind takes besides kind, op, material and label.</summary>
    public static string[] KeysOf(string kind) => kind switch
    {
        "box" => ["min", "max"],
        "sphere" => ["center", "radius"],
        "cylinder" => ["axis", "base", "radius", "length"],
        "terrain" => ["seed", "octaves", "frequency", "amplitude", "baseHeight", "gain", "lacunarity", "footprint"],
        "caves" => ["seed", "shape", "threshold", "octaves", "frequency", "verticalScale", "region"],
        "scatter" => ["seed", "count", "size", "region"],
        "mesh" => ["file", "format", "scale", "offset", "rotate", "fit", "up", "fill"],
        "heightmap" => ["file", "origin", "cellSize", "height"],
        _ => ["file", "size", "origin", "type", "endian", "threshold"],
    };

    private BoxLayer ReadBox(JsonObjectReader o, LayerOp op, byte material)
    {
        double[] min = o.Required("min", "[x, y, z] lower corner").Numbers("[x, y, z] lower corner", 3);
        JsonValue maxValue = o.Required("max", "[x, y, z] upper corner");
        double[] max = maxValue.Numbers("[x, y, z] upper corner", 3);
        for (int a = 0; a < 3; a++)
        {
            if (max[a] < min[a])
                throw maxValue.Error($"max[{a}] is below min[{a}]; expected max ≥ min on every axis");
        }
        var (x0, x1) = ShapeMath.CentresIn(min[0], max[0]);
        var (y0, y1) = ShapeMath.CentresIn(min[1], max[1]);
        var (z0, z1) = ShapeMath.CentresIn(min[2], max[2]);
        return new BoxLayer(op, material, new Box3i(x0, y0, z0, x1, y1, z1), extent);
    }

    private SphereLayer ReadSphere(JsonObjectReader o, LayerOp op, byte material)
    {
        var (cx, cy, cz) = Point(o, "center");
        return new SphereLayer(op, material, cx, cy, cz, Positive(o, "radius"), extent);
    }

    private CylinderLayer ReadCylinder(JsonObjectReader o, LayerOp op, byte material)
    {
        Axis axis = o.Required("axis", "\"x\", \"y\" or \"z\"").Choice("x", "y", "z") switch
        {
            "x" => Axis.X,
            "y" => Axis.Y,
            _ => Axis.Z,
        };
        var (bx, by, bz) = Point(o, "base");
        return new CylinderLayer(op, material, axis, bx, by, bz, Positive(o, "radius"), Positive(o, "length"), extent);
    }

    private TerrainLayer ReadTerrain(JsonObjectReader o, LayerOp op, byte material)
    {
        var settings = new TerrainSettings(
            Seed(o),
            OptionalInt(o, "octaves", 5, 1, 16),
            Positive(o, "frequency", max: 1),
            o.Required("amplitude", "a height range in voxels ≥ 0").Number("a height range in voxels ≥ 0", 0),
            o.Required("baseHeight", "a height in voxels").Number("a height in voxels"),
            OptionalNumber(o, "gain", 0.5, "a gain in (0, 1]", 0, 1, exclusiveMin: true),
            OptionalNumber(o, "lacunarity", 2.0, "a lacunarity from 1 to 8", 1, 8));
        Box3i footprint = extent;
        if (o.Optional("footprint") is { } f)
        {
            Box3i r = Region(f, 2);
            footprint = new Box3i(r.MinX, 0, r.MinY, r.MaxX, extent.MaxY, r.MaxY);
            if (footprint.Intersect(extent).Volume / Math.Max(1, extent.MaxY) > MaxTerrainColumns)
                throw f.Error($"footprint too large; expected at most {MaxTerrainColumns.ToString(CultureInfo.InvariantCulture)} columns");
        }
        else if ((long)extent.SizeX * extent.SizeZ > MaxTerrainColumns)
        {
            throw o.Error($"terrain over the whole extent is too large; give a footprint of at most {MaxTerrainColumns.ToString(CultureInfo.InvariantCulture)} columns");
        }
        return new TerrainLayer(op, material, settings, footprint, extent);
    }

    private CavesLayer ReadCaves(JsonObjectReader o, LayerOp op, byte material)
    {
        var shape = (o.Optional("shape")?.Choice("tunnels", "chambers") ?? "tunnels") == "tunnels"
            ? CaveShape.Tunnels
            : CaveShape.Chambers;
        var settings = new CaveSettings(
            Seed(o),
            shape,
            o.Required("threshold", "a noise threshold").Number("a noise threshold", -10, 10),
            OptionalInt(o, "octaves", 1, 1, 8),
            Positive(o, "frequency", max: 1),
            OptionalNumber(o, "verticalScale", 1.0, "a vertical scale > 0", 0, 100, exclusiveMin: true));
        Box3i region = o.Optional("region") is { } r ? Region(r, 3) : extent;
        return new CavesLayer(op, material, settings, region, extent);
    }

    private ScatterLayer ReadScatter(JsonObjectReader o, LayerOp op, byte material)
    {
        ulong seed = Seed(o);
        int count = o.Required("count", "a clump count").Int(
            $"a clump count from 0 to {ScatterLayer.MaxCount.ToString(CultureInfo.InvariantCulture)}", 0, ScatterLayer.MaxCount);
        int minSize = 1, maxSize = 1;
        if (o.Optional("size") is { } s)
        {
            string what = $"an integer from 1 to {ScatterLayer.MaxClumpSize.ToString(CultureInfo.InvariantCulture)}";
            int[] sizes = s.Ints("[smallest, largest] clump side in voxels", 2, 1, ScatterLayer.MaxClumpSize, what);
            (minSize, maxSize) = (sizes[0], sizes[1]);
            if (maxSize < minSize)
                throw s.Error("largest clump side is below the smallest; expected [smallest, largest]");
        }
        Box3i region = o.Optional("region") is { } r ? Region(r, 3) : extent;
        return new ScatterLayer(op, material, seed, count, minSize, maxSize, region, extent);
    }

    private static ulong Seed(JsonObjectReader o) =>
        o.Required("seed", "an integer seed").UInt64("an integer seed from 0 to 18446744073709551615");

    private static (double X, double Y, double Z) Point(JsonObjectReader o, string key)
    {
        double[] p = o.Required(key, "[x, y, z] point").Numbers("[x, y, z] point", 3);
        return (p[0], p[1], p[2]);
    }

    private static double Positive(JsonObjectReader o, string key, double max = JsonValue.MaxMagnitude)
    {
        string what = max < JsonValue.MaxMagnitude
            ? string.Create(CultureInfo.InvariantCulture, $"a number > 0 and at most {max}")
            : "a number > 0";
        return o.Required(key, what).Number(what, 0, max, exclusiveMin: true);
    }

    private static int OptionalInt(JsonObjectReader o, string key, int fallback, int min, int max) =>
        o.Optional(key)?.Int(string.Create(CultureInfo.InvariantCulture, $"an integer from {min} to {max}"), min, max)
        ?? fallback;

    private static double OptionalNumber(JsonObjectReader o, string key, double fallback, string what, double min,
        double max, bool exclusiveMin = false) =>
        o.Optional(key)?.Number(what, min, max, exclusiveMin) ?? fallback;

    /// <summary>A <c>{"min": [...], "max": [...]}</c> box of whole voxels (half-open), 2 or 3 coordinates.</summary>
    private static Box3i Region(JsonValue value, int dims)
    {
        JsonObjectReader r = value.AsObject("an object with \"min\" and \"max\"");
        r.AllowOnly("in a region", "min", "max");
        string names = dims == 2 ? "[x, z]" : "[x, y, z]";
        string item = string.Create(CultureInfo.InvariantCulture, $"an integer from 0 to {Scene.MaxExtent}");
        int[] min = r.Required("min", $"{names} first voxel").Ints($"{names} first voxel", dims, 0, Scene.MaxExtent, item);
        JsonValue maxValue = r.Required("max", $"{names} end voxel (exclusive)");
        int[] max = maxValue.Ints($"{names} end voxel (exclusive)", dims, 0, Scene.MaxExtent, item);
        for (int a = 0; a < dims; a++)
        {
            if (max[a] <= min[a])
                throw maxValue.Error($"max[{a}] is not above min[{a}]; expected a non-empty region (max > min)");
        }
        return dims == 2
            ? new Box3i(min[0], min[1], 0, max[0], max[1], 1)
            : new Box3i(min[0], min[1], min[2], max[0], max[1], max[2]);
    }
}
