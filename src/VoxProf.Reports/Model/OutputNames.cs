using VoxProf.Core.Traversal;

namespace VoxProf.Reports.Model;

/// <summary>File names inside a report directory (documented in docs/reports.md).</summary>
public static partial class OutputNames
{
    public const string ReportJson = "report.json";
    public const string SummaryCsv = "summary.csv";
    public const string SummaryMarkdown = "summary.md";
    public const string Preview = "preview.png";
    public const string ReportHtml = "report.html";

    /// <summary><paramref name="map"/> is a counter or subgroup name ("iterations", "subgroup32").</summary>
    public static string Heatmap(string strategy, string map) => $"heatmap-{strategy}-{map}.png";

    public static string Mismatch(string strategy) => $"mismatch-{strategy}.png";

    public static string PixelData(string strategy) => $"pixels-{strategy}.bin.gz";

    public static string PixelCsv(string strategy) => $"pixels-{strategy}.csv";


    /// <summary>
    /// Whether a file name is one voxprof writes into an output folder (report, compare and HTML files, images, pixel
    /// data, the manifest, a hidden temporary file): a folder holding only such names may be replaced whole.
    /// </summary>
    public static bool IsOwn(string name) => OwnName().IsMatch(name);

    [System.Text.RegularExpressions.GeneratedRegex(
        @"^(?:(?:report|compare|manifest|calibration)\.json|(?:summary|compare|calibration)\.(?:csv|md)|views\.csv|worst-views\.png|(?:report|compare)\.html|preview\.png|(?:heatmap|mismatch|diff)-[^/\\]+\.png|pixels-[^/\\]+\.(?:bin\.gz|csv)|\..+\.tmp)$")]
    private static partial System.Text.RegularExpressions.Regex OwnName();
}
