using System.Security.Cryptography;
using System.Text.Json;
using VoxProf.Tests.Compare;

namespace VoxProf.Sweeps.Fuzz;

/// <summary>
/// Real processes killed mid-write and run side by side (issue 13): the report folder is always one whole run,
/// the previous one or the new one, compare accepts it, and the next run leaves nothing of the dead one behind.
/// </summary>
[Collection(RunsAlone.Name)]
public sealed class KillAndConcurrencyTests : IDisposable
{
    private static readonly string Scene = Path.Combine(AppContext.BaseDirectory, "samples", "hollow-shell.vpscene.json");

    private readonly TempDir _tmp = new();

    public void Dispose() => _tmp.Dispose();

    private string Folder => Path.Combine(_tmp.Path, "report");

    // Large enough that writing the heatmaps and pixel files takes a good part of the run.
    private static string[] TraceArgs(string folder, string size) =>
        ["trace", Scene, "--size", size, "--strategy", "grid,dda,hdda", "--per-pixel", "--quiet", "--out", folder];

    /// <summary>The folder holds exactly the files its manifest lists, each with the listed length and SHA-256.</summary>
    private static string WholeRun(string folder)
    {
        using var manifest = JsonDocument.Parse(File.ReadAllBytes(Path.Combine(folder, "manifest.json")));
        var listed = manifest.RootElement.GetProperty("files").EnumerateArray().ToDictionary(
            f => f.GetProperty("name").GetString()!, f => (f.GetProperty("bytes").GetInt64(), f.GetProperty("sha256").GetString()!));
        Directory.GetFiles(folder).Select(Path.GetFileName).Should().BeEquivalentTo(listed.Keys.Append("manifest.json"));
        foreach (var (name, (bytes, sha)) in listed)
        {
            byte[] content = File.ReadAllBytes(Path.Combine(folder, name));
            content.LongLength.Should().Be(bytes, name);
            Convert.ToHexStringLower(SHA256.HashData(content)).Should().Be(sha, name);
        }
        return manifest.RootElement.GetProperty("runId").GetString()!;
    }

    [Fact]
    public void A_trace_killed_at_any_moment_leaves_the_previous_run_or_the_new_one_whole()
    {
        ProcessRunner.Run(TraceArgs(Folder, "480x270")).Code.Should().Be(0);
        string first = WholeRun(Folder);
        var seen = new HashSet<string> { first };

        // Kill points spread over a run; whatever the moment, the folder must be one whole run.
        foreach (int delayMs in new[] { 150, 300, 450, 600, 800, 1000, 1300, 1700, 2200, 3000 })
        {
            using (var p = ProcessRunner.Start(TraceArgs(Folder, "480x270")))
            {
                if (!p.WaitForExit(delayMs))
                {
                    p.Kill(entireProcessTree: true);
                    p.WaitForExit();
                }
            }
            seen.Add(WholeRun(Folder));
        }

        // The next run cleans up what the killed ones left beside the folder, and compare accepts the result.
        ProcessRunner.Run(TraceArgs(Folder, "480x270")).Code.Should().Be(0);
        WholeRun(Folder);
        Directory.GetFileSystemEntries(_tmp.Path, ".report.voxprof-*").Select(Path.GetFileName).Should().BeEquivalentTo([".report.voxprof-lock"]);
        var compare = ProcessRunner.Run(["compare", Folder, Folder, "--out", Path.Combine(_tmp.Path, "cmp")]);
        compare.Code.Should().Be(0, compare.Error);
    }

    [Fact]
    public void Two_traces_into_one_folder_at_once_never_mix_and_a_refused_one_says_why()
    {
        for (int round = 0; round < 3; round++)
        {
            using var a = ProcessRunner.Start(TraceArgs(Folder, "320x180"));
            using var b = ProcessRunner.Start(TraceArgs(Folder, "320x180"));
            string errorA = a.StandardError.ReadToEnd(), errorB = b.StandardError.ReadToEnd();
            a.WaitForExit();
            b.WaitForExit();

            foreach (var (code, error) in new[] { (a.ExitCode, errorA), (b.ExitCode, errorB) })
            {
                code.Should().BeOneOf(0, 2);
                if (code == 2)
                    error.Should().Contain("another voxprof run is writing this folder");
            }
            WholeRun(Folder);
        }
    }
}
