using System.Text.Json;
using VoxProf.Core;

namespace VoxProf.Reports.Model;

/// <summary>The one place report.json is serialised and parsed, so trace and compare agree on its shape.</summary>
public static class ReportJson
{
    public static JsonSerializerOptions Options { get; } = new()
    {
        PropertyNamingPolicy = JsonNamingPolicy.CamelCase,
        WriteIndented = true,
        NewLine = "\n",
    };

    public static string Serialize(ReportDocument document) => JsonSerializer.Serialize(document, Options) + "\n";

    public static void Write(ReportDocument document, Stream stream) => JsonSerializer.Serialize(stream, document, Options);

    /// <summary>Parses report JSON; <paramref name="source"/> names it in errors (a file path, say).</summary>
    public static ReportDocument Deserialize(string json, string source)
    {
        ReportDocument? document;
        try
        {
            document = JsonSerializer.Deserialize<ReportDocument>(json, Options);
        }
        catch (JsonException ex)
        {
            string where = ex.Path is { Length: > 0 } p ? p : $"line {ex.LineNumber + 1}";
            throw new InputException($"{source}: {where}: not a VoxProf report ({FirstLine(ex.Message)})", ex);
        }
        if (document is null)
            throw new InputException($"{source}: empty report, expected a JSON object");
        if (document.SchemaVersion < 1 || document.SchemaVersion > ReportDocument.CurrentSchema)
            throw new InputException($"{source}: $.schemaVersion: {document.SchemaVersion} is not supported, expected 1..{ReportDocument.CurrentSchema}");
        return document;
    }

    public static ReportDocument Read(string path)
    {
        string json;
        try
        {
            json = File.ReadAllText(path);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            throw new InputException($"{path}: cannot read report ({ex.Message})", ex);
        }
        return Deserialize(json, path);
    }

    private static string FirstLine(string message)
    {
        int i = message.IndexOfAny(['\r', '\n']);
        return i < 0 ? message : message[..i];
    }
}
