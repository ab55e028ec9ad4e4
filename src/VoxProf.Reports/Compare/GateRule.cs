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
/// A gate rule, <c>STRATEGY.GROUP.STATISTIC:LIMIT</c> (docs/ci.md): how much worse a metric may get. The limit is
/// on the worsening, so <c>:5%</c> lets a cost rise 5% and an efficiency fall 5%; a negative limit demands a gain.
/// <c>all</c> (or a quoted <c>*</c>) in a name position matches every name there.
/// </summary>
public sealed partial record GateRule(string Text, string Strategy, string Group, string Statistic, double Limit, LimitKind Kind)
{
    public const string Wildcard = "all";

    public const string Syntax = "STRATEGY.COUNTER.STATISTIC:LIMIT, e.g. all.iterations.mean:5% or dda.wave32.tile-max:2";

    // Relative limits are compared with a little slack so that a change of exactly the limit, which floating-point
    // division may land a few ulps above it, holds.
    private const double Slack = 1e-9;

    public static GateRule Parse(string text)
    {
        var m = Shape().Match(text.Trim());
        if (!m.Success)
            throw new InputException($"rule '{text}': expected {Syntax}");
        var number = m.Groups["number"].Value;
        if (!double.TryParse(number, NumberStyles.AllowDecimalPoint, CultureInfo.InvariantCulture, out var limit))
            throw new InputException($"rule '{text}': limit '{m.Groups["limit"].Value}' is not a number");
        if (m.Groups["sign"].Value == "-")
            limit = -limit;
        return new GateRule(text.Trim(), Name(m, "strategy"), Name(m, "group"), Name(m, "stat"), limit,
            m.Groups["pct"].Success ? LimitKind.Relative : LimitKind.Absolute);
    }

    public static bool IsWildcard(string part) => part == Wildcard;

    public bool Matches(MetricChange change) =>
        Is(Strategy, change.Strategy) && Is(Group, change.Metric.Group) && Is(Statistic, change.Metric.Statistic);

    public bool Holds(MetricChange change) => Kind == LimitKind.Relative
        ? change.RelativeWorsening <= Limit / 100 + Slack
        : change.AbsoluteWorsening <= Limit + Slack * Math.Max(1, Math.Abs(Limit));

    /// <summary>"5%", "-2%", "10"</summary>
    public string LimitText =>
        Limit.ToString("0.###", CultureInfo.InvariantCulture) + (Kind == LimitKind.Relative ? "%" : "");

    private static bool Is(string pattern, string name) =>
        pattern == Wildcard || string.Equals(pattern, name, StringComparison.OrdinalIgnoreCase);

    private static string Name(Match m, string group)
    {
        var v = m.Groups[group].Value.ToLowerInvariant();
        return v == "*" ? Wildcard : v;
    }

    // Names are lower-case words joined by '-' (dda-mask, cell-steps, tile-max, wave32); no '.' or ':' inside.
    [GeneratedRegex(@"^(?<strategy>\*|[A-Za-z0-9_-]+)\.(?<group>\*|[A-Za-z0-9_-]+)\.(?<stat>\*|[A-Za-z0-9_-]+):(?<limit>(?<sign>[+-]?)(?<number>[0-9]+(?:\.[0-9]+)?)(?<pct>%)?)$")]
    private static partial Regex Shape();
}
