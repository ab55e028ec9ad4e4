using System.Globalization;
using VoxProf.Core.Limits;

namespace VoxProf.Reports.Export;

/// <summary>The memory writing a report takes beyond the trace's own results, for the estimate checked before a trace.</summary>
public static class ReportMemory
{
    /// <summary>
    /// Heatmaps are drawn in parallel, one per processor at a time, each holding its image (4 bytes a pixel), the
    /// values it shows (4) and the encoder's rows (about 4); statistics sort a copy of one counter at a time per
    /// strategy (4 bytes a pixel) beside the two derived per-pixel sums (8).
    /// </summary>
    public static IEnumerable<MemoryPart> Parts(int width, int height, int strategies, int heatmapsPerStrategy)
    {
        double pixels = (double)width * height;
        int images = Math.Max(1, Math.Min(Environment.ProcessorCount, strategies * Math.Max(1, heatmapsPerStrategy)));
        yield return new MemoryPart(
            string.Create(CultureInfo.InvariantCulture, $"{images} heatmap{(images == 1 ? "" : "s")} drawn at once"), pixels * 12 * images);
        yield return new MemoryPart("statistics", pixels * 12 * Math.Min(strategies, Environment.ProcessorCount));
    }
}
