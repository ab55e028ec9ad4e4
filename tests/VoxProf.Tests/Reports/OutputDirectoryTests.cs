using System.Security.Cryptography;
using System.Text;
using System.Text.Json;
using VoxProf.Core;
using VoxProf.Reports.Export;
using VoxProf.Tests.Compare;

namespace VoxProf.Tests.Reports;

/// <summary>
/// The output folder is all or nothing: a run killed mid-write leaves the previous folder whole, two runs never
/// mix their files, a second writer is turned away while the first runs, and dead runs' leftovers are cleaned up.
/// </summary>
public sealed class OutputDirectoryTests : IDisposable
{
    private readonly TempDir _tmp = new();

    private string Folder => Path.Combine(_tmp.Path, "report");

    public void Dispose() => _tmp.Dispose();

    private static void WriteRun(string folder, params (string Name, string Text)[] files)
    {
        using var output = OutputDirectory.Open(folder);
        foreach (var (name, text) in files)
            output.WriteText(name, w => w.Write(text));
        output.Commit();
    }

    private string[] Hidden() => Directory.GetFileSystemEntries(_tmp.Path, ".report.voxprof-*").Select(Path.GetFileName).ToArray()!;

    [Fact]
    public void A_run_that_ends_before_its_commit_leaves_the_previous_folder_exactly_as_it_was()
    {
        WriteRun(Folder, ("report.json", "old"), ("summary.csv", "old"));

        using (var output = OutputDirectory.Open(Folder))
        {
            output.WriteText("report.json", w => w.Write("new"));
            output.WriteText("heatmap-dda-iterations.png", w => w.Write("new"));
            // Killed here: no commit.
        }

        File.ReadAllText(Path.Combine(Folder, "report.json")).Should().Be("old");
        Directory.GetFiles(Folder).Select(Path.GetFileName).Should().BeEquivalentTo(["report.json", "summary.csv", "manifest.json"]);
        Hidden().Should().BeEquivalentTo([".report.voxprof-lock"], "the unfinished run's folder is removed");
    }

    [Fact]
    public void A_committed_run_replaces_the_whole_folder_and_its_manifest_lists_every_file_with_length_and_hash()
    {
        WriteRun(Folder, ("report.json", "first"), ("heatmap-slab-iterations.png", "first"));
        WriteRun(Folder, ("report.json", "second run"));

        Directory.GetFiles(Folder).Select(Path.GetFileName).Should().BeEquivalentTo(["report.json", "manifest.json"]);
        using var manifest = JsonDocument.Parse(File.ReadAllBytes(Path.Combine(Folder, "manifest.json")));
        var file = manifest.RootElement.GetProperty("files").EnumerateArray().Should().ContainSingle().Subject;
        file.GetProperty("name").GetString().Should().Be("report.json");
        file.GetProperty("bytes").GetInt64().Should().Be(10);
        // SHA-256 of the bytes as written, from the runtime's own implementation (System.Security.Cryptography).
        file.GetProperty("sha256").GetString().Should().Be(Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes("second run"))));
        manifest.RootElement.GetProperty("runId").GetString().Should().MatchRegex("^[0-9a-f]{32}$");
    }

    [Fact]
    public void A_second_writer_is_refused_while_the_first_holds_the_folder_and_admitted_after()
    {
        using (var first = OutputDirectory.Open(Folder))
        {
            FluentActions.Invoking(() => OutputDirectory.Open(Folder)).Should().Throw<InputException>()
                .WithMessage($"{Folder}: another voxprof run is writing this folder (it holds {Path.Combine(_tmp.Path, ".report.voxprof-lock")}); wait for it to finish or choose another output folder");
            first.WriteText("report.json", w => w.Write("first"));
            first.Commit();
        }

        WriteRun(Folder, ("report.json", "second"));
        File.ReadAllText(Path.Combine(Folder, "report.json")).Should().Be("second");
    }

    [Fact]
    public void Leftovers_of_a_dead_run_are_removed_by_the_next_run_into_any_folder_beside_them()
    {
        string deadStage = Path.Combine(_tmp.Path, ".other.voxprof-stage-999999-0123456789abcdef");
        Directory.CreateDirectory(deadStage);
        File.WriteAllBytes(Path.Combine(deadStage, "pixels-grid.bin.gz"), new byte[1 << 20]);

        WriteRun(Folder, ("report.json", "x"));

        Directory.Exists(deadStage).Should().BeFalse("no live run holds the lock of 'other', so its stage folder is a dead run's");
    }

    [Fact]
    public void The_stage_folder_of_a_live_run_into_another_folder_is_left_alone()
    {
        string other = Path.Combine(_tmp.Path, "other");
        using var live = OutputDirectory.Open(other);
        live.WriteText("report.json", w => w.Write("in progress"));

        WriteRun(Folder, ("report.json", "x"));

        Directory.GetDirectories(_tmp.Path, ".other.voxprof-stage-*").Should().ContainSingle();
        live.Commit();
        File.ReadAllText(Path.Combine(other, "report.json")).Should().Be("in progress");
    }

    [Fact]
    public void A_folder_left_missing_by_a_swap_cut_short_gets_its_previous_copy_back()
    {
        string old = Path.Combine(_tmp.Path, ".report.voxprof-old-999999-0123456789abcdef");
        Directory.CreateDirectory(old);
        File.WriteAllText(Path.Combine(old, "report.json"), "previous");

        using (OutputDirectory.Open(Folder))
        {
            // Opening is enough: the old copy is put back before this run starts.
        }

        File.ReadAllText(Path.Combine(Folder, "report.json")).Should().Be("previous");
    }

    [Fact]
    public void A_folder_holding_files_voxprof_did_not_write_is_refused_and_left_alone()
    {
        Directory.CreateDirectory(Path.Combine(Folder, "src"));
        File.WriteAllText(Path.Combine(Folder, "report.json"), "looks like ours");

        FluentActions.Invoking(() => OutputDirectory.Open(Folder)).Should().Throw<InputException>()
            .WithMessage($"{Folder}: holds a folder voxprof did not write ('src'); *");
        Directory.Exists(Path.Combine(Folder, "src")).Should().BeTrue();
    }

    [Fact]
    public void A_file_added_to_a_report_folder_after_its_run_is_not_swapped_away()
    {
        WriteRun(Folder, ("report.json", "old"));
        File.WriteAllText(Path.Combine(Folder, "review-notes.txt"), "mine");

        FluentActions.Invoking(() => OutputDirectory.Open(Folder)).Should().Throw<InputException>()
            .WithMessage($"{Folder}: holds a file voxprof did not write ('review-notes.txt'); *");
        File.ReadAllText(Path.Combine(Folder, "review-notes.txt")).Should().Be("mine");
    }

    [Fact]
    public void A_folder_from_before_manifests_holding_only_voxprof_names_is_replaced()
    {
        Directory.CreateDirectory(Folder);
        foreach (string name in (string[])["report.json", "summary.md", "heatmap-dda-iterations.png", "pixels-dda.bin.gz", ".report.json.0123.tmp", "compare.csv", "diff-dda-iterations.png"])
            File.WriteAllText(Path.Combine(Folder, name), "old");

        WriteRun(Folder, ("report.json", "new"));

        Directory.GetFiles(Folder).Select(Path.GetFileName).Should().BeEquivalentTo(["report.json", "manifest.json"], "the old run's hidden temporary file went with it");
    }

    [Fact]
    public void A_link_to_a_folder_keeps_the_link_and_replaces_the_folder_it_points_to()
    {
        string real = Path.Combine(_tmp.Path, "real");
        Directory.CreateDirectory(real);
        Directory.CreateSymbolicLink(Folder, real);

        WriteRun(Folder, ("report.json", "through the link"));

        new DirectoryInfo(Folder).LinkTarget.Should().Be(real);
        File.ReadAllText(Path.Combine(real, "report.json")).Should().Be("through the link");
    }

    [Fact]
    public void A_mount_point_is_refused_because_it_cannot_be_swapped()
    {
        if (!File.Exists("/proc/self/mountinfo"))
            return; // Linux only.

        FluentActions.Invoking(() => OutputDirectory.Open("/proc")).Should().Throw<InputException>()
            .WithMessage("/proc: is a mount point, which cannot be replaced by renaming; give a folder inside it");
    }

    [Theory]
    [InlineData("")]
    [InlineData("   ")]
    public void An_empty_path_is_refused_before_anything_is_written(string path)
    {
        FluentActions.Invoking(() => OutputDirectory.CheckPath(path, "--out")).Should().Throw<InputException>()
            .WithMessage("--out: empty; expected an output folder path");
    }
}
