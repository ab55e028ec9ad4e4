using System.Globalization;
using System.Text.RegularExpressions;
using VoxProf.Core;

namespace VoxProf.Reports.Compare;

public enum LimitKind
{
    /// <summary>Percent of the base value.</summary>
    Relative,
    /// <summary>In the metric's own unit.</summary>
    Absolute,
}

/// <summary>
/// A gate rule, <c>STRATEGY.METRIC:LIMIT</c> (docs/ci.md): how much worse a metric may get. METRIC is a metric's
/// name as summary.csv spells it (<c>iterations.mean</c>, <c>hit-rate</c>). The limit is on the worsening, so
/// <c>:5%</c> lets a cost rise 5% and an efficiency fall 5%; a negative limit demands a gain; for a neutral metric it
/// bounds the change either way. <c>all</c> (or a quoted <c>*</c>) matches every name in its position: a whole METRIC
/// of <c>all</c> matches every metric, <c>iterations.all</c> every statistic of iterations.
/// </summary>
public sealed partial record GateRule(string Text, string Strategy, string Metric, double Limit, LimitKind Kind)
{
    public const string Wildcard = "all";

    /// <summary>Largest limit accepted, in percent or in the metric's unit.</summary>
    public const double MaxLimit = 1e15;

    public const string Syntax = "STRATEGY.METRIC:LIMIT, e.g. all.iterations.mean:5% or dda.subgroup32.tile-max-mean:2";

    // Relative limits are compared with a little slack so that a change of exactly the limit, which floating-point
    // division may land a few ulps above it, holds.
    private const double Slack = 1e-9;

    public static GateRule Parse(string text)
    {
        var m = Shape().Match(text.Trim());
        if (!m.Success)
            throw new InputException($"rule '{MessageText.Excerpt(text, 80)}': expected {Syntax}");
        var number = m.Groups["number"].Value;
        if (!double.TryParse(number, NumberStyles.AllowDecimalPoint, CultureInfo.InvariantCulture, out var limit))
            throw new InputException($"rule '{MessageText.Excerpt(text, 80)}': limit '{MessageText.Excerpt(m.Groups["limit"].Value)}' is not a number");
        // A limit that does not fit a double (400 nines) would be infinite: no rule needs more than a report can hold.
        if (!double.IsFinite(limit) || limit > MaxLimit)
            throw new InputException($"rule '{MessageText.Excerpt(text, 80)}': limit '{MessageText.Excerpt(m.Groups["limit"].Value)}' is too large; expected at most {MaxLimit:0e0}");
        if (m.Groups["sign"].Value == "-")
            limit = -limit;
        string metric = string.Join('.', m.Groups["metric"].Value.Split('.').Select(Name));
        return new GateRule(text.Trim(), Name(m.Groups["strategy"].Value), metric, limit,
            m.Groups["pct"].Success ? LimitKind.Relative : LimitKind.Absolute);
    }

    public static bool IsWildcard(string part) => part == Wildcard;

    public bool Matches(MetricChange change) => Is(Strategy, change.Strategy) && MatchesMetric(change.Metric.Name);

    /// <summary>Whether the METRIC part matches a metric name, word by word; <c>all</c> alone matches every metric.</summary>
    public bool MatchesMetric(string name)
    {
        if (Metric == Wildcard)
            return true;
        string[] pattern = Metric.Split('.');
        string[] parts = name.Split('.');
        return pattern.Length == parts.Length && pattern.Zip(parts).All(p => Is(p.First, p.Second));
    }

    public bool Holds(MetricChange change) => Kind == LimitKind.Relative
        ? change.RelativeWorsening <= Limit / 100 + Slack
        : change.AbsoluteWorsening <= Limit + Slack * Math.Max(1, Math.Abs(Limit));

    /// <summary>"5%", "-2%", "10"</summary>
    public string LimitText =>
        Limit.ToString("0.###", CultureInfo.InvariantCulture) + (Kind == LimitKind.Relative ? "%" : "");

    private static bool Is(string pattern, string name) =>
        pattern == Wildcard || string.Equals(pattern, name, StringComparison.OrdinalIgnoreCase);

    private static string Name(string part)
    {
        var v = part.ToLowerInvariant();
        return v == "*" ? Wildcard : v;
    }

    // Names are lower-case words joined by '-' (dda-mask, cell-steps, tile-max-mean, subgroup32); a metric is one
    // name or two joined by '.'; no ':' inside. A paired strategy is BASE=CANDIDATE (compare --pair, --within).
    [GeneratedRegex(@"^(?<strategy>\*|[A-Za-z0-9_-]+(?:=[A-Za-z0-9_-]+)?)\.(?<metric>(?:\*|[A-Za-z0-9_-]+)(?:\.(?:\*|[A-Za-z0-9_-]+))?):(?<limit>(?<sign>[+-]?)(?<number>[0-9]+(?:\.[0-9]+)?)(?<pct>%)?)$")]
    private static partial Regex Shape();
}
