using System.Globalization;
using VoxProf.Core.Statistics;
using VoxProf.Core.Traversal;

namespace VoxProf.Reports.Tables;

/// <summary>
/// The lines `voxprof trace` prints under its table for each strategy whose hits differ from grid's: how many pixels,
/// and the first of them (row-major) with both hits, so the hunt for the bug starts at a pixel rather than at a count
/// (report.html's readout shows any other).
/// </summary>
public static class MismatchLines
{
    public static IReadOnlyList<string> For(TraceRun run)
    {
        if (run.Reference is not { } grid)
            return [];
        var lines = new List<string>();
        foreach (StrategyResult result in run.Results)
        {
            if (ReferenceEquals(result, grid))
                continue;
            int first = HitStatistics.FirstMismatch(result.Hits, grid.Hits);
            if (first < 0)
                continue;
            // Counted on from the first: one pass over the hit records in all.
            long count = HitStatistics.MismatchCount(result.Hits.AsSpan(first), grid.Hits.AsSpan(first));
            string name = result.Strategy.Name;
            lines.Add(string.Create(CultureInfo.InvariantCulture,
                $"{name}: {count} {(count == 1 ? "pixel differs" : "pixels differ")} from grid; the first, pixel ({first % result.Width}, {first / result.Width}): " +
                $"grid {Describe(grid.Hits[first])}; {name} {Describe(result.Hits[first])} (--pixel {first % result.Width},{first / result.Width} follows that ray)"));
        }
        return lines;
    }

    /// <summary>"hit voxel (12, 4, 30) through -x at t 41.25, material 3", "hit voxel (…) from inside at t 0, …" or "missed".</summary>
    public static string Describe(in PixelHit hit)
    {
        if (!hit.Hit)
            return "missed";
        return string.Create(CultureInfo.InvariantCulture, $"hit voxel ({hit.X}, {hit.Y}, {hit.Z}) {Face(hit)} at t {hit.T:G9}, material {hit.Material}");
    }

    /// <summary>"through -x", "from inside" (t = 0), or "through face code 200" for a byte no walk writes.</summary>
    public static string Face(in PixelHit hit)
    {
        // A strategy of the user's may write any byte as the face; only the six real ones have names.
        return hit.Face switch
        {
            HitFace.None => "from inside",
            <= HitFace.PosZ => "through " + PixelHit.FaceName(hit.Face),
            _ => string.Create(CultureInfo.InvariantCulture, $"through face code {(int)hit.Face}"),
        };
    }
}
