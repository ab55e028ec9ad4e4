using VoxProf.Core;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Compare;

/// <summary>
/// A strategy of the base compared with a strategy of the candidate (compare --pair BASE=CANDIDATE, or --within in
/// one run). Its rows, difference heatmaps and gate rules go by <see cref="Label"/>, "dda=dda-mask".
/// </summary>
public sealed record StrategyPair(string Base, string Candidate)
{
    public const char Separator = '=';

    public string Label => Base + Separator + Candidate;

    /// <summary>"dda=dda-mask", or several joined by commas; each side a strategy name.</summary>
    public static IReadOnlyList<StrategyPair> Parse(IEnumerable<string> texts, string option = "--pair")
    {
        var pairs = new List<StrategyPair>();
        foreach (string text in texts)
        {
            foreach (string raw in text.Split(','))
            {
                string[] sides = raw.Trim().Split(Separator);
                if (sides.Length != 2 || sides.Any(s => !Metrics.MetricDescriptor.IsValidName(s.Trim().ToLowerInvariant())))
                    throw new InputException($"{option}: '{MessageText.Excerpt(raw.Trim())}' is not valid, expected BASE=CANDIDATE strategy names (e.g. dda=dda-mask)");
                var pair = new StrategyPair(sides[0].Trim().ToLowerInvariant(), sides[1].Trim().ToLowerInvariant());
                if (pairs.Any(p => p.Label == pair.Label))
                    continue;
                pairs.Add(pair);
            }
        }
        return pairs;
    }

    /// <summary>--within A,B: two strategies of one run, A the base.</summary>
    public static StrategyPair Within(string text)
    {
        string[] names = text.Split(',').Select(n => n.Trim().ToLowerInvariant()).ToArray();
        if (names.Length != 2 || names.Any(n => !Metrics.MetricDescriptor.IsValidName(n)) || names[0] == names[1])
            throw new InputException($"--within: '{MessageText.Excerpt(text)}' is not valid, expected two different strategies BASE,CANDIDATE of the run (e.g. dda,dda-mask)");
        return new StrategyPair(names[0], names[1]);
    }

    /// <summary>
    /// The two reports with only the paired strategies, each renamed to its pair's label, so the comparison pairs
    /// them by name as it pairs a strategy with itself. A name missing from its report is an <see cref="InputException"/>.
    /// </summary>
    public static (LoadedReport Base, LoadedReport Candidate) Apply(LoadedReport @base, LoadedReport candidate, IReadOnlyList<StrategyPair> pairs)
    {
        return (Keep(@base, pairs, p => p.Base, "base"), Keep(candidate, pairs, p => p.Candidate, "candidate"));
    }

    private static LoadedReport Keep(LoadedReport report, IReadOnlyList<StrategyPair> pairs, Func<StrategyPair, string> side, string which)
    {
        ReportDocument d = report.Document;
        var strategies = new List<StrategyReport>();
        foreach (StrategyPair p in pairs)
        {
            StrategyReport s = d.Strategies.FirstOrDefault(x => string.Equals(x.Name, side(p), StringComparison.OrdinalIgnoreCase))
                ?? throw new InputException($"{report.File}: no strategy '{side(p)}' in the {which} report for the pair {p.Label}; it holds {string.Join(", ", d.Strategies.Select(x => x.Name))}");
            strategies.Add(s with { Name = p.Label });
        }
        return report with
        {
            Document = d with { Strategies = strategies, Run = d.Run with { Strategies = pairs.Select(p => p.Label).ToArray() } },
        };
    }
}
