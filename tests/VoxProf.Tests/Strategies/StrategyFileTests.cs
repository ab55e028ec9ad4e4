using System.Text.RegularExpressions;
using VoxProf.Core;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;

namespace VoxProf.Tests.Strategies;

public sealed class StrategyFileTests : IDisposable
{
    private readonly string _dir = Path.Combine(Path.GetTempPath(), $"voxprof-strategy-{Guid.NewGuid():N}");

    public StrategyFileTests() => Directory.CreateDirectory(_dir);

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    private string Write(string name, string text)
    {
        string path = Path.Combine(_dir, name);
        File.WriteAllText(path, text);
        return path;
    }

    private const string Header = "using VoxProf.Core.Rays;\nusing VoxProf.Core.Strategies;\nusing VoxProf.Core.Traversal;\nusing VoxProf.Core.Trees;\n";

    /// <summary>A strategy that counts one iteration and hits nothing, under a given name and with given counters.</summary>
    private static string Strategy(string type, string name, string counters = "") =>
        StrategySource.Struct(type, name, "        counters.Iteration();", counters);

    [Fact]
    public void A_file_that_does_not_compile_gives_the_compilers_file_line_and_column_for_each_error()
    {
        string path = Write("broken.cs", Header + "public struct Broken : IStrategy\n{\n    public static string Name => \"broken\"\n}\n");
        var ex = FluentActions.Invoking(() => StrategyFiles.Compile(path)).Should().Throw<StrategyCompileException>().Which;
        ex.Errors.Should().NotBeEmpty();
        // The format of the C# compiler's own diagnostics: FILE(LINE,COL): error CSNNNN: message.
        ex.Errors.Should().OnlyContain(l => Regex.IsMatch(l, $@"^{Regex.Escape(path)}\(\d+,\d+\): error CS\d{{4}}: \S"));
        // Line 7 (after the four using lines and two of the struct) lacks its semicolon.
        ex.Errors.Should().Contain(l => l.StartsWith($"{path}(7,") && l.Contains("error CS1002"));
        ex.Message.Should().StartWith($"{path}: ");
    }

    [Fact]
    public void At_most_twenty_compiler_errors_are_listed_and_the_total_is_given()
    {
        string body = string.Concat(Enumerable.Range(0, 30).Select(i => $"public class C{i} {{ int F() => undefined{i}; }}\n"));
        string path = Write("many.cs", body);
        var ex = FluentActions.Invoking(() => StrategyFiles.Compile(path)).Should().Throw<StrategyCompileException>().Which;
        ex.Errors.Should().HaveCount(StrategyFiles.MaxErrors);
        ex.Message.Should().Be($"{path}: 30 compile errors, the first 20 shown");
    }

    [Fact]
    public void A_file_may_define_several_strategies_each_with_counters_of_its_own()
    {
        string path = Write("two.cs", Header + Strategy("A", "walk-a", "public static IReadOnlyList<ExtraCounter> ExtraCounters => [new(\"probes\", \"p\")];")
            + Strategy("B", "walk-b"));
        var defs = StrategyFiles.Compile(path);
        defs.Select(d => d.Name).Should().Equal("walk-a", "walk-b");
        defs[0].CounterNames.Should().HaveCount(CounterNames.Count + 1).And.EndWith("probes");
        defs[1].ExtraCounters.Should().BeEmpty();
        defs.Should().OnlyContain(d => d.Source == path && d.UsesPrepass);
    }

    [Theory]
    [InlineData("dda", "strategy name 'dda' is already a built-in strategy's name")]
    [InlineData("Walk", "'Walk' must be lower-case letters")]
    [InlineData("my--walk", "'my--walk' must be lower-case letters")]
    [InlineData("a-very-long-strategy-name-over-32-chars", "is longer than 32 characters")]
    public void Strategy_names_are_checked_like_built_in_names_and_never_clash(string name, string message)
    {
        string path = Write("named.cs", Header + Strategy("S", name));
        var catalog = new StrategyCatalog();
        FluentActions.Invoking(() => catalog.Add(StrategyFiles.Compile(path)))
            .Should().Throw<StrategyDefinitionException>().Which.Message.Should().Contain(message).And.StartWith(path);
    }

    [Theory]
    [InlineData("[new(\"iterations\", \"x\")]", "counter 'iterations' is the name of a built-in counter or measure")]
    [InlineData("[new(\"a\", \"x\"), new(\"a\", \"y\")]", "counter 'a' is declared twice")]
    [InlineData("[new(\"c1\",\"\"),new(\"c2\",\"\"),new(\"c3\",\"\"),new(\"c4\",\"\"),new(\"c5\",\"\"),new(\"c6\",\"\"),new(\"c7\",\"\"),new(\"c8\",\"\"),new(\"c9\",\"\")]",
        "declares 9 counters of its own; at most 8 are allowed")]
    public void Counters_of_a_strategys_own_are_checked(string counters, string message)
    {
        string path = Write("counters.cs", Header + Strategy("S", "counting", $"public static IReadOnlyList<ExtraCounter> ExtraCounters => {counters};"));
        FluentActions.Invoking(() => StrategyFiles.Compile(path))
            .Should().Throw<StrategyDefinitionException>().Which.Message.Should().Contain(message);
    }

    [Fact]
    public void Built_in_names_pass_the_rules_strategy_files_are_held_to()
    {
        BuiltInStrategies.All.Should().OnlyContain(s => StrategyNameRules.Problem(s.Name) == null);
        new StrategyCatalog().ValidList.Should().Be("grid, slab, dda, dda-mask, hdda");
    }

    [Fact]
    public void Two_strategies_of_one_name_in_one_file_or_a_file_without_one_are_refused()
    {
        string twice = Write("twice.cs", Header + Strategy("A", "same") + Strategy("B", "same"));
        FluentActions.Invoking(() => StrategyFiles.Compile(twice)).Should().Throw<StrategyDefinitionException>()
            .WithMessage($"{twice}: two strategies are named 'same'");
        string none = Write("none.cs", "public class Nothing { }");
        FluentActions.Invoking(() => StrategyFiles.Compile(none)).Should().Throw<InputException>()
            .WithMessage($"{none}: defines no strategy*");
        FluentActions.Invoking(() => StrategyFiles.Compile(Path.Combine(_dir, "missing.cs"))).Should().Throw<InputException>()
            .WithMessage("*missing.cs: no such strategy file");
    }
}
