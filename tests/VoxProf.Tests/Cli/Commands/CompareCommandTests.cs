using System.Text.Json;
using VoxProf.Cli;
using VoxProf.Tests.Compare;

namespace VoxProf.Tests.Cli.Commands;

public class CompareCommandTests : IDisposable
{
    private readonly TempDir _tmp = new();
    private readonly StringWriter _out = new();
    private readonly StringWriter _err = new();

    public void Dispose() => _tmp.Dispose();

    private string OutDir => Path.Combine(_tmp.Path, "cmp");

    private int Run(params string[] args) => VoxProf.Cli.Cli.Run(["compare", .. args, "--out", OutDir], _out, _err);

    private string ErrorLines => _err.ToString().TrimEnd('\n');

    [Fact]
    public void Comparing_a_report_with_itself_passes_with_exit_code_0_and_writes_every_file()
    {
        var dir = ReportFixtures.Write(_tmp, "base", ReportFixtures.Standard());

        var code = Run(dir, dir);

        code.Should().Be(ExitCodes.Ok);
        _err.ToString().Should().BeEmpty();
        _out.ToString().Should().Contain("no change in any of 60 metrics").And.Contain("verdict: pass");
        Directory.GetFiles(OutDir).Select(Path.GetFileName).Should().BeEquivalentTo(["compare.md", "compare.csv", "compare.json", "compare.html", "manifest.json"]);
        string html = File.ReadAllText(Path.Combine(OutDir, "compare.html"));
        html.Should().Contain($"content=\"{VoxProf.Reports.Html.HtmlPage.ContentSecurityPolicy}\"").And.Contain("The gate holds")
            .And.NotContain("<link").And.NotContain(" src=\"http");
        using var json = JsonDocument.Parse(File.ReadAllText(Path.Combine(OutDir, "compare.json")));
        json.RootElement.GetProperty("changes").EnumerateArray().Should().OnlyContain(c => c.GetProperty("change").GetDouble() == 0);
    }

    [Fact]
    public void A_tight_rule_fails_with_exit_code_1_and_prints_its_numbers()
    {
        var a = ReportFixtures.Write(_tmp, "base", ReportFixtures.Standard());
        var b = ReportFixtures.Write(_tmp, "cand", ReportFixtures.Standard(1.1));

        var code = Run(a, b, "--fail-on", "dda-mask.iterations.mean:5%", "--fail-on", "all.subgroup32.tile-max-mean:20%");

        code.Should().Be(ExitCodes.RuleBroken);
        _out.ToString().Should().Contain("broken: dda-mask.iterations.mean:5%: dda-mask iterations.mean: 8.00 -> 8.80 (+0.80, +10%)")
            .And.Contain("verdict: fail (1 of 2 rules broken)");
    }

    [Fact]
    public void A_loose_rule_passes_with_exit_code_0()
    {
        var a = ReportFixtures.Write(_tmp, "base", ReportFixtures.Standard());
        var b = ReportFixtures.Write(_tmp, "cand", ReportFixtures.Standard(1.1));

        var code = Run(a, b, "--fail-on", "all.iterations.mean:15%", "--quiet");

        code.Should().Be(ExitCodes.Ok);
        _out.ToString().TrimEnd('\n').Split('\n').Should().ContainSingle().Which.Should().StartWith("verdict: pass");
    }

    [Fact]
    public void The_default_rules_fail_a_ten_percent_rise_in_mean_iterations()
    {
        var a = ReportFixtures.Write(_tmp, "base", ReportFixtures.Standard());
        var b = ReportFixtures.Write(_tmp, "cand", ReportFixtures.Standard(1.1));

        Run(a, b).Should().Be(ExitCodes.RuleBroken);
        _out.ToString().Should().Contain("default rules broken");
    }

    [Fact]
    public void A_truncated_report_exits_2_with_one_line_naming_the_file()
    {
        var a = ReportFixtures.Write(_tmp, "base", ReportFixtures.Standard());
        var b = ReportFixtures.Write(_tmp, "cand", ReportFixtures.Standard());
        var file = Path.Combine(b, "report.json");
        File.WriteAllText(file, File.ReadAllText(file)[..300]);

        var code = Run(a, b);

        code.Should().Be(ExitCodes.BadInput);
        ErrorLines.Should().NotContain("\n").And.StartWith($"voxprof: error: {file}: line ").And.Contain("truncated");
        Directory.Exists(OutDir).Should().BeFalse("nothing is written for an unreadable report");
    }

    [Fact]
    public void A_malformed_report_exits_2_with_one_line()
    {
        var a = ReportFixtures.Write(_tmp, "base", ReportFixtures.Standard());
        var bad = Path.Combine(_tmp.Path, "bad.json");
        File.WriteAllText(bad, "{ \"schemaVersion\": 1, ]");

        var code = Run(a, bad);

        code.Should().Be(ExitCodes.BadInput);
        ErrorLines.Should().NotContain("\n").And.StartWith($"voxprof: error: {bad}: line 1, position").And.Contain("malformed JSON");
    }

    [Fact]
    public void Reports_of_different_sizes_exit_2_with_one_line_naming_both_sizes()
    {
        var doc = ReportFixtures.Standard();
        var a = ReportFixtures.Write(_tmp, "base", doc);
        var b = ReportFixtures.Write(_tmp, "cand", ReportFixtures.Resized(doc, 64, 25));

        var code = Run(a, b);

        code.Should().Be(ExitCodes.BadInput);
        ErrorLines.Should().NotContain("\n").And.Contain("base 40x25").And.Contain("candidate 64x25");
    }

    [Fact]
    public void Reports_of_different_cameras_exit_2_with_one_line()
    {
        var doc = ReportFixtures.Standard();
        var a = ReportFixtures.Write(_tmp, "base", doc);
        var b = ReportFixtures.Write(_tmp, "cand", doc with { Camera = doc.Camera with { FovDegrees = 45 } });

        var code = Run(a, b);

        code.Should().Be(ExitCodes.BadInput);
        ErrorLines.Should().NotContain("\n").And.Contain("different cameras").And.Contain("fov 60").And.Contain("fov 45");
    }

    [Fact]
    public void A_rule_with_an_unknown_counter_exits_2_listing_the_valid_names()
    {
        var a = ReportFixtures.Write(_tmp, "base", ReportFixtures.Standard());

        var code = Run(a, a, "--fail-on", "dda.steps.mean:5%");

        code.Should().Be(ExitCodes.BadInput);
        ErrorLines.Should().NotContain("\n").And.Contain("unknown metric group 'steps'").And.Contain("iterations, node-fetches, subgroup32, subgroup64");
    }

    [Fact]
    public void A_malformed_rule_exits_2_before_any_report_is_read()
    {
        var code = Run("no-such-dir", "no-such-dir", "--fail-on", "dda.iterations.mean<5%");

        code.Should().Be(ExitCodes.BadInput);
        ErrorLines.Should().Contain("rule 'dda.iterations.mean<5%'").And.NotContain("no-such-dir");
    }

    [Fact]
    public void A_missing_argument_or_an_unknown_option_is_bad_usage_with_exit_code_2_not_1()
    {
        VoxProf.Cli.Cli.Run(["compare", "only-one"], _out, _err).Should().Be(ExitCodes.BadInput);
        VoxProf.Cli.Cli.Run(["compare", "a", "b", "--fail-when", "x"], _out, _err).Should().Be(ExitCodes.BadInput);
        _err.ToString().Should().NotBeEmpty();
    }

    [Fact]
    public void An_out_path_that_is_a_file_exits_2_naming_it()
    {
        var a = ReportFixtures.Write(_tmp, "base", ReportFixtures.Standard());
        var file = Path.Combine(_tmp.Path, "taken");
        File.WriteAllText(file, "keep me");

        var code = VoxProf.Cli.Cli.Run(["compare", a, a, "--out", file], _out, _err);

        code.Should().Be(ExitCodes.BadInput);
        ErrorLines.Should().NotContain("\n").And.Contain(file).And.Contain("is a file");
        File.ReadAllText(file).Should().Be("keep me");
    }

    [Fact]
    public void A_second_run_replaces_the_compare_files()
    {
        var a = ReportFixtures.Write(_tmp, "base", ReportFixtures.Standard());
        var b = ReportFixtures.Write(_tmp, "cand", ReportFixtures.Standard(1.1));

        Run(a, a).Should().Be(ExitCodes.Ok);
        Run(a, b, "--fail-on", "all.iterations.mean:50%").Should().Be(ExitCodes.Ok);

        File.ReadAllText(Path.Combine(OutDir, "compare.md")).Should().Contain("+10%");
        Directory.GetFiles(OutDir).Should().HaveCount(5, "four outputs and the manifest; no temporary file is left behind");
    }

    [Fact]
    public void An_out_folder_holding_files_voxprof_did_not_write_is_refused_and_left_alone()
    {
        var a = ReportFixtures.Write(_tmp, "base", ReportFixtures.Standard());
        Directory.CreateDirectory(OutDir);
        File.WriteAllText(Path.Combine(OutDir, "notes.txt"), "mine");

        Run(a, a).Should().Be(ExitCodes.BadInput);

        ErrorLines.Should().Be($"voxprof: error: {OutDir}: holds a file voxprof did not write ('notes.txt'); expected a new or empty folder, or one voxprof wrote (it replaces the whole folder)");
        Directory.GetFiles(OutDir).Select(Path.GetFileName).Should().BeEquivalentTo(["notes.txt"]);
    }

    [Fact]
    public void A_report_traced_without_pixels_compares_and_says_plainly_that_pixel_differences_are_unavailable()
    {
        var plain = ReportFixtures.Standard();
        var a = ReportFixtures.Write(_tmp, "base", plain);
        var b = ReportFixtures.Write(_tmp, "cand", plain with { Run = plain.Run with { PixelData = false } });

        Run(a, b).Should().Be(ExitCodes.Ok, _err.ToString());

        _err.ToString().Should().BeEmpty();
        const string note = "per-pixel differences are unavailable: the candidate report was traced with --no-pixels";
        _out.ToString().Should().Contain(note);
        File.ReadAllText(Path.Combine(OutDir, "compare.md")).Should().Contain(note);
        File.ReadAllText(Path.Combine(OutDir, "compare.html")).Should().Contain(note);
        Directory.GetFiles(OutDir, "diff-*.png").Should().BeEmpty();
    }

    [Fact]
    public void No_html_leaves_out_compare_html_and_a_link_base_makes_compare_md_links_absolute()
    {
        var dir = ReportFixtures.Write(_tmp, "base", ReportFixtures.Standard());

        Run(dir, dir, "--no-html", "--link-base", "https://ci.example.org/cmp/").Should().Be(ExitCodes.Ok, _err.ToString());

        File.Exists(Path.Combine(OutDir, "compare.html")).Should().BeFalse();
        _out.ToString().Should().Contain("wrote compare.md, compare.csv, compare.json to");
        VoxProf.Cli.Cli.Run(["compare", dir, dir, "--out", OutDir, "--link-base", "https://ci.example.org/cmp/"], _out, _err).Should().Be(ExitCodes.Ok);
        File.ReadAllText(Path.Combine(OutDir, "compare.md")).Should().Contain("(https://ci.example.org/cmp/compare.html)");
    }
}
