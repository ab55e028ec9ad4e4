using System.Globalization;
using System.Numerics;
using System.Text;
using System.Text.Json;
using System.Text.Json.Serialization;
using VoxProf.Core.Scenes;
using VoxProf.Core.Trees;

namespace VoxProf.Cli.Formatting;

/// <summary>What <c>voxprof inspect</c> prints about a scene and its built tree, as text or JSON.</summary>
internal static partial class TreeSummary
{
    private static readonly JsonSerializerOptions JsonOptions = new()
    {
        PropertyNamingPolicy = JsonNamingPolicy.CamelCase,
        WriteIndented = true,
        TypeInfoResolver = SummaryJson.Default,
    };

    /// <param name="census">One tally per layer of <paramref name="scene"/>, in order.</param>
    public static string Text(Scene scene, BrickTree tree, IReadOnlyList<LayerTally> census)
    {
        TreeStats s = tree.Stats;
        CultureInfo ic = CultureInfo.InvariantCulture;
        var sb = new StringBuilder();
        sb.AppendLine(ic, $"scene                  {scene.Name}");
        sb.AppendLine(ic, $"extent                 {scene.ExtentX} x {scene.ExtentY} x {scene.ExtentZ} voxels");
        sb.AppendLine(ic, $"tree                   branching {s.Branching}, depth {s.Depth}, root side {s.RootSize}");
        sb.AppendLine();
        sb.AppendLine(ic, $"{"level",5}  {"cell side",9}  {"nodes",12}  {"solid cells",12}  {"bytes",14}");
        for (int level = 0; level < s.Depth; level++)
        {
            sb.AppendLine(ic, $"{level,5}  {CellSide(tree, level),9}  {s.NodesPerLevel[level],12}  " +
                $"{s.SolidCellsPerLevel[level],12}  {s.BytesPerLevel[level],14}");
        }
        sb.AppendLine(ic, $"{"total",5}  {"",9}  {s.NodeCount,12}  {s.SolidCellsPerLevel.Sum(),12}  {s.TotalBytes,14}");
        sb.AppendLine();
        sb.AppendLine(ic, $"solid voxels           {s.SolidVoxels}");
        sb.AppendLine(ic, $"bytes per solid voxel  {s.BytesPerSolidVoxel:0.0000}");
        sb.AppendLine(ic, $"build time             {s.BuildTime.TotalMilliseconds:0.0} ms");
        sb.AppendLine(ic, $"voxelise time          {census.Sum(c => c.Voxelise.TotalMilliseconds):0.0} ms (time in the layers' Classify and Fill, summed over threads)");
        sb.AppendLine(ic, $"load time              {scene.Layers.Sum(l => l.LoadTime.TotalMilliseconds):0.0} ms (reading and preparing the layers)");
        sb.AppendLine();
        sb.AppendLine(ic, $"{"layer",5}  {"kind",-9}  {"label",-24}  {"file",-20}  {"op",-5}  {"voxels",14}  {"load ms",9}  {"voxelise ms",11}  details");
        for (int i = 0; i < scene.Layers.Count; i++)
        {
            Layer l = scene.Layers[i];
            string row = string.Create(ic, $"{i,5}  {l.Kind,-9}  {Cut(l.Label, 24),-24}  {Cut(l.File, 20),-20}  " +
                $"{(l.Op == LayerOp.Add ? "add" : "carve"),-5}  {census[i].Voxels,14}  {l.LoadTime.TotalMilliseconds,9:0.0}  " +
                $"{census[i].Voxelise.TotalMilliseconds,11:0.0}  {l.Details}");
            sb.AppendLine(row.TrimEnd());
        }
        sb.AppendLine();
        sb.AppendLine(ic, $"{"camera",-16}  {"eye",-22}  {"target",-22}  {"up",-16}  fovY");
        foreach (CameraSpec c in scene.Cameras)
            sb.AppendLine(ic, $"{Cut(c.Name, 16),-16}  {Point(c.Eye),-22}  {Point(c.Target),-22}  {Point(c.Up),-16}  {c.FovYDegrees:0.##}");
        foreach (VoxProf.Core.Scenes.Paths.CameraPath p in scene.Paths)
        {
            string how = p.Interpolation == VoxProf.Core.Scenes.Paths.PathInterpolation.Linear ? "linear" : "catmull-rom";
            sb.AppendLine(ic, $"{Cut(p.Name, 16),-16}  path: {p.Frames} frames {p.FrameName(0)}…{p.FrameName(p.Frames - 1)} through {p.Keys.Count} keys ({how})");
        }
        return sb.ToString();
    }

    public static string Json(Scene scene, BrickTree tree, IReadOnlyList<LayerTally> census)
    {
        TreeStats s = tree.Stats;
        var levels = new LevelSummary[s.Depth];
        for (int level = 0; level < s.Depth; level++)
        {
            levels[level] = new LevelSummary(level, CellSide(tree, level), s.NodesPerLevel[level],
                s.SolidCellsPerLevel[level], s.BytesPerLevel[level]);
        }
        LayerSummary[] layers = [.. scene.Layers.Select((l, i) => new LayerSummary(i, l.Kind, l.Label, l.File,
            l.Op == LayerOp.Add ? "add" : "carve", l.Material, census[i].Voxels, Ms(l.LoadTime), Ms(census[i].Voxelise), l.Details))];
        CameraSummary[] cameras = [.. scene.Cameras.Select(c => new CameraSummary(c.Name, Array(c.Eye), Array(c.Target),
            Array(c.Up), c.FovYDegrees))];
        var doc = new InspectSummary(scene.Name, [scene.ExtentX, scene.ExtentY, scene.ExtentZ], s.Branching, s.Depth,
            s.RootSize, levels, s.NodeCount, s.SolidCellsPerLevel.Sum(), s.SolidVoxels, s.TotalBytes,
            Math.Round(s.BytesPerSolidVoxel, 4), Ms(s.BuildTime), Math.Round(census.Sum(c => c.Voxelise.TotalMilliseconds), 1),
            Math.Round(scene.Layers.Sum(l => l.LoadTime.TotalMilliseconds), 1), layers, cameras);
        return JsonSerializer.Serialize(doc, JsonOptions) + Environment.NewLine;
    }

    private static double Ms(TimeSpan t) => Math.Round(t.TotalMilliseconds, 1);

    private static float[] Array(Vector3 v) => [v.X, v.Y, v.Z];

    private static string Point(Vector3 v) => string.Create(CultureInfo.InvariantCulture, $"{v.X:0.##}, {v.Y:0.##}, {v.Z:0.##}");

    private static string Cut(string? s, int width) => s is null ? "-" : s.Length <= width ? s : s[..(width - 1)] + "~";

    private static int CellSide(BrickTree tree, int level) => 1 << tree.CellShift(level);

    private sealed record LevelSummary(int Level, int CellSide, long Nodes, long SolidCells, long Bytes);

    private sealed record LayerSummary(int Index, string Kind, string? Label, string? File, string Op, int Material, long Voxels,
        double LoadMilliseconds, double VoxeliseMilliseconds, string? Details);

    private sealed record CameraSummary(string Name, float[] Eye, float[] Target, float[] Up, float FovY);

    private sealed record InspectSummary(string Scene, int[] Extent, int Branching, int Depth, int RootSide,
        LevelSummary[] Levels, long Nodes, long SolidCells, long SolidVoxels, long TotalBytes,
        double BytesPerSolidVoxel, double BuildMilliseconds, double VoxeliseMilliseconds, double LoadMilliseconds,
        LayerSummary[] Layers, CameraSummary[] Cameras);

    // Generated at build time, as the reports' contracts are (VoxProf.Reports' DocumentJson): no reflection per run.
    [JsonSerializable(typeof(InspectSummary))]
    private sealed partial class SummaryJson : JsonSerializerContext;
}
