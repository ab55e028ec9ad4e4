using VoxProf.Core;
using VoxProf.Reports.Export;
using VoxProf.Tests.Compare;

namespace VoxProf.Tests.Reports;

/// <summary>A run of several views writes a folder per view through its run's one stage and manifest.</summary>
public sealed class OutputSubfolderTests : IDisposable
{
    private readonly TempDir _tmp = new();

    private string Folder => Path.Combine(_tmp.Path, "run");

    public void Dispose() => _tmp.Dispose();

    private void WriteRun(params string[] views)
    {
        using var output = OutputDirectory.Open(Folder);
        output.WriteText("report.json", w => w.Write("run"));
        foreach (string v in views)
        {
            OutputDirectory view = output.Folder("views/" + v);
            view.WriteText("report.json", w => w.Write(v));
            File.Exists(Path.Combine(view.WorkingPath, "report.json")).Should().BeTrue("a view's page reads its images back from its working folder");
            view.Written.Should().Equal("report.json");
        }
        output.Commit();
    }

    [Fact]
    public void View_folders_are_listed_in_the_one_manifest_and_swapped_in_with_the_run()
    {
        WriteRun("a", "b");

        File.ReadAllText(Path.Combine(Folder, "views", "b", "report.json")).Should().Be("b");
        ReportManifest.Read(Folder)!.Files.Select(f => f.Name).Should().Equal("report.json", "views/a/report.json", "views/b/report.json");
        Directory.Exists(Path.Combine(Folder, "views", "a")).Should().BeTrue();
    }

    [Fact]
    public void A_second_run_replaces_the_views_of_the_first_whole()
    {
        WriteRun("a", "b");
        WriteRun("c");

        Directory.GetDirectories(Path.Combine(Folder, "views")).Select(Path.GetFileName).Should().Equal("c");
    }

    [Fact]
    public void A_file_added_inside_a_view_folder_keeps_the_run_from_being_replaced()
    {
        WriteRun("a");
        File.WriteAllText(Path.Combine(Folder, "views", "a", "notes.txt"), "mine");

        var act = () => OutputDirectory.Open(Folder);

        act.Should().Throw<InputException>().WithMessage("*holds a file voxprof did not write ('views/a/notes.txt')*");
    }

    [Theory]
    [InlineData("../x")]
    [InlineData("views/.hidden")]
    [InlineData("")]
    [InlineData("views//a")]
    public void A_subfolder_must_be_plain_names(string relative)
    {
        using var output = OutputDirectory.Open(Folder);

        var act = () => output.Folder(relative);

        act.Should().Throw<ArgumentException>();
    }

    [Fact]
    public void Only_the_run_commits()
    {
        using var output = OutputDirectory.Open(Folder);

        var act = () => output.Folder("views/a").Commit();

        act.Should().Throw<InvalidOperationException>();
    }
}
