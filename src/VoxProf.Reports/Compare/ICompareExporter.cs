using VoxProf.Reports.Export;

namespace VoxProf.Reports.Compare;

/// <summary>One output file of <c>compare</c>.</summary>
public interface ICompareExporter
{
    string FileName { get; }

    void Write(CompareResult result, Stream output);
}

/// <summary>Runs every exporter into one directory; a failing one is reported and the others are still written.</summary>
public static class CompareOutputs
{
    public static IReadOnlyList<ICompareExporter> All { get; } =
        [new CompareMarkdownExporter(), new CompareCsvExporter(), new CompareJsonExporter(), new Html.CompareHtmlExporter()];

    /// <summary>The exporters of one run: all of them, or all but compare.html (--no-html).</summary>
    public static IReadOnlyList<ICompareExporter> Chosen(bool html) =>
        html ? All : All.Where(e => e is not Html.CompareHtmlExporter).ToArray();

    /// <returns>One message per file that could not be written (empty when all were).</returns>
    public static IReadOnlyList<string> WriteAll(OutputDirectory output, CompareResult result, IEnumerable<ICompareExporter> exporters)
    {
        var failures = new List<string>();
        foreach (var exporter in exporters)
        {
            try
            {
                output.Write(exporter.FileName, s => exporter.Write(result, s));
            }
            catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
            {
                failures.Add($"{Path.Combine(output.FullPath, exporter.FileName)}: could not write: {ex.Message}");
            }
        }
        return failures;
    }
}
