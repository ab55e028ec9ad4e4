namespace VoxProf.Core.Strategies;

/// <summary>
/// The strategies one run can name: the built-in ones, then those loaded from strategy files or assemblies, in that
/// order. Names are unique, compared without case, so no loaded strategy can shadow a built-in one.
/// </summary>
public sealed class StrategyCatalog
{
    private readonly List<StrategyDefinition> _all = [.. BuiltInStrategies.All];

    public IReadOnlyList<StrategyDefinition> All => _all;

    /// <summary>Comma-separated names, for error messages and help.</summary>
    public string ValidList => string.Join(", ", _all.Select(s => s.Name));

    /// <summary>Adds loaded strategies; throws <see cref="StrategyDefinitionException"/> on a name already taken.</summary>
    public void Add(IEnumerable<StrategyDefinition> strategies)
    {
        foreach (StrategyDefinition s in strategies)
        {
            if (Find(s.Name) is { } taken)
            {
                string where = taken.Source is null ? "a built-in strategy" : $"a strategy from {taken.Source}";
                throw new StrategyDefinitionException($"{s.Source}: strategy name '{s.Name}' is already {where}'s name; choose another");
            }
            _all.Add(s);
        }
    }

    public StrategyDefinition? Find(string name) =>
        _all.FirstOrDefault(s => string.Equals(s.Name, name, StringComparison.OrdinalIgnoreCase));

    public bool TryParse(string text, out StrategyDefinition strategy)
    {
        strategy = Find(text)!;
        return strategy is not null;
    }
}
