using System.Text.Json;
using System.Text.RegularExpressions;
using VoxProf.Core;
using VoxProf.Reports.Export;
using VoxProf.Reports.Metrics;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Compare;

/// <summary>A report read from disk, with the path it was read from for messages.</summary>
public sealed record LoadedReport(string File, ReportDocument Document)
{
    /// <summary>The report directory (the directory of report.json): heatmaps and per-pixel files live beside it.</summary>
    public string Directory => Path.GetDirectoryName(Path.GetFullPath(File)) ?? ".";

    /// <summary>The folder's manifest.json when it has one: files read beside report.json are checked against it.</summary>
    public ReportManifest? Manifest { get; init; }

    /// <summary>For a run of several views read as one report (values averaged over them), its views; else null.</summary>
    public IReadOnlyList<Views.RunView>? Views { get; init; }
}

/// <summary>
/// Reads report.json (the one reader of it); every problem becomes one <see cref="InputException"/> line. Reads the
/// current schema only: a report of another schema is refused naming both versions.
/// </summary>
public static partial class ReportLoader
{
    public const string FileName = OutputNames.ReportJson;

    /// <summary>Largest report.json read: a report is tens of kilobytes; anything this large is not one.</summary>
    public const long MaxBytes = 64L << 20;

    // The writer's options, made strict: a missing constructor field or a null where the model has none becomes
    // an error with its JSON path instead of a null that fails somewhere in the comparison.
    private static readonly JsonSerializerOptions Options = new(ReportJson.Options)
    {
        RespectRequiredConstructorParameters = true,
        RespectNullableAnnotations = true,
    };

    /// <param name="path">A report directory or its report.json.</param>
    public static LoadedReport Load(string path)
    {
        var file = Directory.Exists(path) ? Path.Combine(path, FileName) : path;
        if (!File.Exists(file))
        {
            throw new InputException(Directory.Exists(path) || path.EndsWith(".json", StringComparison.OrdinalIgnoreCase)
                ? $"{file}: not found (expected a report.json written by `voxprof trace`)"
                : $"{path}: not found (expected a report directory or its {FileName})");
        }

        if (System.IO.Directory.Exists(file))
            throw new InputException($"{file}: is a folder; expected a report.json written by `voxprof trace`");
        var length = new FileInfo(file).Length;
        if (length > MaxBytes)
            throw new InputException($"{file}: holds {length} bytes; expected a report.json of at most {MaxBytes}");
        var raw = File.ReadAllBytes(file);
        var folder = Path.GetDirectoryName(Path.GetFullPath(file)) ?? ".";
        var manifest = ReportManifest.Read(folder);
        manifest?.Verify(folder, FileName, raw);
        var bytes = JsonText.WithoutBom(raw);
        if (JsonText.FindInvalidUtf8(bytes.Span) is { } notUtf8)
            throw new InputException($"{file}: {notUtf8.Where}: {notUtf8.Problem}");
        if (Views.RunReports.IsRun(bytes))
            return Views.RunReports.Load(file, bytes, manifest);
        CheckSchema(file, bytes);
        ReportDocument? doc;
        try
        {
            doc = JsonSerializer.Deserialize<ReportDocument>(bytes.Span, Options);
        }
        catch (JsonException ex)
        {
            var problem = ex.Path?.EndsWith(".better", StringComparison.Ordinal) == true ? "expected lower, higher or neutral" : Problem(ex);
            throw new InputException($"{file}: {Where(ex)}: {problem}", ex);
        }
        if (doc is null)
            throw new InputException($"{file}: expected a report object, found null");
        ReportValues.RequireItems(file, doc);
        Validate(file, doc);
        ReportValues.Validate(file, doc);
        return new LoadedReport(file, doc) { Manifest = manifest };
    }

    // Read the schema version alone first, so a report from a later schema gets "version N not read" rather than
    // a confusing complaint about some field that schema renamed.
    private static void CheckSchema(string file, ReadOnlyMemory<byte> bytes)
    {
        try
        {
            using var json = JsonDocument.Parse(bytes);
            if (JsonText.FindLoneSurrogate(json.RootElement) is { } lone)
                throw new InputException($"{file}: {lone.Where}: {lone.Problem}");
            if (json.RootElement.ValueKind != JsonValueKind.Object)
                throw new InputException($"{file}: expected a JSON object at the top, found {json.RootElement.ValueKind.ToString().ToLowerInvariant()}");
            JsonElement? found = null;
            foreach (var p in json.RootElement.EnumerateObject())
            {
                if (string.Equals(p.Name, "schemaVersion", StringComparison.OrdinalIgnoreCase))
                    found = p.Value;
            }
            if (found is not { } version)
                throw new InputException($"{file}: $.schemaVersion: missing; expected the report schema version ({ReportDocument.CurrentSchema})");
            if (version.ValueKind != JsonValueKind.Number || !version.TryGetInt32(out var v))
                throw new InputException($"{file}: $.schemaVersion: expected an integer, found {MessageText.Excerpt(version.GetRawText())}");
            if (v != ReportDocument.CurrentSchema)
            {
                var age = v < ReportDocument.CurrentSchema ? "an older" : "a newer";
                throw new InputException($"{file}: $.schemaVersion: report schema {v} (written by {age} voxprof) is not read by this voxprof, " +
                    $"which reads schema {ReportDocument.CurrentSchema} only; trace both runs with one voxprof version");
            }
        }
        catch (JsonException ex)
        {
            var truncated = AtEnd(bytes, ex);
            throw new InputException(truncated
                ? $"{file}: {Where(ex)}: truncated or empty JSON: the text ends before the report does"
                : $"{file}: {Where(ex)}: malformed JSON: {Problem(ex)}", ex);
        }
    }

    // The parser stopped at the last byte: the text ended before the JSON did (a truncated or empty file), which
    // deserves a plainer message than the parser's complaint about what it expected next.
    private static bool AtEnd(ReadOnlyMemory<byte> memory, JsonException ex)
    {
        var bytes = memory.Span;
        var lastBreak = bytes.LastIndexOf((byte)'\n');
        var lines = bytes.Count((byte)'\n');
        var lastLineLength = bytes.Length - (lastBreak + 1);
        return ex.LineNumber == lines && ex.BytePositionInLine >= lastLineLength;
    }

    private static void Validate(string file, ReportDocument doc)
    {
        if (doc.Run.Width <= 0 || doc.Run.Height <= 0)
            throw new InputException($"{file}: $.run: image size {doc.Run.Width}x{doc.Run.Height} is not a positive WxH");
        if (doc.Camera.Eye.Length != 3 || doc.Camera.Target.Length != 3 || doc.Camera.Up.Length != 3)
            throw new InputException($"{file}: $.camera: eye, target and up must each have 3 numbers");
        var metrics = new HashSet<string>(StringComparer.Ordinal);
        for (var i = 0; i < doc.Metrics.Count; i++)
        {
            var m = doc.Metrics[i];
            if (!MetricDescriptor.IsValidName(m.Name))
                throw new InputException($"{file}: $.metrics[{i}].name: '{m.Name}' is not a metric name; expected lower-case words joined by '-', one or two of them joined by '.'");
            if (!metrics.Add(m.Name))
                throw new InputException($"{file}: $.metrics[{i}].name: metric '{m.Name}' appears twice");
            if (!MetricDescriptor.IsValidFormat(m.NumberFormat))
                throw new InputException($"{file}: $.metrics[{i}].numberFormat: '{m.NumberFormat}' is not a number format; expected 0, or 0. followed by 0s or #s");
        }
        var names = new HashSet<string>(StringComparer.OrdinalIgnoreCase);
        for (var i = 0; i < doc.Strategies.Count; i++)
        {
            var s = doc.Strategies[i];
            if (!names.Add(s.Name))
                throw new InputException($"{file}: $.strategies[{i}].name: strategy '{s.Name}' appears twice");
            foreach (var key in s.Values.Keys)
            {
                if (!metrics.Contains(key))
                    throw new InputException($"{file}: $.strategies[{i}].values: '{key}' is not in $.metrics; expected values keyed by the metric names listed there");
            }
        }
    }

    internal static string Where(JsonException ex)
    {
        // System.Text.Json counts lines and bytes from 0; editors count from 1.
        var place = ex.LineNumber is { } line
            ? $"line {line + 1}, position {(ex.BytePositionInLine ?? 0) + 1}"
            : "";
        var path = string.IsNullOrEmpty(ex.Path) || ex.Path == "$" ? "" : ex.Path;
        return (place, path) switch
        {
            ("", "") => "JSON",
            ("", _) => path,
            (_, "") => place,
            _ => $"{path} ({place})",
        };
    }

    // The serializer's messages end with a "Path: … | LineNumber: …" suffix already given by Where, and name
    // .NET types; keep the part a user can act on.
    internal static string Problem(JsonException ex)
    {
        var message = MessageText.CutEchoes(ex.Message);
        var cut = message.IndexOf(" Path: ", StringComparison.Ordinal);
        if (cut < 0)
            cut = message.IndexOf(" LineNumber: ", StringComparison.Ordinal);
        if (cut >= 0)
            message = message[..cut];
        var missing = MissingProperties().Match(message);
        if (missing.Success)
            return $"missing field {missing.Groups[1].Value}";
        if (message.Contains("doesn't allow null values", StringComparison.Ordinal))
            return "expected a value, found null";
        if (message.StartsWith("The JSON value could not be converted", StringComparison.Ordinal))
            return "the value has the wrong type for this field (a number, text, list or object as report.json defines it)";
        message = TypeName().Replace(message, m => $"'{m.Groups[1].Value}'");
        return message.ReplaceLineEndings(" ").TrimEnd('.', ' ');
    }

    [GeneratedRegex("missing required properties including: (.*?)\\.?$")]
    private static partial Regex MissingProperties();

    [GeneratedRegex("'(?:[A-Za-z0-9_]+\\.)+([A-Za-z0-9_`]+)'")]
    private static partial Regex TypeName();
}
