using System.Text.Json.Nodes;
using System.Text.RegularExpressions;

namespace VoxProf.Tests.Cli.Commands;

/// <summary>Compares two run folders file by file, allowing only timings to differ.</summary>
public static partial class RunFolders
{
    /// <summary>Every file's path relative to the folder ('/' separated), manifest.json left out.</summary>
    public static IReadOnlyList<string> Files(string folder) =>
        Directory.GetFiles(folder, "*", SearchOption.AllDirectories).Where(f => Path.GetFileName(f) != "manifest.json")
            .Select(f => Path.GetRelativePath(folder, f).Replace('\\', '/')).Order(StringComparer.Ordinal).ToArray();

    /// <summary>
    /// The same files, byte for byte, except that report.json's "timings" object and the facts report.html shows from
    /// it (tree build, trace and memory model times, threads) may differ. manifest.json differs by its run id and those files' hashes.
    /// </summary>
    public static void ShouldMatchButForTimings(string actual, string expected)
    {
        Files(actual).Should().Equal(Files(expected));
        foreach (string name in Files(expected))
        {
            byte[] want = File.ReadAllBytes(Path.Combine(expected, name));
            byte[] got = File.ReadAllBytes(Path.Combine(actual, name));
            if (name.EndsWith(".json", StringComparison.Ordinal) || name.EndsWith(".html", StringComparison.Ordinal))
                WithoutTimings(name, got).Should().Be(WithoutTimings(name, want), name);
            else
                got.Should().Equal(want, name);
        }
    }

    private static string WithoutTimings(string name, byte[] bytes)
    {
        string text = System.Text.Encoding.UTF8.GetString(bytes);
        if (name.EndsWith(".html", StringComparison.Ordinal))
            return TimingFacts().Replace(text, "");
        var node = JsonNode.Parse(text)!.AsObject();
        node.Remove("timings");
        return node.ToJsonString();
    }

    [GeneratedRegex("<div><dt>(?:tree build|trace [^<]*|memory model [^<]*|threads)</dt><dd>[^<]*</dd></div>")]
    private static partial Regex TimingFacts();
}
