using System.Text.Json;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Compare;

/// <summary>compare.json: the verdict, every rule with its checks, and every change, for scripts.</summary>
public sealed class CompareJsonExporter : ICompareExporter
{
    /// <summary>2: changes name their metric as summary.csv and rules do, with "better" instead of a lower-is-better flag.</summary>
    public const int SchemaVersion = 2;

    private static readonly JsonSerializerOptions Options = new(JsonSerializerDefaults.Web)
    {
        WriteIndented = true,
        Encoder = ReportJson.Options.Encoder,
        TypeInfoResolver = DocumentJson.Default,
    };

    public string FileName => "compare.json";

    public void Write(CompareResult result, Stream output) =>
        JsonSerializer.Serialize(output, ToDocument(result), Options);

    public static CompareDocument ToDocument(CompareResult result)
    {
        var cmp = result.Comparison;
        return new CompareDocument(
            SchemaVersion,
            CompareText.Verdict(result.Verdict),
            result.Verdict.UsedDefaultRules,
            new CompareSide(cmp.Base.File, cmp.Base.Document.Scene.Name, cmp.Base.Document.Scene.Sha256, cmp.Base.Document.ToolVersion),
            new CompareSide(cmp.Candidate.File, cmp.Candidate.Document.Scene.Name, cmp.Candidate.Document.Scene.Sha256, cmp.Candidate.Document.ToolVersion),
            cmp.SceneChanged,
            cmp.Notes,
            result.Verdict.Outcomes.Select(o => new CompareRuleJson(
                o.Rule.Text, o.Holds, o.Rule.Limit, o.Rule.Kind == LimitKind.Relative ? "percent" : "absolute",
                o.Checks.Select(c => new CompareCheckJson(c.Change.Strategy, c.Change.Metric.Name, c.Holds)).ToArray())).ToArray(),
            cmp.Changes.Select(c => new CompareChangeJson(
                c.Strategy, c.Metric.Name, c.Metric.Unit, CompareText.BetterText(c.Metric.Better),
                c.Base, c.Candidate, c.Change, c.RelativeChange, c.IsRegression)).ToArray(),
            result.DiffImages,
            result.DiffNotes);
    }
}

public sealed record CompareDocument(
    int SchemaVersion,
    string Verdict,
    bool DefaultRules,
    CompareSide Base,
    CompareSide Candidate,
    bool SceneChanged,
    IReadOnlyList<string> Notes,
    IReadOnlyList<CompareRuleJson> Rules,
    IReadOnlyList<CompareChangeJson> Changes,
    IReadOnlyList<string> DiffImages,
    IReadOnlyList<string> DiffNotes);

public sealed record CompareSide(string Report, string Scene, string? SceneSha256, string ToolVersion);

/// <param name="LimitKind">"percent" of the base value or "absolute" in the metric's unit.</param>
public sealed record CompareRuleJson(string Rule, bool Holds, double Limit, string LimitKind, IReadOnlyList<CompareCheckJson> Checks);

public sealed record CompareCheckJson(string Strategy, string Metric, bool Holds);

/// <param name="Better">"lower", "higher" or "neutral".</param>
/// <param name="RelativeChange">Null when the base is 0 and the candidate is not.</param>
public sealed record CompareChangeJson(
    string Strategy, string Metric, string Unit, string Better,
    double Base, double Candidate, double Change, double? RelativeChange, bool Regression);
