using System.Reflection;
using System.Runtime.Loader;
using Microsoft.CodeAnalysis;
using Microsoft.CodeAnalysis.CSharp;

namespace VoxProf.Core.Strategies;

/// <summary>
/// Loads user strategies: a C# file compiled in-process with the Roslyn compiler (release-optimised, against the .NET
/// runtime and VoxProf.Core's public API), or an already built library. Every public struct implementing
/// <see cref="IStrategy"/> becomes a strategy. Loading runs the user's code, as a test run would: VoxProf compiles
/// and loads only the files it is given (docs/writing-a-strategy.md).
/// </summary>
public static class StrategyFiles
{
    /// <summary>Most compiler errors reported for one file.</summary>
    public const int MaxErrors = 20;

    /// <summary>Compiles <paramref name="path"/>; throws <see cref="StrategyCompileException"/> on compiler errors.</summary>
    public static IReadOnlyList<StrategyDefinition> Compile(string path)
    {
        string text = ReadText(path);
        SyntaxTree tree = CSharpSyntaxTree.ParseText(text, new CSharpParseOptions(LanguageVersion.Latest), path: path);
        var compilation = CSharpCompilation.Create(
            "voxprof-strategies-" + Path.GetFileNameWithoutExtension(path),
            [tree, ImplicitUsings],
            References.Value,
            new CSharpCompilationOptions(OutputKind.DynamicallyLinkedLibrary, optimizationLevel: OptimizationLevel.Release,
                nullableContextOptions: NullableContextOptions.Enable));
        using var image = new MemoryStream();
        var emitted = compilation.Emit(image);
        var errors = emitted.Diagnostics.Where(d => d.Severity == DiagnosticSeverity.Error).ToList();
        if (!emitted.Success)
        {
            string[] lines = [.. errors.Take(MaxErrors).Select(d => d.ToString())];
            throw new StrategyCompileException(path, lines, errors.Count);
        }
        IReadOnlyList<string> fixedBranching = FixedBranchingCheck.Problems(compilation, tree, path);
        if (fixedBranching.Count > 0)
            throw new StrategyCompileException(path, [.. fixedBranching.Take(MaxErrors)], fixedBranching.Count, "error");
        image.Position = 0;
        var context = new AssemblyLoadContext("voxprof:" + path, isCollectible: false);
        return FromAssembly(context.LoadFromStream(image), path);
    }

    /// <summary>Loads the strategies of a built library (its own load context, so its dependencies stay its own).</summary>
    public static IReadOnlyList<StrategyDefinition> LoadAssembly(string path)
    {
        string full = Path.GetFullPath(path);
        if (!File.Exists(full))
            throw new InputException($"{path}: no such strategy assembly");
        Assembly assembly;
        try
        {
            assembly = new StrategyLoadContext(full).LoadFromAssemblyPath(full);
        }
        catch (Exception ex) when (ex is BadImageFormatException or FileLoadException)
        {
            throw new InputException($"{path}: not a .NET library ({ex.Message})");
        }
        // Loading runs none of the library's code; reading its strategies' names below does, so the check comes first.
        IReadOnlyList<string> fixedBranching;
        try
        {
            fixedBranching = FixedBranchingIl.Problems(full, path);
        }
        catch (BadImageFormatException ex)
        {
            throw new InputException($"{path}: its method bodies cannot be read ({ex.Message}); build it with the .NET SDK");
        }
        if (fixedBranching.Count > 0)
            throw new StrategyCompileException(path, [.. fixedBranching.Take(MaxErrors)], fixedBranching.Count, "error");
        return FromAssembly(assembly, path);
    }

    /// <summary>Every public non-generic struct of <paramref name="assembly"/> implementing <see cref="IStrategy"/>.</summary>
    internal static IReadOnlyList<StrategyDefinition> FromAssembly(Assembly assembly, string source)
    {
        Type[] types;
        try
        {
            types = assembly.GetExportedTypes();
        }
        catch (Exception ex) when (ex is ReflectionTypeLoadException or FileNotFoundException or FileLoadException)
        {
            throw new InputException($"{source}: its types cannot be loaded ({ex.Message}); build it against this VoxProf.Core");
        }
        var found = types
            .Where(t => t.IsValueType && !t.IsGenericTypeDefinition && typeof(IStrategy).IsAssignableFrom(t))
            .OrderBy(t => t.FullName, StringComparer.Ordinal)
            .ToList();
        if (found.Count == 0)
            throw new InputException($"{source}: defines no strategy; expected a public struct implementing {typeof(IStrategy).FullName}");
        var definitions = new List<StrategyDefinition>();
        foreach (Type t in found)
        {
            try
            {
                definitions.Add(StrategyDefinition.Of(t, source));
            }
            catch (TargetInvocationException ex) when (ex.InnerException is StrategyDefinitionException inner)
            {
                throw new StrategyDefinitionException($"{source}: {t.Name}: {inner.Message}");
            }
            catch (TargetInvocationException ex)
            {
                throw new InputException($"{source}: {t.Name}: reading its name and counters failed: {ex.InnerException?.Message ?? ex.Message}");
            }
        }
        var names = new HashSet<string>(StringComparer.OrdinalIgnoreCase);
        foreach (StrategyDefinition d in definitions)
        {
            if (!names.Add(d.Name))
                throw new StrategyDefinitionException($"{source}: two strategies are named '{d.Name}'");
        }
        return definitions;
    }

    /// <summary>The namespaces a new .NET project imports by default, so a strategy file reads like one of its files.</summary>
    private static readonly SyntaxTree ImplicitUsings = CSharpSyntaxTree.ParseText(
        "global using System; global using System.Collections.Generic; global using System.Linq;",
        new CSharpParseOptions(LanguageVersion.Latest), path: "implicit-usings.cs");

    private static string ReadText(string path)
    {
        try
        {
            return File.ReadAllText(path);
        }
        catch (Exception ex) when (ex is FileNotFoundException or DirectoryNotFoundException)
        {
            throw new InputException($"{path}: no such strategy file");
        }
    }

    /// <summary>The runtime's own assemblies and VoxProf.Core: what a strategy file may use, and nothing of the rest of the tool.</summary>
    private static readonly Lazy<MetadataReference[]> References = new(() =>
        [.. RuntimeAssemblies.OfProcess().Append(typeof(IStrategy).Assembly.Location).Distinct().Select(p => MetadataReference.CreateFromFile(p))]);

    /// <summary>Resolves a library's own dependencies beside it; VoxProf.Core and the runtime come from the tool.</summary>
    private sealed class StrategyLoadContext(string path) : AssemblyLoadContext("voxprof:" + path)
    {
        private readonly AssemblyDependencyResolver _resolver = new(path);

        protected override Assembly? Load(AssemblyName name)
        {
            if (name.Name == typeof(IStrategy).Assembly.GetName().Name)
                return null;
            return _resolver.ResolveAssemblyToPath(name) is { } p ? LoadFromAssemblyPath(p) : null;
        }
    }
}

/// <summary>
/// A strategy file that did not compile, or that <see cref="FixedBranchingCheck"/> refused: the errors, one line each,
/// as the compiler prints them.
/// </summary>
public sealed class StrategyCompileException(string file, IReadOnlyList<string> errors, int total, string kind = "compile error")
    : InputException($"{file}: {total} {kind}{(total == 1 ? "" : "s")}{(total > errors.Count ? $", the first {errors.Count} shown" : "")}")
{
    /// <summary>"FILE(LINE,COL): error CSxxxx: message", at most <see cref="StrategyFiles.MaxErrors"/>.</summary>
    public IReadOnlyList<string> Errors { get; } = errors;
}
