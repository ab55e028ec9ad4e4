using System.Globalization;
using System.Text.RegularExpressions;
using CsvHelper;
using VoxProf.Core;
using VoxProf.Core.Calibration;

namespace VoxProf.Reports.Calibration;

/// <summary>One measured view: a record of the times CSV (docs/calibration.md).</summary>
/// <param name="Line">The line of the CSV file the record starts on, for messages.</param>
/// <param name="Prepass">The prepass block (0 for off), or null when the CSV leaves it to the reports.</param>
public sealed record TimeRow(int Line, string Scene, string Camera, string Strategy, int? Prepass, int? Branching, ImageSize? Size,
    double GpuMs, string? Note);

/// <summary>
/// Reads the GPU times a team measured: RFC 4180 CSV (CsvHelper), a header naming the columns, one record per view,
/// '#' lines as comments. Every problem is one <see cref="InputException"/> naming the file, the line and the column.
/// </summary>
public static partial class TimesCsv
{
    public const string Scene = "scene";
    public const string Camera = "camera";
    public const string Strategy = "strategy";
    public const string GpuMs = "gpu-ms";
    public const string Prepass = "prepass";
    public const string Branching = "branching";
    public const string Size = "size";
    public const string Note = "note";

    public static IReadOnlyList<string> Required { get; } = [Scene, Camera, Strategy, GpuMs];

    public static IReadOnlyList<string> Optional { get; } = [Prepass, Branching, Size, Note];

    private static string Expected =>
        $"expected the columns {string.Join(", ", Required)}, and optionally {string.Join(", ", Optional)}";

    private static readonly CsvReaderOptions Options = new()
    {
        Separator = ',',
        MalformedData = CsvMalformedDataHandling.Throw,
        FieldCountMismatch = CsvFieldCountHandling.Throw,
        CommentPrefix = '#',
        TrackLineNumbers = true,
        TrimWhitespace = true,
    };

    public static IReadOnlyList<TimeRow> Read(string path)
    {
        if (Directory.Exists(path))
            throw new InputException($"{path}: is a directory, expected a CSV file of measured GPU times");
        if (!File.Exists(path))
            throw new InputException($"{path}: not found (expected a CSV file of measured GPU times)");
        try
        {
            using CsvReader csv = CsvReader.FromFile(path, Options);
            var rows = new List<TimeRow>();
            Dictionary<string, int>? columns = null;
            while (csv.Read())
            {
                columns ??= Columns(path, csv.Headers);
                rows.Add(Row(path, csv, columns));
            }
            if (columns is null)
            {
                if (csv.Headers.Count == 0)
                    throw new InputException($"{path}: empty; {Expected}, then one record per measured view");
                Columns(path, csv.Headers);
                throw new InputException($"{path}: no records after the header; expected one record per measured view");
            }
            return rows;
        }
        catch (CsvFormatException ex)
        {
            string place = ex.LineNumber > 0 ? $"line {ex.LineNumber.ToString(CultureInfo.InvariantCulture)}: " : "";
            // The library names the record and line itself; the line is already given in front.
            string problem = RecordPlace().Replace(ex.Message, m => m.Groups[1].Success ? "" : "the record").TrimEnd('.');
            string hint = problem.Contains("fields but", StringComparison.Ordinal)
                ? "; a number with a decimal comma splits in two: write 1.5, not 1,5"
                : "; expected RFC 4180 CSV, with fields that hold a comma, quote or line break in double quotes";
            throw new InputException($"{path}: {place}{problem}{hint}", ex);
        }
    }

    [GeneratedRegex(@"( in)? [Rr]ecord \d+ \(line \d+\)|^[Rr]ecord \d+ \(line \d+\)")]
    private static partial Regex RecordPlace();

    private static Dictionary<string, int> Columns(string path, IReadOnlyList<string> headers)
    {
        var columns = new Dictionary<string, int>(StringComparer.Ordinal);
        for (int i = 0; i < headers.Count; i++)
        {
            string name = headers[i].Trim().ToLowerInvariant();
            if (!Required.Contains(name) && !Optional.Contains(name))
                throw new InputException($"{path}: header: unknown column '{headers[i]}'; {Expected}");
            if (!columns.TryAdd(name, i))
                throw new InputException($"{path}: header: column '{name}' appears twice");
        }
        foreach (string name in Required)
        {
            if (!columns.ContainsKey(name))
                throw new InputException($"{path}: header: missing column '{name}'; {Expected}");
        }
        return columns;
    }

    private static TimeRow Row(string path, CsvReader csv, Dictionary<string, int> columns)
    {
        int line = (int)csv.LineNumber;
        string? Field(string name) => columns.TryGetValue(name, out int i) && csv.GetString(i).Trim() is { Length: > 0 } v ? v : null;
        InputException Bad(string column, string value, string expected) =>
            new($"{path}: line {line.ToString(CultureInfo.InvariantCulture)}: {column} '{value}': expected {expected}");
        string Name(string column, string what) => Field(column)
            ?? throw new InputException($"{path}: line {line.ToString(CultureInfo.InvariantCulture)}: {column}: empty; expected {what}");

        string scene = Name(Scene, "the scene's name as its report gives it (the scene file's name without .vpscene.json)");
        string camera = Name(Camera, "the camera's name as its report gives it");
        string strategy = Name(Strategy, "a strategy the report traced");

        string gpu = Field(GpuMs) ?? throw new InputException($"{path}: line {line.ToString(CultureInfo.InvariantCulture)}: {GpuMs}: empty; expected the measured GPU time in milliseconds");
        if (!double.TryParse(gpu, NumberStyles.Float, CultureInfo.InvariantCulture, out double ms) || !double.IsFinite(ms) || ms <= 0)
            throw Bad(GpuMs, gpu, "a positive time in milliseconds with a '.' decimal point, e.g. 2.75");

        int? prepass = null;
        if (Field(Prepass) is { } p)
        {
            prepass = p.Equals("off", StringComparison.OrdinalIgnoreCase) ? 0
                : int.TryParse(p, NumberStyles.None, CultureInfo.InvariantCulture, out int k) && k is 0 or 2 or 4 or 8 ? k
                : throw Bad(Prepass, p, "off, 0, 2, 4 or 8 (the trace's --prepass block)");
        }
        int? branching = null;
        if (Field(Branching) is { } b)
        {
            branching = int.TryParse(b, NumberStyles.None, CultureInfo.InvariantCulture, out int n) && n >= 2 ? n
                : throw Bad(Branching, b, "the tree's branching factor, e.g. 4");
        }
        ImageSize? size = null;
        if (Field(Size) is { } s)
            size = ParseSize(s) ?? throw Bad(Size, s, "the traced image size WxH, e.g. 1280x720");
        return new TimeRow(line, scene, camera, strategy, prepass, branching, size, ms, Field(Note));
    }

    /// <summary>"WxH" with positive sides, or null.</summary>
    public static ImageSize? ParseSize(string text)
    {
        string[] parts = text.Trim().Split('x', 'X');
        return parts.Length == 2
            && int.TryParse(parts[0], NumberStyles.None, CultureInfo.InvariantCulture, out int w) && w > 0
            && int.TryParse(parts[1], NumberStyles.None, CultureInfo.InvariantCulture, out int h) && h > 0
            ? new ImageSize(w, h) : null;
    }
}
