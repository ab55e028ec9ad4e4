using CsvHelper;
using StbImageSharp;
using VoxProf.Core;
using VoxProf.Core.Statistics;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Colour;
using VoxProf.Reports.Export;
using VoxProf.Reports.Images;
using VoxProf.Reports.Model;
using VoxProf.Reports.Pixels;

namespace VoxProf.Tests.Reports;

public sealed class ReportWriterTests : IDisposable
{
    private readonly string _dir = Path.Combine(Path.GetTempPath(), $"voxprof-test-{Guid.NewGuid():N}");

    public void Dispose()
    {
        if (Directory.Exists(_dir))
            Directory.Delete(_dir, recursive: true);
    }

    private ReportResult WriteSmall(ReportOptions? options = null) =>
        ReportWriter.WriteAll(TestRuns.Small(), options ?? TestRuns.Options, _dir);

    [Fact]
    public void A_trace_writes_every_documented_file_and_nothing_half_written()
    {
        ReportResult result = WriteSmall();

        result.Failures.Should().BeEmpty();
        string[] names = Directory.GetFiles(_dir).Select(Path.GetFileName).ToArray()!;
        names.Should().BeEquivalentTo(
            "report.json", "summary.csv", "summary.md", "preview.png", "mismatch-dda.png",
            "heatmap-grid-iterations.png", "heatmap-grid-subgroup32.png", "heatmap-grid-subgroup64.png",
            "heatmap-dda-iterations.png", "heatmap-dda-subgroup32.png", "heatmap-dda-subgroup64.png",
            "pixels-grid.bin.gz", "pixels-dda.bin.gz", "report.html", "manifest.json");
        foreach (StrategyReport s in result.Document.Strategies)
            s.Files.Should().OnlyContain(f => names.Contains(f), "every file the report lists exists");
        result.Document.Files.Should().OnlyContain(f => names.Contains(f), "every run-wide file the report lists exists");
    }

    [Fact]
    public void No_pixels_and_no_html_leave_out_exactly_those_files_and_report_json_says_so()
    {
        ReportResult result = WriteSmall(TestRuns.Options with { PixelData = false, Html = false });

        result.Failures.Should().BeEmpty();
        string[] names = Directory.GetFiles(_dir).Select(Path.GetFileName).ToArray()!;
        names.Should().NotContain(n => n.StartsWith("pixels-") || n == "report.html");
        names.Should().Contain(["report.json", "summary.md", "heatmap-dda-iterations.png"]);
        result.Document.Run.PixelData.Should().BeFalse();
        result.Document.Files.Should().NotContain("report.html");
        result.Document.Strategies.SelectMany(s => s.Files).Should().NotContain(f => f.StartsWith("pixels-"));
    }

    [Fact]
    public void A_second_run_replaces_the_whole_folder_so_no_file_of_the_first_run_stays()
    {
        Directory.CreateDirectory(_dir);
        File.WriteAllText(Path.Combine(_dir, "summary.csv"), "stale");
        File.WriteAllText(Path.Combine(_dir, "heatmap-slab-iterations.png"), "from a run with another strategy");

        WriteSmall();
        WriteSmall();

        File.ReadAllText(Path.Combine(_dir, "summary.csv")).Should().StartWith("strategy,iterations.total");
        File.Exists(Path.Combine(_dir, "heatmap-slab-iterations.png")).Should().BeFalse("a file this run did not write belongs to an older run");
        Directory.GetFileSystemEntries(Path.GetDirectoryName(_dir)!, $".{Path.GetFileName(_dir)}.voxprof-*")
            .Should().OnlyContain(p => p.EndsWith(".voxprof-lock", StringComparison.Ordinal), "no stage or old folder stays behind");
    }

    private sealed class FailingExporter : IReportExporter
    {
        public string Name => "broken";

        public void Export(ReportContext context, OutputDirectory output) =>
            output.Write("broken.bin", _ => throw new IOException("disk full"));
    }

    [Fact]
    public void A_failing_exporter_is_reported_and_the_others_still_write()
    {
        var run = TestRuns.Small();
        var stats = StrategyStatistics.Compute(run);
        var context = new ReportContext(run, stats, ReportBuilder.Build(run, stats, TestRuns.Options), TestRuns.Options);
        var writer = new ReportWriter([new FailingExporter(), new SummaryCsvExporter(), new ReportJsonExporter()]);

        using OutputDirectory output = OutputDirectory.Open(_dir);
        ReportResult result = writer.Write(context, output);
        output.Commit();

        result.Failures.Should().ContainSingle().Which.Message.Should().Be("broken: disk full");
        File.Exists(Path.Combine(_dir, "summary.csv")).Should().BeTrue();
        File.Exists(Path.Combine(_dir, "report.json")).Should().BeTrue();
        File.Exists(Path.Combine(_dir, "broken.bin")).Should().BeFalse();
        Directory.GetFiles(_dir, ".*").Should().BeEmpty("the temporary file of the failed write is removed");
    }

    /// <summary>Reads what the others wrote, as the page does; records what it found and whether it was prepared.</summary>
    private sealed class ReadingExporter(bool failPreparing) : IReportExporter
    {
        public string Name => "reader";

        public bool ReadsOtherOutputs => true;

        public bool Prepared { get; private set; }

        public string[]? Seen { get; private set; }

        public void Prepare(ReportContext context)
        {
            if (failPreparing)
                throw new InvalidOperationException("cannot prepare");
            Prepared = true;
        }

        public void Export(ReportContext context, OutputDirectory output) =>
            Seen = [.. Directory.GetFiles(output.WorkingPath).Select(Path.GetFileName).OfType<string>().Where(n => !n.StartsWith('.')).Order()];
    }

    [Fact]
    public void An_exporter_that_reads_other_outputs_runs_after_all_of_them_and_a_failed_preparation_skips_it()
    {
        var run = TestRuns.Small();
        var stats = StrategyStatistics.Compute(run);
        var context = new ReportContext(run, stats, ReportBuilder.Build(run, stats, TestRuns.Options), TestRuns.Options);
        var reader = new ReadingExporter(failPreparing: false);
        var broken = new ReadingExporter(failPreparing: true);
        // The readers listed first: the order of the list must not let them run before the files exist.
        var writer = new ReportWriter([reader, broken, new SummaryCsvExporter(), new ReportJsonExporter(), new HeatmapExporter()]);

        using OutputDirectory output = OutputDirectory.Open(_dir);
        ReportResult result = writer.Write(context, output);
        output.Commit();

        reader.Prepared.Should().BeTrue();
        reader.Seen.Should().Contain(["report.json", "summary.csv", "heatmap-dda-iterations.png"]);
        broken.Seen.Should().BeNull("an exporter whose preparation failed is not run");
        result.Failures.Should().ContainSingle().Which.Message.Should().Be("reader: cannot prepare");
        result.Files.Should().BeInAscendingOrder(StringComparer.Ordinal);
    }

    [Fact]
    public void An_output_path_that_is_a_file_is_one_clear_error()
    {
        Directory.CreateDirectory(_dir);
        string file = Path.Combine(_dir, "taken");
        File.WriteAllText(file, "x");
        FluentActions.Invoking(() => OutputDirectory.Open(file))
            .Should().Throw<InputException>().WithMessage("*taken: is a file, expected an output directory");
    }

    [Fact]
    public void Tree_strategies_share_a_scale_to_their_largest_99th_percentile_and_grid_has_its_own()
    {
        ReportResult result = WriteSmall();
        double gridTop = result.Document.Strategies.Single(s => s.Name == "grid").Value("iterations.p99")!.Value;
        double ddaTop = result.Document.Strategies.Single(s => s.Name == "dda").Value("iterations.p99")!.Value;
        // Grid's p99 (values x + y + 1 up to 23) is above dda's (about half): the two scales must differ for this test.
        gridTop.Should().BeGreaterThan(ddaTop);

        var grid = PngPicture.Read(Path.Combine(_dir, "heatmap-grid-iterations.png")).CropRgb();
        var dda = PngPicture.Read(Path.Combine(_dir, "heatmap-dda-iterations.png")).CropRgb();
        grid.Width.Should().Be(16);
        grid.Height.Should().Be(8);
        Pixel(grid, 0, 0).Should().Be(Rgb(SequentialRamp.Map(1 / gridTop)));
        Pixel(grid, 15, 7).Should().Be(Rgb(SequentialRamp.Map(1)), "23 is above the p99 and takes the top colour");
        Pixel(dda, 3, 2).Should().Be(Rgb(SequentialRamp.Map(1)));
        Pixel(dda, 0, 0).Should().Be(Rgb(SequentialRamp.Map(0)));
        Pixel(dda, 9, 0).Should().Be(Rgb(SequentialRamp.Map(5 / ddaTop)));
    }

    [Fact]
    public void Subgroup_heatmap_paints_each_tile_with_its_slowest_lane()
    {
        WriteSmall(TestRuns.Options with { Scale = ScaleKind.Linear, RangeMin = 0, RangeMax = 50 });
        var img = PngPicture.Read(Path.Combine(_dir, "heatmap-dda-subgroup32.png")).CropRgb();
        // dda's top-left 8×4 tile holds the spike of 40 at (3, 2); every pixel of the tile shows it.
        Pixel(img, 0, 0).Should().Be(Rgb(SequentialRamp.Map(40 / 50.0)));
        Pixel(img, 7, 3).Should().Be(Rgb(SequentialRamp.Map(40 / 50.0)));
        // Bottom-right tile: largest (x + y + 1) / 2 at (15, 7) is 11.
        Pixel(img, 8, 4).Should().Be(Rgb(SequentialRamp.Map(11 / 50.0)));
    }

    [Fact]
    public void Pixel_data_file_reads_back_every_counter_and_hit()
    {
        WriteSmall();
        StrategyResult dda = TestRuns.Small().Results[1];

        PixelData back = PixelDataFile.Read(Path.Combine(_dir, "pixels-dda.bin.gz"));

        back.Strategy.Should().Be("dda");
        back.Width.Should().Be(16);
        back.Height.Should().Be(8);
        back.CounterNames.Should().Equal(CounterNames.All.Select(c => c.Name()));
        foreach (Counter c in CounterNames.All)
            back.Get(c).Should().Equal(dda.Counters[(int)c]);
        back.Hits.Should().Equal(dda.Hits);
    }

    [Fact]
    public void A_damaged_pixel_data_file_is_an_input_error_naming_the_file()
    {
        WriteSmall();
        string path = Path.Combine(_dir, "pixels-dda.bin.gz");
        byte[] bytes = File.ReadAllBytes(path);
        File.WriteAllBytes(path, bytes[..(bytes.Length / 2)]);
        FluentActions.Invoking(() => PixelDataFile.Read(path)).Should().Throw<InputException>().WithMessage($"{path}: *");
        File.WriteAllText(path, "not gzip");
        FluentActions.Invoking(() => PixelDataFile.Read(path)).Should().Throw<InputException>().WithMessage($"{path}: *");
    }

    // RFC 4180 reader from outside the project: CsvHelper reads the per-pixel file; misses leave the voxel empty.
    [Fact]
    public void Per_pixel_csv_has_the_documented_header_and_one_record_per_pixel()
    {
        WriteSmall(TestRuns.Options with { PerPixel = true }).Failures.Should().BeEmpty();
        using var csv = CsvReader.FromFile(Path.Combine(_dir, "pixels-grid.csv"));
        csv.Read().Should().BeTrue();
        csv.Headers.Take(9).Should().Equal("x", "y", "hit", "vx", "vy", "vz", "face", "t", "material");
        csv.Headers.Skip(9).Should().Equal(CounterNames.All.Select(c => c.Name()));
        int rows = 1;
        csv.GetString("hit").Should().Be("1");
        csv.GetString("t").Should().Be("12.25");
        while (csv.Read())
        {
            rows++;
            if (csv.GetString("hit") == "0")
                csv.GetString("vx").Should().BeEmpty();
        }
        rows.Should().Be(16 * 8);
    }

    private static (byte, byte, byte) Pixel(ImageResult img, int x, int y)
    {
        int i = (y * img.Width + x) * 3;
        return (img.Data[i], img.Data[i + 1], img.Data[i + 2]);
    }

    private static (byte, byte, byte) Rgb(SixLabors.ImageSharp.PixelFormats.Rgba32 c) => (c.R, c.G, c.B);
}
