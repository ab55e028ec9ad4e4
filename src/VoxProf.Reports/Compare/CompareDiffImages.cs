using System.Globalization;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;
using VoxProf.Core;
using VoxProf.Core.Statistics;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Export;
using VoxProf.Reports.Images;
using VoxProf.Reports.Model;
using VoxProf.Reports.Pixels;

namespace VoxProf.Reports.Compare;

/// <summary>What the difference heatmaps step wrote, and what it had to leave out.</summary>
public sealed record DiffImagesResult(IReadOnlyList<string> Written, IReadOnlyList<string> Notes);

/// <summary>
/// diff-STRATEGY-MAP.png for every strategy in both reports and every map both reports drew a heatmap of, from the
/// per-pixel data files beside each report.json. All strategies of one map share one symmetric scale, so the images
/// compare by eye, as the trace heatmaps do.
/// </summary>
public static class CompareDiffImages
{
    public static string FileName(string strategy, string map) => $"diff-{strategy}-{map}.png";

    /// <summary>
    /// Maps both reports drew (counter and subgroup names; not the memory model's group-line maps, which the pixel
    /// data does not hold); iterations for reports that list none.
    /// </summary>
    public static IReadOnlyList<string> Maps(ReportComparison cmp)
    {
        var b = cmp.Base.Document.Run.Heatmaps;
        var c = cmp.Candidate.Document.Run.Heatmaps;
        var both = b.Where(m => c.Contains(m, StringComparer.OrdinalIgnoreCase) && HeatmapNames.TryParse(m, out _)
            && !HeatmapNames.IsGroupLines(m, out _)).ToArray();
        return both.Length > 0 ? both : [Counter.Iterations.Name()];
    }

    public static DiffImagesResult Write(ReportComparison cmp, OutputDirectory output, string toolVersion)
    {
        var maps = Maps(cmp);
        var counters = CountersOf(maps);
        var notes = new List<string>();
        var jobs = new List<Job>();
        (LoadedReport Report, List<string> Strategies)[] missing = [(cmp.Base, []), (cmp.Candidate, [])];
        foreach (var strategy in cmp.Strategies)
        {
            // The two files side by side: inflating one is a single core's work (a 2560×1440 file holds 260 MB).
            var pixels = new PixelData?[2];
            SideBySide.For(2, i => pixels[i] = i == 0
                ? Load(cmp.Base, cmp.BaseName(strategy), counters, missing[0].Strategies)
                : Load(cmp.Candidate, cmp.CandidateName(strategy), counters, missing[1].Strategies));
            var (basePixels, candidatePixels) = (pixels[0], pixels[1]);
            if (basePixels is null || candidatePixels is null)
                continue;

            var changed = new bool[basePixels.Width * basePixels.Height];
            var hitChanges = PixelDiff.HitChanged(basePixels.Hits, candidatePixels.Hits, changed);
            if (hitChanges > 0)
                notes.Add(string.Create(CultureInfo.InvariantCulture, $"{strategy}: {hitChanges} pixels hit a different voxel or changed between hit and miss (checkered in its difference heatmaps)"));
            foreach (var map in maps)
            {
                var a = Values(basePixels, map);
                var b = Values(candidatePixels, map);
                if (a is null || b is null)
                {
                    notes.Add($"{strategy}: no per-pixel {map} in {(a is null ? "base" : "candidate")}; its difference heatmap is left out");
                    continue;
                }
                var diff = new long[a.Length];
                jobs.Add(new Job(strategy, map, diff, changed, PixelDiff.Subtract(a, b, diff), basePixels.Width, basePixels.Height));
            }
        }

        foreach (var (report, strategies) in missing.Where(m => m.Strategies.Count > 0))
        {
            notes.Insert(0, $"no per-pixel data in {report.Directory} for {string.Join(", ", strategies)} " +
                $"(files {OutputNames.PixelData("STRATEGY")}): their difference heatmaps are left out");
        }

        var ranges = jobs.GroupBy(j => j.Map).ToDictionary(g => g.Key, g => g.Max(j => DiffHeatmap.RobustRange(j.Diff)));
        // The images side by side (each is drawn and encoded on one core); the list keeps the jobs' order.
        SideBySide.For(jobs.Count, i => WriteImage(cmp, output, toolVersion, jobs, ranges, jobs[i]));
        return new DiffImagesResult([.. jobs.Select(j => FileName(j.Strategy, j.Map))], notes);
    }

    private static void WriteImage(ReportComparison cmp, OutputDirectory output, string toolVersion, List<Job> jobs,
        Dictionary<string, double> ranges, Job job)
    {
        var maxAbs = ranges[job.Map];
        int sharing = jobs.Count(j => j.Map == job.Map);
        string rangeNote = sharing > 1 ? $"99th percentile of |difference|, the largest of {sharing} strategies" : "99th percentile of |difference|";
        using Image<Rgba32> image = DiffHeatmap.Render(job.Diff, job.HitChanged, job.Width, job.Height, maxAbs, rangeNote, Title(cmp, job));
        Png.AddText(image, "Strategy", job.Strategy);
        Png.AddText(image, "Counter", job.Map);
        Png.AddText(image, "Difference", "candidate minus base");
        Png.AddText(image, "Scale", string.Create(CultureInfo.InvariantCulture, $"linear {-maxAbs}..{maxAbs}"));
        Png.AddText(image, "Software", $"VoxProf {toolVersion}");
        output.Write(FileName(job.Strategy, job.Map), s => Png.Save(image, s));
    }

    /// <summary>What the image shows, in its own title band: which view, strategy and map, and how it is scaled.</summary>
    private static ImageTitle Title(ReportComparison cmp, Job job)
    {
        var b = cmp.Base.Document;
        var c = cmp.Candidate.Document;
        string scene = b.Scene.Name == c.Scene.Name ? b.Scene.Name : $"{b.Scene.Name} → {c.Scene.Name}";
        string camera = b.Camera.Name == c.Camera.Name ? b.Camera.Name : $"{b.Camera.Name} → {c.Camera.Name}";
        var details = new List<string>
        {
            $"difference in {HeatmapExporter.UnitOf(job.Map)}",
            $"{job.Width}×{job.Height}",
        };
        int changed = job.HitChanged.Count(x => x);
        if (changed > 0)
            details.Add($"checkered: {changed} {(changed == 1 ? "pixel" : "pixels")} whose hit changed");
        return new ImageTitle([scene, camera, job.Strategy, job.Map, "candidate minus base"], details);
    }

    private sealed record Job(string Strategy, string Map, long[] Diff, bool[] HitChanged, PixelDiffSummary Summary, int Width, int Height);

    /// <summary>The counters the maps are drawn from: a subgroup map's is loop iterations (<see cref="Values"/>).</summary>
    private static string[] CountersOf(IReadOnlyList<string> maps) =>
        maps.Where(m => !HeatmapNames.IsGroupLines(m, out _))
            .Select(m => HeatmapNames.IsSubgroup(m, out _) ? Counter.Iterations.Name() : m)
            .Distinct(StringComparer.OrdinalIgnoreCase).ToArray();

    private static PixelData? Load(LoadedReport report, string strategy, IReadOnlyCollection<string> counters, List<string> missing)
    {
        var path = Path.Combine(report.Directory, OutputNames.PixelData(strategy));
        if (!File.Exists(path))
        {
            missing.Add(strategy);
            return null;
        }
        var data = report.Manifest is { } manifest ? ReadListed(report.Directory, manifest, strategy, counters) : PixelDataFile.Read(path, counters);
        var run = report.Document.Run;
        if (data.Width != run.Width || data.Height != run.Height)
            throw new InputException($"{path}: image size {data.Width}x{data.Height} differs from its report.json ({run.Width}x{run.Height})");
        return data;
    }

    // A folder with a manifest: the pixel file must be the one its run wrote, or it would be compared as if it were.
    private static PixelData ReadListed(string folder, ReportManifest manifest, string strategy, IReadOnlyCollection<string> counters)
    {
        var name = OutputNames.PixelData(strategy);
        var path = Path.Combine(folder, name);
        byte[] bytes;
        try
        {
            bytes = File.ReadAllBytes(path);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            throw new InputException($"{path}: cannot read pixel data ({ex.Message})", ex);
        }
        manifest.Verify(folder, name, bytes);
        return PixelDataFile.Read(new MemoryStream(bytes, writable: false), path, counters);
    }

    /// <summary>
    /// A counter's per-pixel values, or for a subgroup map each pixel's tile maximum of loop iterations; null for a
    /// map of group lines, which the pixel data does not hold.
    /// </summary>
    private static uint[]? Values(PixelData data, string map)
    {
        if (HeatmapNames.IsGroupLines(map, out _))
            return null;
        if (!HeatmapNames.IsSubgroup(map, out var shape))
            return data.Find(map);
        var iterations = data.Find(Counter.Iterations.Name());
        if (iterations is null)
            return null;
        var tiles = new uint[shape.TilesX(data.Width) * shape.TilesY(data.Height)];
        SubgroupModel.TileMax(iterations, data.Width, data.Height, shape, tiles);
        var pixels = new uint[data.Width * data.Height];
        SubgroupModel.ExpandTiles(tiles, data.Width, data.Height, shape, pixels);
        return pixels;
    }
}
