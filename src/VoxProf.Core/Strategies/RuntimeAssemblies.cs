using System.Runtime.InteropServices;
using Microsoft.Extensions.DependencyModel;

namespace VoxProf.Core.Strategies;

/// <summary>
/// The .NET runtime's own assemblies among those the process may load: what a strategy file compiles against, beside
/// VoxProf.Core. A framework-dependent program (tests, <c>dotnet run</c>) finds them in the shared runtime's folder. A
/// self-contained one (the published command) holds them in its own folder beside the tool's libraries, and only its
/// deps file tells them apart: there they are the runtime pack's. Without that, a strategy file could compile against
/// the tool's report writer, image library and compiler.
/// </summary>
internal static class RuntimeAssemblies
{
    /// <summary>The library type a deps file gives the runtime a self-contained program carries.</summary>
    private const string RuntimePack = "runtimepack";

    /// <summary>The runtime's assemblies of this process.</summary>
    public static IReadOnlyList<string> OfProcess()
    {
        string tpa = (string?)AppContext.GetData("TRUSTED_PLATFORM_ASSEMBLIES") ?? "";
        return Select(tpa.Split(Path.PathSeparator, StringSplitOptions.RemoveEmptyEntries), RuntimeEnvironment.GetRuntimeDirectory(),
            DependencyContext.Default);
    }

    /// <summary>
    /// Of <paramref name="trusted"/>, the files <paramref name="deps"/> names as a runtime pack's when it names any (a
    /// self-contained program), else those under <paramref name="runtimeDirectory"/>.
    /// </summary>
    internal static IReadOnlyList<string> Select(IEnumerable<string> trusted, string runtimeDirectory, DependencyContext? deps)
    {
        var packFiles = new HashSet<string>(StringComparer.Ordinal);
        foreach (RuntimeLibrary library in deps?.RuntimeLibraries ?? [])
        {
            if (library.Type == RuntimePack)
                packFiles.UnionWith(library.RuntimeAssemblyGroups.SelectMany(g => g.AssetPaths).Select(Path.GetFileName).OfType<string>());
        }
        return packFiles.Count > 0
            ? [.. trusted.Where(p => packFiles.Contains(Path.GetFileName(p)))]
            : [.. trusted.Where(p => p.StartsWith(runtimeDirectory, StringComparison.Ordinal))];
    }
}
