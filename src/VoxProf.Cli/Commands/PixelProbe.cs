using System.Globalization;
using VoxProf.Core;
using VoxProf.Core.Rays;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Tables;

namespace VoxProf.Cli.Commands;

/// <summary>
/// trace --pixel X,Y: one pixel's ray through every strategy, printed, nothing written. For following one ray through
/// a strategy of one's own: its console output then comes from that ray alone, and the numbers beside it are the ones
/// a whole trace gives that pixel (the counts of one ray do not depend on the others).
/// </summary>
internal static class PixelProbe
{
    public static (int X, int Y) Parse(string text, int width, int height)
    {
        string[] parts = text.Split(',');
        if (parts.Length == 2
            && int.TryParse(parts[0].Trim(), NumberStyles.None, CultureInfo.InvariantCulture, out int x)
            && int.TryParse(parts[1].Trim(), NumberStyles.None, CultureInfo.InvariantCulture, out int y)
            && x < width && y < height)
            return (x, y);
        throw new InputException(string.Create(CultureInfo.InvariantCulture,
            $"--pixel: '{MessageText.Excerpt(text)}' is not valid, expected X,Y inside the {width}×{height} image (0,0 to {width - 1},{height - 1})"));
    }

    public static int Run(TextWriter output, TracePipeline pipeline, TraceRequest request)
    {
        TraceRun run = pipeline.Trace(request, null);
        Write(output, run, request.Pixel!.Value);
        return ExitCodes.Ok;
    }

    /// <summary>The ray, then a column per strategy: its hit, then every counter some strategy made non-zero there.</summary>
    internal static void Write(TextWriter output, TraceRun run, (int X, int Y) pixel)
    {
        var inv = CultureInfo.InvariantCulture;
        int width = run.Settings.Width, height = run.Settings.Height;
        int at = pixel.Y * width + pixel.X;
        RaySetup ray = new Camera(run.Camera, width, height).Ray(pixel.X, pixel.Y);
        output.WriteLine(string.Create(inv, $"pixel ({pixel.X}, {pixel.Y}) of {width}×{height}, {run.Scene.Name} / {run.Camera.Name}"));
        output.WriteLine(string.Create(inv, $"ray from ({ray.Ox:G9}, {ray.Oy:G9}, {ray.Oz:G9}) along ({ray.Dx:G9}, {ray.Dy:G9}, {ray.Dz:G9})"));
        output.WriteLine();

        var rows = new List<string[]>();
        void Row(string label, Func<StrategyResult, string> cell) => rows.Add([label, .. run.Results.Select(cell)]);
        Row("", r => r.Strategy.Name);
        Row("hit", r => r.Hits[at] is { Hit: true } h ? string.Create(inv, $"({h.X}, {h.Y}, {h.Z})") : "miss");
        Row("entered", r => r.Hits[at] is { Hit: true } h ? MismatchLines.Face(h) : "");
        Row("t", r => r.Hits[at] is { Hit: true } h ? h.T.ToString("G9", inv) : "");
        Row("material", r => r.Hits[at] is { Hit: true } h ? h.Material.ToString(inv) : "");
        IEnumerable<string> counters = run.Results.SelectMany(r => r.CounterNames).Distinct(StringComparer.OrdinalIgnoreCase)
            .Where(name => name == "iterations" || run.Results.Any(r => r.Find(name) is { } values && values[at] != 0));
        foreach (string name in counters)
            Row(name, r => r.Find(name) is { } values ? values[at].ToString(inv) : "-");
        if (run.Reference is { } grid)
            Row("same hit as grid", r => r.Hits[at].SameVoxel(grid.Hits[at]) ? "yes" : "NO");

        int[] widths = Enumerable.Range(0, rows[0].Length).Select(c => rows.Max(row => row[c].Length)).ToArray();
        foreach (string[] row in rows)
            output.WriteLine(string.Join("  ", row.Select((cell, c) => c == 0 ? cell.PadRight(widths[c]) : cell.PadLeft(widths[c]))).TrimEnd());
    }
}
