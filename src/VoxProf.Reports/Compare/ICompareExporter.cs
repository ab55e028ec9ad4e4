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
        [new CompareMarkdownExporter(), new CompareCsvExporter(), new CompareJsonExporter()];

    /// <returns>One message per file that could not be written (empty when all were).</returns>
    public static IReadOnlyList<string> WriteAll(string directory, CompareResult result, IEnumerable<ICompareExporter> exporters)
    {
        var failures = new List<string>();
        foreach (var exporter in exporters)
        {
            var path = Path.Combine(directory, exporter.FileName);
            try
            {
                AtomicFile.Write(path, s => exporter.Write(result, s));
            }
            catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
            {
                failures.Add($"{path}: could not write: {ex.Message}");
            }
        }
        return failures;
    }

    /// <summary>Creates the out directory; refuses a path that is a file.</summary>
    public static void PrepareDirectory(string directory)
    {
        if (File.Exists(directory))
            throw new VoxProf.Core.InputException($"{directory}: the out directory is a file; give a directory path with --out");
        try
        {
            Directory.CreateDirectory(directory);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            throw new VoxProf.Core.InputException($"{directory}: cannot create the out directory: {ex.Message}", ex);
        }
    }
}
