using System.Reflection;
using System.Runtime.InteropServices;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Export;

/// <summary>What the running tool is and where it runs, as reports record it.</summary>
public static class ToolInfo
{
    public const string UnknownCommit = "unknown";

    public static string Version { get; } =
        typeof(ToolInfo).Assembly.GetCustomAttribute<AssemblyInformationalVersionAttribute>()?.InformationalVersion.Split('+')[0] ?? "0.0.0";

    /// <summary>The git commit the assembly was built from (`git rev-parse HEAD` at build time), or "unknown".</summary>
    public static string Commit { get; } =
        typeof(ToolInfo).Assembly.GetCustomAttributes<AssemblyMetadataAttribute>()
            .FirstOrDefault(a => a.Key == "VoxProfCommit")?.Value is { Length: > 0 } commit ? commit : UnknownCommit;

    /// <summary>Build configuration of the assembly that holds the kernels: that is what sets the timings.</summary>
    public static string Configuration { get; } =
        typeof(Tracer).Assembly.GetCustomAttribute<AssemblyConfigurationAttribute>()?.Configuration ?? "unknown";

    public static EnvironmentInfo CurrentEnvironment() =>
        new(RuntimeInformation.FrameworkDescription, System.Environment.ProcessorCount, Configuration, RuntimeInformation.OSDescription);

    public static bool IsDebug(EnvironmentInfo e) => string.Equals(e.Configuration, "Debug", StringComparison.OrdinalIgnoreCase);

    public const string DebugWarning = "Debug build: timings are not representative; counts are still exact";
}
