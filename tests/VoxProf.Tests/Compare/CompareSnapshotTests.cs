using System.Text;
using VoxProf.Reports.Compare;

namespace VoxProf.Tests.Compare;

/// <summary>compare.md, compare.csv and compare.json against stored files, also under a comma-decimal culture.</summary>
public class CompareSnapshotTests
{
    private static CompareResult Result()
    {
        var b = ReportFixtures.Standard();
        var c = ReportFixtures.Standard(1.1) with { Scene = b.Scene with { Sha256 = "99ff" } };
        var cmp = ReportComparison.Create(new("base/report.json", b), new("candidate/report.json", c));
        var verdict = GateRules.Evaluate(cmp, GateRules.Parse(["dda.iterations.mean:5%", "all.wave32.tile-max:20%"]));
        return new CompareResult(cmp, verdict) { DiffImages = ["diff-dda-iterations.png"] };
    }

    [Theory]
    [InlineData("compare.md", "")]
    [InlineData("compare.csv", "")]
    [InlineData("compare.json", "")]
    [InlineData("compare.md", "de-DE")]
    [InlineData("compare.csv", "fr-FR")]
    [InlineData("compare.json", "de-DE")]
    public void Output_matches_the_stored_file(string file, string culture)
    {
        var exporter = CompareOutputs.All.Single(e => e.FileName == file);
        var saved = System.Globalization.CultureInfo.CurrentCulture;
        string actual;
        try
        {
            System.Globalization.CultureInfo.CurrentCulture = System.Globalization.CultureInfo.GetCultureInfo(culture);
            using var stream = new MemoryStream();
            exporter.Write(Result(), stream);
            actual = Encoding.UTF8.GetString(stream.ToArray());
        }
        finally
        {
            System.Globalization.CultureInfo.CurrentCulture = saved;
        }

        var path = Path.Combine(AppContext.BaseDirectory, "Compare", "Expected", file);
        var expected = File.Exists(path) ? File.ReadAllText(path) : "";
        if (actual != expected)
        {
            var dump = Path.Combine(Path.GetTempPath(), "voxprof-snapshots");
            Directory.CreateDirectory(dump);
            File.WriteAllText(Path.Combine(dump, file), actual);
        }
        actual.Should().Be(expected, $"output must match Compare/Expected/{file} (actual left in the temp folder)");
    }
}
