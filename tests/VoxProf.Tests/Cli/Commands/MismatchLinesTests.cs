using System.Globalization;
using System.Text.Json;
using VoxProf.Cli;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Pixels;
using VoxProf.Reports.Tables;
using VoxProf.Tests.Strategies;

namespace VoxProf.Tests.Cli.Commands;

/// <summary>The line trace prints under its table for a strategy whose hits differ from grid's.</summary>
public sealed class MismatchLinesTests : IDisposable
{
    private readonly SampleRun _run = new("mismatch");

    public void Dispose() => _run.Dispose();

    [Fact]
    public void A_strategy_that_loses_some_hits_is_named_with_its_count_and_the_first_pixel_grids_pixel_file_says_it_loses()
    {
        string file = _run.In("blind.cs");
        File.WriteAllText(file, StrategySource.Of("Blind", "blind",
            "        counters = HddaStrategy.Trace<TBranching, TCounters>(view, ray, tMin, path, ref hit);\n        if (hit.X % 2 == 0) hit = default;"));
        string outDir = _run.In("out");

        int code = _run.Run("trace", SampleRun.Scene, "--strategy-file", file, "-s", "grid,dda,blind", "--size", "48x32", "--no-html", "--quiet",
            "--out", outDir);

        code.Should().Be(ExitCodes.Ok, _run.Err.ToString());
        // The oracle is grid's own pixel file: the first pixel in row order whose hit is on an even x is the one lost.
        PixelData grid = PixelDataFile.Read(Path.Combine(outDir, "pixels-grid.bin.gz"));
        int first = Array.FindIndex(grid.Hits, h => h.Hit && h.X % 2 == 0);
        first.Should().BeGreaterThanOrEqualTo(0, "the scene has voxels at even x in view");
        PixelHit lost = grid.Hits[first];
        using var report = JsonDocument.Parse(File.ReadAllText(Path.Combine(outDir, "report.json")));
        long count = (long)report.RootElement.GetProperty("strategies").EnumerateArray()
            .Single(s => s.GetProperty("name").GetString() == "blind").GetProperty("values").GetProperty("mismatch").GetDouble();
        count.Should().Be(grid.Hits.Count(h => h.Hit && h.X % 2 == 0));

        string[] lines = _run.Out.ToString().TrimEnd('\n').Split('\n');
        lines.Where(l => l.Contains("differ", StringComparison.Ordinal)).Should().Equal(string.Create(CultureInfo.InvariantCulture,
            $"blind: {count} pixels differ from grid; the first, pixel ({first % 48}, {first / 48}): grid hit voxel ({lost.X}, {lost.Y}, {lost.Z}) " +
            $"through {PixelHit.FaceName(lost.Face)} at t {lost.T:G9}, material {lost.Material}; blind missed (--pixel {first % 48},{first / 48} follows that ray)"));
        lines[^1].Should().StartWith("wrote ");
    }

    [Fact]
    public void A_hit_reads_the_same_in_any_culture_and_a_face_no_walk_writes_is_shown_by_its_code()
    {
        CultureInfo saved = CultureInfo.CurrentCulture;
        try
        {
            CultureInfo.CurrentCulture = CultureInfo.GetCultureInfo("de-DE");
            MismatchLines.Describe(new PixelHit { Hit = true, X = -3, Y = 4, Z = 5, Face = HitFace.NegY, T = 41.25, Material = 7 })
                .Should().Be("hit voxel (-3, 4, 5) through -y at t 41.25, material 7");
            MismatchLines.Describe(new PixelHit { Hit = true, X = 1, Y = 2, Z = 3, Face = HitFace.None, T = 0, Material = 1 })
                .Should().Be("hit voxel (1, 2, 3) from inside at t 0, material 1");
            MismatchLines.Describe(new PixelHit { Hit = true, Face = (HitFace)200, T = double.NaN })
                .Should().Be("hit voxel (0, 0, 0) through face code 200 at t NaN, material 0");
            MismatchLines.Describe(default).Should().Be("missed");
        }
        finally
        {
            CultureInfo.CurrentCulture = saved;
        }
    }
}
