using System.Text.RegularExpressions;
using VoxProf.Core.Statistics;
using VoxProf.Core.Traversal;

namespace VoxProf.Core.Strategies;

/// <summary>
/// What a strategy's or an extra counter's name may be: it is typed on the command line and becomes part of file
/// names, so lower-case letters, digits and single hyphens, starting with a letter, at most 32 characters.
/// </summary>
public static partial class StrategyNameRules
{
    public const int MaxLength = 32;

    [GeneratedRegex("^[a-z][a-z0-9]*(-[a-z0-9]+)*$")]
    private static partial Regex Pattern();

    /// <summary>Null when <paramref name="name"/> is a valid name, else what is wrong with it.</summary>
    public static string? Problem(string? name)
    {
        if (string.IsNullOrEmpty(name))
            return "a name is required";
        if (name.Length > MaxLength)
            return $"'{name}' is longer than {MaxLength} characters";
        return Pattern().IsMatch(name) ? null : $"'{name}' must be lower-case letters, digits and single hyphens, starting with a letter";
    }

    internal static void ThrowIfInvalid(string name, string? source)
    {
        if (Problem(name) is { } problem)
            throw new StrategyDefinitionException($"{source ?? "built-in strategy"}: strategy name {problem}");
    }

    /// <summary>Checks a strategy's extra counters: at most <see cref="ExtraCounts.Capacity"/>, valid names, none
    /// taken by a built-in counter or measure, none twice.</summary>
    internal static IReadOnlyList<ExtraCounter> CheckCounters(string strategy, IReadOnlyList<ExtraCounter>? counters)
    {
        counters ??= [];
        if (counters.Count > ExtraCounts.Capacity)
            throw new StrategyDefinitionException($"strategy '{strategy}' declares {counters.Count} counters of its own; at most {ExtraCounts.Capacity} are allowed");
        var seen = new HashSet<string>(StringComparer.OrdinalIgnoreCase);
        foreach (ExtraCounter c in counters)
        {
            if (c is null)
                throw new StrategyDefinitionException($"strategy '{strategy}': a counter of its own is null");
            if (Problem(c.Name) is { } problem)
                throw new StrategyDefinitionException($"strategy '{strategy}': counter name {problem}");
            if (Measures.All.Any(m => string.Equals(m.Name, c.Name, StringComparison.OrdinalIgnoreCase)))
                throw new StrategyDefinitionException($"strategy '{strategy}': counter '{c.Name}' is the name of a built-in counter or measure");
            if (!seen.Add(c.Name))
                throw new StrategyDefinitionException($"strategy '{strategy}': counter '{c.Name}' is declared twice");
        }
        return [.. counters];
    }
}

/// <summary>A strategy whose declaration breaks a rule (its name, its counters, a clash with another strategy).</summary>
public sealed class StrategyDefinitionException(string message) : InputException(message);
