using System.Globalization;
using System.Text.Json.Serialization;
using System.Text.RegularExpressions;

namespace VoxProf.Reports.Metrics;

/// <summary>Which way a metric improves; <see cref="Neutral"/> for a figure that is neither better nor worse.</summary>
[JsonConverter(typeof(JsonStringEnumConverter<Better>))]
public enum Better
{
    [JsonStringEnumMemberName("lower")]
    Lower,

    [JsonStringEnumMemberName("higher")]
    Higher,

    [JsonStringEnumMemberName("neutral")]
    Neutral,
}

/// <summary>
/// What one metric means, for every output at once: summary.csv's column, summary.md's and the console's column,
/// report.json's value key, compare's row and a gate rule's target all use <see cref="Name"/>. <see cref="Better"/>
/// is the only place the direction of a regression is decided, so no output needs a case per metric.
/// </summary>
/// <param name="Name"><c>GROUP.STATISTIC</c> (<c>iterations.p90</c>, <c>subgroup32.tile-max-mean</c>) or one word for a
/// per-strategy fact (<c>hit-rate</c>, <c>mismatch</c>): lower-case words joined by '-'.</param>
/// <param name="Title">What the number is, in words, for a reader.</param>
/// <param name="Unit">What one unit of the value is (<c>count</c>, <c>iterations</c>, <c>ratio</c>, <c>pixels</c>).</param>
/// <param name="NumberFormat">.NET custom numeric format for people; machine outputs keep full precision.</param>
public sealed partial record MetricDescriptor(string Name, string Title, string Unit, string NumberFormat, Better Better)
{
    /// <summary>The part before the '.', or null for a one-word metric.</summary>
    [JsonIgnore]
    public string? Group => Name.IndexOf('.') is var dot and >= 0 ? Name[..dot] : null;

    /// <summary>The part after the '.', or the whole name of a one-word metric.</summary>
    [JsonIgnore]
    public string Statistic => Name[(Name.IndexOf('.') + 1)..];

    public string Format(double value) => value.ToString(NumberFormat, CultureInfo.InvariantCulture);

    /// <summary>A signed change: "+1.50", "-3", "0".</summary>
    public string FormatChange(double change) =>
        change > 0 ? "+" + Format(change) : change < 0 ? "-" + Format(-change) : Format(0);

    /// <summary>Lower-case words of letters and digits joined by '-', one or two of them joined by '.'.</summary>
    public static bool IsValidName(string name) => NameShape().IsMatch(name);

    /// <summary>The formats this project writes: whole numbers, or a fixed or optional count of decimals (<c>0.00</c>, <c>0.###</c>).</summary>
    public static bool IsValidFormat(string format) => FormatShape().IsMatch(format);

    [GeneratedRegex(@"^[a-z0-9]+(?:-[a-z0-9]+)*(?:\.[a-z0-9]+(?:-[a-z0-9]+)*)?$")]
    private static partial Regex NameShape();

    [GeneratedRegex(@"^0(?:\.(?:0{1,9}|#{1,9}))?$")]
    private static partial Regex FormatShape();
}
