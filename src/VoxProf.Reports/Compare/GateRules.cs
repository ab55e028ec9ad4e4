using VoxProf.Core;

namespace VoxProf.Reports.Compare;

/// <summary>One metric checked by one rule.</summary>
public sealed record RuleCheck(MetricChange Change, bool Holds);

/// <summary>A rule and every metric it matched; it holds when all of them hold.</summary>
public sealed record RuleOutcome(GateRule Rule, IReadOnlyList<RuleCheck> Checks)
{
    public bool Holds => Checks.All(c => c.Holds);

    public IEnumerable<RuleCheck> Broken => Checks.Where(c => !c.Holds);
}

/// <summary>The gate's answer: passed when every rule holds.</summary>
public sealed record GateVerdict(bool UsedDefaultRules, IReadOnlyList<RuleOutcome> Outcomes)
{
    public bool Passed => Outcomes.All(o => o.Holds);

    public IEnumerable<RuleOutcome> BrokenRules => Outcomes.Where(o => !o.Holds);
}

/// <summary>Checks rules against a comparison; refuses rules that name what the reports do not hold.</summary>
public static class GateRules
{
    /// <summary>Used when no rule is given: mean loop iterations and the 32-lane mean tile maximum may rise 5%.</summary>
    public static readonly IReadOnlyList<string> Default = ["all.iterations.mean:5%", "all.wave32.tile-max:5%"];

    public static IReadOnlyList<GateRule> Parse(IEnumerable<string> texts) => texts.Select(GateRule.Parse).ToArray();

    /// <param name="rules">The user's rules; empty means <see cref="Default"/>.</param>
    public static GateVerdict Evaluate(ReportComparison comparison, IReadOnlyList<GateRule> rules)
    {
        var useDefault = rules.Count == 0;
        var effective = useDefault ? Parse(Default) : rules;
        var outcomes = new List<RuleOutcome>();
        foreach (var rule in effective)
        {
            var matched = comparison.Changes.Where(rule.Matches).ToArray();
            if (matched.Length == 0)
            {
                // A default rule on a metric these reports lack (a run traced without it) is skipped; a user's
                // rule that checks nothing would pass silently, so it is refused.
                if (useDefault)
                    continue;
                throw new InputException(Unmatched(rule, comparison));
            }
            outcomes.Add(new RuleOutcome(rule, matched.Select(c => new RuleCheck(c, rule.Holds(c))).ToArray()));
        }
        return new GateVerdict(useDefault, outcomes);
    }

    private static string Unmatched(GateRule rule, ReportComparison comparison)
    {
        var changes = comparison.Changes;
        if (!GateRule.IsWildcard(rule.Strategy) && !comparison.Strategies.Contains(rule.Strategy, StringComparer.OrdinalIgnoreCase))
            return $"rule '{rule.Text}': unknown strategy '{rule.Strategy}'; strategies in both reports: {List(comparison.Strategies)}";

        var inStrategy = changes.Where(c => GateRule.IsWildcard(rule.Strategy) || Same(c.Strategy, rule.Strategy)).ToArray();
        var groups = inStrategy.Select(c => c.Metric.Group).Distinct(StringComparer.OrdinalIgnoreCase).ToArray();
        if (!GateRule.IsWildcard(rule.Group) && !groups.Contains(rule.Group, StringComparer.OrdinalIgnoreCase))
            return $"rule '{rule.Text}': unknown counter or wave group '{rule.Group}'; valid: {List(groups)}";

        var stats = inStrategy.Where(c => GateRule.IsWildcard(rule.Group) || Same(c.Metric.Group, rule.Group))
            .Select(c => c.Metric.Statistic).Distinct(StringComparer.OrdinalIgnoreCase).ToArray();
        var of = GateRule.IsWildcard(rule.Group) ? "" : $" of '{rule.Group}'";
        return $"rule '{rule.Text}': unknown statistic '{rule.Statistic}'{of}; valid: {List(stats)}";
    }

    private static bool Same(string a, string b) => string.Equals(a, b, StringComparison.OrdinalIgnoreCase);

    private static string List(IEnumerable<string> names)
    {
        var list = string.Join(", ", names);
        return list.Length == 0 ? "(none)" : list;
    }
}
