using VoxProf.Core.Strategies;

namespace VoxProf.Tests.Strategies;

/// <summary>A strategy file must pass on the branching the tracer gives it, never name one of its own.</summary>
public sealed class FixedBranchingTests : IDisposable
{
    private readonly string _dir = Path.Combine(Path.GetTempPath(), $"voxprof-branching-{Guid.NewGuid():N}");

    public FixedBranchingTests() => Directory.CreateDirectory(_dir);

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    /// <summary>A strategy that fetches the root (line 13), then runs <paramref name="body"/> (line 14 on).</summary>
    private string Write(string body, string members = "")
    {
        string path = Path.Combine(_dir, "walk.cs");
        File.WriteAllText(path, StrategySource.Of("Walk", "fixed-walk", "        NodeRef root = view.Fetch(0, ref counters);\n" + body, members));
        return path;
    }

    [Theory]
    [InlineData("        if (view.IsOccupied<Branching4>(root, 0)) counters.Iteration();", "IsOccupied<Branching4>", 18)]
    [InlineData("        if (view.IsEmpty<Branching8>(root)) counters.Iteration();", "IsEmpty<Branching8>", 18)]
    [InlineData("        counters.Extra(0, (uint)NodeCells<Branching2>.N);", "NodeCells<Branching2>", 33)]
    [InlineData("        DdaStrategy.Trace<Branching4, TCounters>(view, ray, tMin, path, ref hit);", "Trace<Branching4>", 21)]
    public void A_branching_named_where_the_tracers_is_passed_on_is_refused_at_its_place(string body, string named, int column)
    {
        string path = Write(body);
        var ex = FluentActions.Invoking(() => StrategyFiles.Compile(path)).Should().Throw<StrategyCompileException>().Which;
        ex.Message.Should().Be($"{path}: 1 error");
        ex.Errors.Should().ContainSingle().Which.Should()
            .StartWith($"{path}(14,{column}): error: {named} fixes the branching; pass the TBranching type parameter Trace was given");
    }

    [Fact]
    public void The_tracers_branching_passed_on_through_a_helper_of_the_files_own_is_accepted()
    {
        string path = Write(
            "        if (Occupied<TBranching>(view, root) && NodeCells<TBranching>.N > 1) counters.Iteration();",
            "static bool Occupied<TB>(in TreeView view, NodeRef node) where TB : struct, IBranching => view.IsOccupied<TB>(node, 0);");
        StrategyFiles.Compile(path).Should().ContainSingle().Which.Name.Should().Be("fixed-walk");
    }
}
