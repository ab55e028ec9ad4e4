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
    /// <summary>
    /// Used when no rule is given: mean total loop iterations (the pixel's own and its share of the prepass's) and
    /// the 32-lane mean tile maximum may rise 5%, and no strategy may hit differently from grid on a pixel more than
    /// it did: a change that saves work by losing hits is worse, not better (skipped where grid was not traced).
    /// </summary>
    public static readonly IReadOnlyList<string> Default = ["all.total-iterations.mean:5%", "all.subgroup32.tile-max-mean:5%", "all.mismatch:0"];

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
        var b = comparison.Base.Document;
        var c = comparison.Candidate.Document;
        if (!GateRule.IsWildcard(rule.Strategy) && !comparison.Strategies.Contains(rule.Strategy, StringComparer.OrdinalIgnoreCase))
        {
            bool inBase = b.Strategies.Any(s => Same(s.Name, rule.Strategy));
            if (inBase || c.Strategies.Any(s => Same(s.Name, rule.Strategy)))
            {
                var (side, other, otherNames) = inBase ? ("base", "candidate", c.Strategies) : ("candidate", "base", b.Strategies);
                return $"rule '{rule.Text}': strategy '{rule.Strategy}' is in the {side} report only (the {other} holds {List(otherNames.Select(s => s.Name))}), so the rule cannot be checked";
            }
            return $"rule '{rule.Text}': unknown strategy '{rule.Strategy}'; strategies in both reports: {List(comparison.Strategies)}";
        }

        bool InStrategy(string strategy) => GateRule.IsWildcard(rule.Strategy) || Same(strategy, rule.Strategy);
        var uncompared = comparison.NotComparedMetrics.Where(n => InStrategy(n.Strategy) && rule.MatchesMetric(n.Metric)).ToArray();
        if (uncompared.Length > 0)
        {
            var n = uncompared[0];
            return $"rule '{rule.Text}': {n.Strategy}.{n.Metric} is not compared ({n.Reason}), so the rule cannot be checked";
        }

        string? oneSide = OneSide(rule, b.Metrics.Select(m => m.Name), c.Metrics.Select(m => m.Name), "base")
            ?? OneSide(rule, c.Metrics.Select(m => m.Name), b.Metrics.Select(m => m.Name), "candidate");
        if (oneSide is not null)
            return oneSide;

        var metrics = comparison.Changes.Where(x => InStrategy(x.Strategy)).Select(x => x.Metric).DistinctBy(m => m.Name).ToArray();
        var single = metrics.Where(m => m.Group is null).Select(m => m.Name).ToArray();
        var groups = metrics.Where(m => m.Group is not null).Select(m => m.Group!).Distinct(StringComparer.Ordinal).ToArray();
        string valid = $"valid: {List(single)}, or GROUP.STATISTIC with GROUP one of {List(groups)}";
        string[] parts = rule.Metric.Split('.');
        if (parts.Length == 1)
            return $"rule '{rule.Text}': unknown metric '{rule.Metric}'; {valid}";
        if (!GateRule.IsWildcard(parts[0]) && !groups.Contains(parts[0], StringComparer.OrdinalIgnoreCase))
            return $"rule '{rule.Text}': unknown metric group '{parts[0]}'; {valid}";
        var stats = metrics.Where(m => m.Group is not null && (GateRule.IsWildcard(parts[0]) || Same(m.Group, parts[0])))
            .Select(m => m.Statistic).Distinct(StringComparer.Ordinal).ToArray();
        var of = GateRule.IsWildcard(parts[0]) ? "" : $" of '{parts[0]}'";
        return $"rule '{rule.Text}': unknown statistic '{parts[1]}'{of}; valid: {List(stats)}";
    }

    // A metric the rule names that one report lists and the other does not: say so, rather than call it unknown.
    private static string? OneSide(GateRule rule, IEnumerable<string> side, IEnumerable<string> other, string sideName)
    {
        var missing = side.Where(rule.MatchesMetric).Except(other, StringComparer.Ordinal).ToArray();
        return missing.Length == 0
            ? null
            : $"rule '{rule.Text}': metric {List(missing)} is in the {sideName} report only, so the rule cannot be checked";
    }

    private static bool Same(string a, string b) => string.Equals(a, b, StringComparison.OrdinalIgnoreCase);

    private static string List(IEnumerable<string> names)
    {
        var list = string.Join(", ", names);
        return list.Length == 0 ? "(none)" : list;
    }
}
