using System.Text.Encodings.Web;
using System.Text.Json;

namespace VoxProf.Reports.Model;

/// <summary>
/// The one place report.json's serialiser options live, so trace and compare agree on its shape; compare reads it
/// through <see cref="Compare.ReportLoader"/>.
/// </summary>
public static class ReportJson
{
    public static JsonSerializerOptions Options { get; } = new()
    {
        PropertyNamingPolicy = JsonNamingPolicy.CamelCase,
        WriteIndented = true,
        NewLine = "\n",
        // A file, never embedded in HTML unescaped: keep "×" and "'" readable instead of \u00D7 and \u0027.
        Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping,
        TypeInfoResolver = DocumentJson.Default,
    };

    public static string Serialize(ReportDocument document) => JsonSerializer.Serialize(document, Options) + "\n";
}
