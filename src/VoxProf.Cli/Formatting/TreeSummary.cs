using System.Globalization;
using System.Text;
using System.Text.Json;
using VoxProf.Core.Scenes;
using VoxProf.Core.Trees;

namespace VoxProf.Cli.Formatting;

/// <summary>What <c>voxprof inspect</c> prints about a built tree, as text or JSON.</summary>
internal static class TreeSummary
{
    private static readonly JsonSerializerOptions JsonOptions = new()
    {
        PropertyNamingPolicy = JsonNamingPolicy.CamelCase,
        WriteIndented = true,
    };

    public static string Text(Scene scene, BrickTree tree)
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
        return sb.ToString();
    }

    public static string Json(Scene scene, BrickTree tree)
    {
        TreeStats s = tree.Stats;
        var levels = new LevelSummary[s.Depth];
        for (int level = 0; level < s.Depth; level++)
        {
            levels[level] = new LevelSummary(level, CellSide(tree, level), s.NodesPerLevel[level],
                s.SolidCellsPerLevel[level], s.BytesPerLevel[level]);
        }
        var doc = new InspectSummary(scene.Name, [scene.ExtentX, scene.ExtentY, scene.ExtentZ], s.Branching, s.Depth,
            s.RootSize, levels, s.NodeCount, s.SolidCellsPerLevel.Sum(), s.SolidVoxels, s.TotalBytes,
            Math.Round(s.BytesPerSolidVoxel, 4), Math.Round(s.BuildTime.TotalMilliseconds, 1));
        return JsonSerializer.Serialize(doc, JsonOptions) + Environment.NewLine;
    }

    private static int CellSide(BrickTree tree, int level) => 1 << tree.CellShift(level);

    private sealed record LevelSummary(int Level, int CellSide, long Nodes, long SolidCells, long Bytes);

    private sealed record InspectSummary(string Scene, int[] Extent, int Branching, int Depth, int RootSide,
        LevelSummary[] Levels, long Nodes, long SolidCells, long SolidVoxels, long TotalBytes,
        double BytesPerSolidVoxel, double BuildMilliseconds);
}
