using System.Buffers;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;
using VoxProf.Core.Calibration;
using VoxProf.Core.Statistics;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Images;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Export;

/// <summary>heatmap-STRATEGY-MAP.png: every strategy of one map on one shared scale, so images compare by eye.</summary>
public sealed class HeatmapExporter : IReportExporter
{
    public string Name => "heatmaps";

    public void Export(ReportContext context, OutputDirectory output)
    {
        var run = context.Run;
        CostModel? calibration = context.Options.Calibration?.Model;
        var jobs = new List<(StrategyResult Result, string Map, HeatmapScale Scale)>();
        foreach (string map in context.Options.Heatmaps)
        {
            foreach (StrategyResult r in run.Results.Where(r => HeatmapNames.AppliesTo(map, r.Strategy)))
                jobs.Add((r, map, ScaleFor(map, context, r)));
        }
        Parallel.ForEach(jobs, job =>
        {
            string strategy = job.Result.Strategy.Name;
            var title = new ImageTitle(
                [context.Run.Scene.Name, context.Run.Camera.Name, strategy, job.Map],
                [UnitOf(job.Map), $"{job.Result.Width}×{job.Result.Height}"]);
            StrategyResult r = job.Result;
            // A lockstep-group map is expanded to one value a pixel for drawing only, into a pooled buffer: a fresh
            // array per map and strategy was about a seventh of the README command's page faults.
            uint[]? tiles = TileValues(r, job.Map, out SubgroupShape shape);
            uint[]? rented = tiles is null ? null : ArrayPool<uint>.Shared.Rent(r.Width * r.Height);
            try
            {
                ReadOnlySpan<uint> values = rented is null ? Values(r, job.Map, calibration) : Expand(tiles!, r, shape, rented.AsSpan(0, r.Width * r.Height));
                using Image<Rgba32> image = HeatmapImage.Render(values, r.Width, r.Height, job.Scale, title);
                Png.AddText(image, "Strategy", strategy);
                Png.AddText(image, "Counter", job.Map);
                Png.AddText(image, "Scale", FormattableString.Invariant($"{(job.Scale.Kind == ScaleKind.Log ? "log" : "linear")} {job.Scale.Min}..{job.Scale.Max}"));
                Png.AddText(image, "Software", $"VoxProf {context.Options.ToolVersion}");
                output.Write(OutputNames.Heatmap(strategy, job.Map), s => Png.Save(image, s));
            }
            finally
            {
                if (rented is not null)
                    ArrayPool<uint>.Shared.Return(rented);
            }
        });
    }

    /// <summary>What one pixel of a map counts: "iterations per pixel", or for a lockstep-group map the tile maximum.</summary>
    public static string UnitOf(string map)
    {
        if (map == HeatmapNames.PredictedCost)
            return "predicted GPU time per pixel, picoseconds";
        if (HeatmapNames.IsSubgroup(map, out SubgroupShape shape))
            return $"{Counter.Iterations.Name()} per pixel: the largest in its {shape.TileWidth}×{shape.TileHeight} tile ({shape.Lanes} lanes)";
        if (HeatmapNames.IsGroupLines(map, out shape))
            return $"distinct cache lines its {shape.TileWidth}×{shape.TileHeight} tile ({shape.Lanes} lanes) touched, per pixel";
        if (!CounterNames.TryParse(map, out Counter c))
            return $"{map} per pixel";
        return c.Unit() == "count" ? $"{c.Name()} per pixel" : $"{c.Unit()} per pixel ({c.Name()})";
    }

    /// <summary>
    /// The fixed range if given, else 0 to the largest 99th percentile of the map over the strategies that share a
    /// scale, rounded up to a whole count: a handful of extreme pixels would otherwise darken every image; the few
    /// above it take the top colour.
    /// The tree strategies share one scale so they compare by eye; the grid reference, whose cost is one to two orders
    /// of magnitude higher, gets a scale of its own whenever another strategy is traced beside it (its legend says so).
    /// </summary>
    public static HeatmapScale ScaleFor(string map, ReportContext context, StrategyResult result)
    {
        var o = context.Options;
        if (o.RangeMin is { } min && o.RangeMax is { } max)
            return new HeatmapScale(o.Scale, min, max);
        bool ownScale = result.Strategy == BuiltInStrategies.Grid && context.Run.Results.Count > 1;
        double top = 0;
        foreach (StrategyResult r in context.Run.Results)
        {
            bool shares = ownScale ? r.Strategy == BuiltInStrategies.Grid : r.Strategy != BuiltInStrategies.Grid || context.Run.Results.Count == 1;
            if (shares && HeatmapNames.AppliesTo(map, r.Strategy))
                top = Math.Max(top, Top(r, map, o.Calibration?.Model));
        }
        return HeatmapScale.Auto(o.Scale, Math.Ceiling(top));
    }

    /// <summary>The 99th percentile (definition 7) of the map's values, or their maximum when that is 0.</summary>
    public static double Top(StrategyResult r, string map, CostModel? calibration = null)
    {
        CounterSummary s;
        if (map == HeatmapNames.PredictedCost)
        {
            s = CounterSummary.Compute(Values(r, map, calibration));
        }
        else if (HeatmapNames.IsSubgroup(map, out SubgroupShape shape))
        {
            var tiles = new uint[shape.TilesX(r.Width) * shape.TilesY(r.Height)];
            SubgroupModel.TileMax(r.Get(Counter.Iterations), r.Width, r.Height, shape, tiles);
            s = CounterSummary.Compute(tiles);
        }
        else if (HeatmapNames.IsGroupLines(map, out shape))
        {
            s = CounterSummary.Compute(GroupLines(r, map, shape));
        }
        else
        {
            s = CounterSummary.Compute(CounterValues(r, map));
        }
        return s.P99 > 0 ? s.P99 : s.Max;
    }

    /// <param name="calibration">Needed for <see cref="HeatmapNames.PredictedCost"/> only.</param>
    public static uint[] Values(StrategyResult r, string map, CostModel? calibration = null)
    {
        if (map == HeatmapNames.PredictedCost)
            return (calibration ?? throw new ArgumentException($"the {map} map needs a calibration", nameof(calibration))).PixelPicoseconds(r);
        if (TileValues(r, map, out SubgroupShape shape) is not { } tiles)
            return CounterValues(r, map);
        var pixels = new uint[r.Width * r.Height];
        Expand(tiles, r, shape, pixels);
        return pixels;
    }

    /// <summary>A lockstep-group map's value per group (its tile maximum or distinct lines), or null for a per-pixel map.</summary>
    private static uint[]? TileValues(StrategyResult r, string map, out SubgroupShape shape)
    {
        if (HeatmapNames.IsGroupLines(map, out shape))
            return GroupLines(r, map, shape);
        if (!HeatmapNames.IsSubgroup(map, out shape))
            return null;
        var tiles = new uint[shape.TilesX(r.Width) * shape.TilesY(r.Height)];
        SubgroupModel.TileMax(r.Get(Counter.Iterations), r.Width, r.Height, shape, tiles);
        return tiles;
    }

    private static ReadOnlySpan<uint> Expand(uint[] tiles, StrategyResult r, SubgroupShape shape, Span<uint> pixels)
    {
        SubgroupModel.ExpandTiles(tiles, r.Width, r.Height, shape, pixels);
        return pixels;
    }

    private static uint[] GroupLines(StrategyResult r, string map, SubgroupShape shape) =>
        r.Memory?.Of(shape)?.Lines ?? throw new ArgumentException($"the {map} map needs the memory model (trace without --memory off)", nameof(map));

    private static uint[] CounterValues(StrategyResult r, string map) =>
        r.Find(map) ?? throw new ArgumentException($"{r.Strategy.Name} has no counter {map}", nameof(map));
}

/// <summary>preview.png from the reference (grid) result, or the first strategy traced.</summary>
public sealed class PreviewExporter : IReportExporter
{
    public string Name => OutputNames.Preview;

    public void Export(ReportContext context, OutputDirectory output)
    {
        StrategyResult? source = context.Run.Reference ?? context.Run.Results.FirstOrDefault();
        if (source is null)
            return;
        var title = new ImageTitle(
            [context.Run.Scene.Name, context.Run.Camera.Name, $"preview ({source.Strategy.Name})"],
            ["material colours lit from above, shaded by the face the ray entered", $"{source.Width}×{source.Height}"]);
        using Image<Rgba32> image = PreviewImage.Render(source.Hits, source.Width, source.Height, title);
        Png.AddText(image, "Strategy", source.Strategy.Name);
        Png.AddText(image, "Software", $"VoxProf {context.Options.ToolVersion}");
        output.Write(OutputNames.Preview, s => Png.Save(image, s));
    }
}

/// <summary>mismatch-STRATEGY.png, only for a strategy with a pixel whose hit differs from the reference.</summary>
public sealed class MismatchExporter : IReportExporter
{
    public string Name => "mismatch images";

    public void Export(ReportContext context, OutputDirectory output)
    {
        StrategyResult? reference = context.Run.Reference;
        if (reference is null)
            return;
        foreach (StrategyStatistics s in context.Statistics)
        {
            if (s.MismatchPixels is not { } mismatched || mismatched == 0)
                continue;
            StrategyResult r = context.Run.Results.First(x => x.Strategy == s.Strategy);
            var title = new ImageTitle(
                [context.Run.Scene.Name, context.Run.Camera.Name, s.Strategy.Name],
                ["a hit differs when one ray hits and the other misses, or they hit different voxels", $"{r.Width}×{r.Height}"]);
            using Image<Rgba32> image = PreviewImage.RenderMismatch(r.Hits, reference.Hits, r.Width, r.Height, reference.Strategy.Name, title);
            Png.AddText(image, "Strategy", s.Strategy.Name);
            Png.AddText(image, "Reference", reference.Strategy.Name);
            Png.AddText(image, "Mismatched pixels", mismatched.ToString(System.Globalization.CultureInfo.InvariantCulture));
            output.Write(OutputNames.Mismatch(s.Strategy.Name), st => Png.Save(image, st));
        }
    }
}
