using System.Text;
using VoxProf.Reports.Compare;
using VoxProf.Tests.Reports;

namespace VoxProf.Tests.Compare;

/// <summary>compare.md, compare.csv and compare.json against stored files, also under a comma-decimal culture.</summary>
public class CompareSnapshotTests
{
    private static CompareResult Result()
    {
        var b = ReportFixtures.Standard();
        var c = ReportFixtures.Standard(1.1) with { Scene = b.Scene with { Sha256 = "99ff" } };
        var cmp = ReportComparison.Create(new("base/report.json", b), new("candidate/report.json", c));
        var verdict = GateRules.Evaluate(cmp, GateRules.Parse(["dda.iterations.mean:5%", "all.subgroup32.tile-max-mean:20%"]));
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
        using var stream = new MemoryStream();
        using (culture.Length > 0 ? new CultureScope(culture) : null)
            exporter.Write(Result(), stream);
        Snapshot.Match(Encoding.UTF8.GetString(stream.ToArray()), "Compare", file);
    }
}
