using System.Globalization;
using System.Text.Json;
using VoxProf.Core;
using VoxProf.Core.Calibration;
using VoxProf.Reports.Compare;
using VoxProf.Reports.Export;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Calibration;

/// <summary>
/// Writes calibration.json and calibration.md, and reads calibration.json back (the one reader of it); every problem
/// with a file read is one <see cref="InputException"/> naming the file and the JSON path.
/// </summary>
public static class CalibrationFile
{
    public const string JsonName = "calibration.json";
    public const string MarkdownName = "calibration.md";

    // The report writer's options, made strict as the report reader makes them.
    private static readonly JsonSerializerOptions ReadOptions = new(ReportJson.Options)
    {
        RespectRequiredConstructorParameters = true,
        RespectNullableAnnotations = true,
    };

    public static string Serialize(CalibrationDocument document) => JsonSerializer.Serialize(document, ReportJson.Options) + "\n";

    /// <summary>Writes both files (each to a temporary name, then renamed); returns their names.</summary>
    public static IReadOnlyList<string> Write(OutputDirectory directory, CalibrationDocument document)
    {
        directory.WriteText(JsonName, w => w.Write(Serialize(document)));
        directory.WriteText(MarkdownName, w => w.Write(CalibrationMarkdown.Render(document)));
        return [JsonName, MarkdownName];
    }

    /// <param name="path">calibration.json, or the directory `calibrate` wrote it into.</param>
    public static AppliedCalibration Read(string path)
    {
        string file = Directory.Exists(path) ? Path.Combine(path, JsonName) : path;
        if (!File.Exists(file))
            throw new InputException($"{file}: not found (expected a {JsonName} written by `voxprof calibrate`)");
        byte[] bytes = File.ReadAllBytes(file);
        CheckSchema(file, bytes);
        CalibrationDocument? doc;
        try
        {
            doc = JsonSerializer.Deserialize<CalibrationDocument>(bytes, ReadOptions);
        }
        catch (JsonException ex)
        {
            throw new InputException($"{file}: {ReportLoader.Where(ex)}: {ReportLoader.Problem(ex)}", ex);
        }
        if (doc is null)
            throw new InputException($"{file}: expected a calibration object, found null");
        return new AppliedCalibration(file, Model(file, doc));
    }

    private static void CheckSchema(string file, byte[] bytes)
    {
        try
        {
            using var json = JsonDocument.Parse(bytes);
            if (json.RootElement.ValueKind != JsonValueKind.Object)
                throw new InputException($"{file}: expected a JSON object at the top, found {json.RootElement.ValueKind.ToString().ToLowerInvariant()}");
            if (!json.RootElement.TryGetProperty("schemaVersion", out JsonElement version))
                throw new InputException($"{file}: $.schemaVersion: missing; expected the calibration schema version ({CalibrationDocument.CurrentSchema})");
            if (version.ValueKind != JsonValueKind.Number || !version.TryGetInt32(out int v) || v != CalibrationDocument.CurrentSchema)
            {
                throw new InputException($"{file}: $.schemaVersion: {version.GetRawText()} is not read by this voxprof, which reads calibration " +
                    $"schema {CalibrationDocument.CurrentSchema}; run `voxprof calibrate` again with this version");
            }
        }
        catch (JsonException ex)
        {
            throw new InputException($"{file}: {ReportLoader.Where(ex)}: malformed JSON: {ReportLoader.Problem(ex)}", ex);
        }
    }

    private static CostModel Model(string file, CalibrationDocument doc)
    {
        if (string.IsNullOrWhiteSpace(doc.Device))
            throw new InputException($"{file}: $.device: empty; expected the GPU and driver the times were measured on");
        var terms = new List<CostTerm>();
        for (int i = 0; i < doc.Costs.Count; i++)
        {
            CostEntry c = doc.Costs[i];
            string at = $"{file}: $.costs[{i.ToString(CultureInfo.InvariantCulture)}]";
            if (!double.IsFinite(c.Nanoseconds) || c.Nanoseconds < 0)
                throw new InputException($"{at}.nanoseconds: {c.Nanoseconds.ToString(CultureInfo.InvariantCulture)}; expected a cost of 0 or more");
            CostTerm term = c.Feature == CostTerm.PixelName ? new CostTerm(null, c.Nanoseconds)
                : CostFeatures.Find(c.Feature) is { } m ? new CostTerm(m, c.Nanoseconds)
                : throw new InputException($"{at}.feature: '{c.Feature}' is not a measure this voxprof counts; expected {CostTerm.PixelName} or one of: {CostFeatures.ValidList}");
            if (terms.Any(t => t.Name == term.Name))
                throw new InputException($"{at}.feature: '{c.Feature}' is priced twice");
            terms.Add(term);
        }
        var sizes = new List<ImageSize>();
        for (int i = 0; i < doc.FittedOn.Sizes.Length; i++)
        {
            sizes.Add(TimesCsv.ParseSize(doc.FittedOn.Sizes[i])
                ?? throw new InputException($"{file}: $.fittedOn.sizes[{i.ToString(CultureInfo.InvariantCulture)}]: '{doc.FittedOn.Sizes[i]}'; expected WxH, e.g. 1280x720"));
        }
        return new CostModel(doc.Device, terms, new FitScope(doc.FittedOn.Branchings, sizes));
    }
}
