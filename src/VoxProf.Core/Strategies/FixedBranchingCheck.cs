using Microsoft.CodeAnalysis;
using Microsoft.CodeAnalysis.CSharp.Syntax;
using VoxProf.Core.Traversal;

namespace VoxProf.Core.Strategies;

/// <summary>
/// Refuses a strategy file that names a branching of its own where VoxProf's API takes one (<c>IsOccupied&lt;Branching4&gt;</c>,
/// <c>NodeCells&lt;Branching8&gt;</c>) instead of passing on the <c>TBranching</c> the tracer gives <c>Trace</c>. The
/// tree view reads a node record as the branching says, without a check per read (the kernels' speed depends on
/// that), so a fixed 4³ read on an 8³ tree would read past the end of an empty array: wrong counts at best. The
/// compiler cannot see this; the type arguments can, so the file is refused at load time with the place named.
/// A library given with --strategy-assembly is held to the same rule by <see cref="FixedBranchingIl"/>.
/// </summary>
internal static class FixedBranchingCheck
{
    /// <summary>"FILE(LINE,COL): error: ..." for each generic name whose branching is a type rather than a type parameter.</summary>
    public static IReadOnlyList<string> Problems(Compilation compilation, SyntaxTree tree, string path)
    {
        INamedTypeSymbol? branching = compilation.GetTypeByMetadataName(typeof(IBranching).FullName!);
        if (branching is null)
            return [];
        SemanticModel model = compilation.GetSemanticModel(tree);
        var problems = new List<string>();
        foreach (GenericNameSyntax name in tree.GetRoot().DescendantNodes().OfType<GenericNameSyntax>())
        {
            ISymbol? symbol = model.GetSymbolInfo(name).Symbol;
            IEnumerable<ITypeSymbol> arguments = symbol switch
            {
                IMethodSymbol m => m.TypeArguments,
                INamedTypeSymbol t => t.TypeArguments,
                _ => [],
            };
            foreach (ITypeSymbol argument in arguments)
            {
                if (argument is ITypeParameterSymbol || !argument.AllInterfaces.Contains(branching, SymbolEqualityComparer.Default))
                    continue;
                FileLinePositionSpan at = name.GetLocation().GetLineSpan();
                problems.Add($"{path}({at.StartLinePosition.Line + 1},{at.StartLinePosition.Character + 1}): error: " +
                    $"{name.Identifier.Text}<{argument.Name}> fixes the branching; pass the TBranching type parameter Trace was given, " +
                    "which is the traced tree's (a fixed one reads the wrong node records on a tree of another branching)");
            }
        }
        return problems;
    }
}
