using System.Reflection;
using System.Reflection.Emit;
using System.Text.Json;
using System.Text.RegularExpressions;
using Microsoft.CodeAnalysis;
using Microsoft.CodeAnalysis.CSharp;
using VoxProf.Cli;
using VoxProf.Core.Strategies;
using VoxProf.Tests.Cli.Commands;

namespace VoxProf.Tests.Strategies;

/// <summary>
/// trace --strategy-assembly: a built library of strategies, here compiled by the test with the C# compiler into a
/// real .dll on disk, loaded, checked and traced as a user's project output would be.
/// </summary>
public sealed class StrategyLibraryTests : IDisposable
{
    private readonly SampleRun _run = new("slib");
    private static readonly string Scene = SampleRun.Scene;

    public void Dispose() => _run.Dispose();

    private int Run(params string[] args) => _run.Run(args);

    /// <summary>Compiles <paramref name="source"/> into DIR/NAME.dll against the runtime and VoxProf.Core, as a class library project would.</summary>
    private string Library(string name, string source)
    {
        var compilation = CSharpCompilation.Create(name, [CSharpSyntaxTree.ParseText(source)],
            RuntimeAssemblies.OfProcess().Append(typeof(IStrategy).Assembly.Location).Distinct().Select(p => MetadataReference.CreateFromFile(p)),
            new CSharpCompilationOptions(OutputKind.DynamicallyLinkedLibrary, optimizationLevel: OptimizationLevel.Release));
        string path = _run.In(name + ".dll");
        var emitted = compilation.Emit(path);
        emitted.Success.Should().BeTrue(string.Join("\n", emitted.Diagnostics));
        return path;
    }

    private const string Usings = "using System;\n" + StrategySource.Usings + "using VoxProf.Core.Trees;\n";

    [Theory]
    [InlineData("4")]
    [InlineData("8")]
    public void A_library_that_passes_its_branching_on_traces_beside_the_built_ins_and_agrees_with_grid(string branching)
    {
        string lib = Library("Walks", Usings + StrategySource.Struct("LibWalk", "lib-walk",
            "        counters = HddaStrategy.Trace<TBranching, TCounters>(view, ray, tMin, path, ref hit);"));
        string outDir = _run.In("out");

        int code = Run("trace", Scene, "--strategy-assembly", lib, "--strategy", "grid,hdda,lib-walk", "--branching", branching,
            "--size", "40x20", "--no-html", "--quiet", "--out", outDir);

        code.Should().Be(ExitCodes.Ok, _run.Err.ToString());
        using var json = JsonDocument.Parse(File.ReadAllText(Path.Combine(outDir, "report.json")));
        var values = json.RootElement.GetProperty("strategies").EnumerateArray()
            .ToDictionary(s => s.GetProperty("name").GetString()!, s => s.GetProperty("values"));
        values["lib-walk"].GetProperty("mismatch").GetDouble().Should().Be(0);
        values["lib-walk"].GetProperty("total-iterations.mean").GetDouble()
            .Should().Be(values["hdda"].GetProperty("total-iterations.mean").GetDouble(), "it is hdda's loop, called from the library");
    }

    [Fact]
    public void A_library_that_names_a_branching_of_its_own_is_refused_before_its_code_runs_naming_each_method_that_does()
    {
        // Name's getter would throw if the library's code ran: the check reads the file, it does not load the types. A
        // branching type of the library's own is as fixed as VoxProf's (the file check refuses both).
        string source = Usings + """
            public struct Fixed : IStrategy
            {
                public static string Name => throw new InvalidOperationException("the library's code ran");
                public static string Description => "fixes the branching";
                public static TCounters Trace<TBranching, TCounters>(in TreeView view, in RaySetup ray, double tMin, Span<NodeRef> path, ref PixelHit hit)
                    where TBranching : struct, IBranching where TCounters : struct, ICostCounters
                {
                    TCounters counters = default;
                    NodeRef root = view.Fetch(0, ref counters);
                    if (view.IsOccupied<Branching4>(root, Cell()))
                        hit = default;
                    return HddaStrategy.Trace<Branching8, TCounters>(view, ray, tMin, path, ref hit);
                }
                private static int Cell() => NodeCells<Branching8>.Bit(1, 0, 0) + NodeCells<OwnBranching>.Last;
            }
            public struct OwnBranching : IBranching { public static int Log2N => 2; }
            """;
        string lib = Library("FixedWalks", source);

        int code = Run("trace", Scene, "--strategy-assembly", lib, "--size", "40x20", "--quiet", "--out", _run.In("out"));

        code.Should().Be(ExitCodes.BadInput);
        string tail = ", which fixes the branching; pass the TBranching type parameter Trace was given, which is the traced tree's (a fixed one reads the wrong node records on a tree of another branching)";
        _run.Err.ToString().Split('\n', StringSplitOptions.RemoveEmptyEntries).Should().Equal(
            $"{lib}: error: Fixed.Trace names HddaStrategy.Trace<Branching8, TCounters>{tail}",
            $"{lib}: error: Fixed.Trace names TreeView.IsOccupied<Branching4>{tail}",
            $"{lib}: error: Fixed.Cell names NodeCells<Branching8>.Bit{tail}",
            $"{lib}: error: Fixed.Cell names NodeCells<OwnBranching>.Last{tail}",
            $"voxprof: error: {lib}: 4 errors");
        Directory.Exists(_run.In("out")).Should().BeFalse();
    }

    [Fact]
    public void Every_method_body_of_the_runtimes_core_library_and_of_VoxProf_Core_is_read_to_its_end_without_a_finding()
    {
        // Thousands of bodies with every kind of operand (ECMA-335 III): an operand read at the wrong length would run
        // past a body's end or turn data into a token that is not in the tables, and the reader throws on either.
        FixedBranchingIl.Problems(typeof(object).Assembly.Location, "corelib").Should().BeEmpty();
        FixedBranchingIl.Problems(typeof(IStrategy).Assembly.Location, "core").Should().BeEmpty("VoxProf's own types are definitions there, not references");
    }

    [Fact]
    public void A_library_whose_method_bodies_cannot_be_read_is_refused_in_one_line()
    {
        // A body calling a method specification that is not in the tables: the loader accepts the file (it checks no
        // IL until a method runs), the check cannot read what the call names.
        var builder = new PersistedAssemblyBuilder(new AssemblyName("Garbled"), typeof(object).Assembly);
        var type = builder.DefineDynamicModule("Garbled").DefineType("Garbled", TypeAttributes.Public);
        var il = type.DefineMethod("Run", MethodAttributes.Public | MethodAttributes.Static).GetILGenerator();
        il.Emit(OpCodes.Call, 0x2B000999);
        il.Emit(OpCodes.Ret);
        type.CreateType();
        string lib = _run.In("Garbled.dll");
        builder.Save(lib);

        Run("trace", Scene, "--strategy-assembly", lib, "--quiet", "--out", _run.In("out")).Should().Be(ExitCodes.BadInput);

        _run.Err.ToString().Should().MatchRegex($@"^voxprof: error: {Regex.Escape(lib)}: its method bodies cannot be read \(.+\); build it with the \.NET SDK\n$");
    }

    [Fact]
    public void A_file_that_is_not_a_library_and_a_library_without_strategies_are_refused_in_one_line()
    {
        string text = _run.In("notes.dll");
        File.WriteAllText(text, "not a portable executable");
        Run("trace", Scene, "--strategy-assembly", text, "--quiet", "--out", _run.In("a")).Should().Be(ExitCodes.BadInput);
        _run.Err.ToString().Should().StartWith($"voxprof: error: {text}: not a .NET library (").And.EndWith(")\n");

        _run.Err.GetStringBuilder().Clear();
        string empty = Library("Empty", "public static class Helpers { public static int One => 1; }");
        Run("trace", Scene, "--strategy-assembly", empty, "--quiet", "--out", _run.In("b")).Should().Be(ExitCodes.BadInput);
        _run.Err.ToString().Should().Be($"voxprof: error: {empty}: defines no strategy; expected a public struct implementing VoxProf.Core.Strategies.IStrategy\n");
    }
}
