namespace VoxProf.Tests.Cli.Commands;

/// <summary>One view traced whole, and traced in shards of its tiles and merged: the same folder but for timings.</summary>
public sealed class TileMergeTests : IDisposable
{
    // The scene of the view-shard tests, with its first camera alone.
    private readonly CliScratch _scratch = new(MergeCommandTests.Layers, "{'name': 'yard', 'eye': [2, 20, 2], 'target': [40, 8, 40]}");

    public void Dispose() => _scratch.Dispose();

    private string Out(string name) => _scratch.Out(name);

    private static (int Code, string Out, string Err) Run(params string[] args) => CliScratch.Run(args);

    // 50 × 37 pixels: 4 × 3 tiles, the last column and row cut short, so the shards hold 4, 4 and 4 tiles of three shapes.
    private (int Code, string Out, string Err) Trace(string outDir, params string[] more) =>
        Run(["trace", _scratch.Scene.Path, "--camera", "yard", "--size", "50x37", "--prepass", "4", "--per-pixel", "--quiet", "--out", outDir, .. more]);

    [Fact]
    public void A_view_merged_from_three_tile_shards_equals_the_view_traced_whole_but_for_timings()
    {
        Trace(Out("whole"), "--threads", "2").Code.Should().Be(0);
        for (int i = 1; i <= 3; i++)
        {
            var shard = Trace(Out($"t{i}"), "--shard", $"{i}/3", "--threads", "1");
            shard.Code.Should().Be(0, shard.Err);
            shard.Out.Should().Contain($"shard {i} of 3 of yard: 4 of 12 tiles");
        }

        var merged = Run("merge", Out("t2"), Out("t3"), Out("t1"), "--out", Out("merged"));

        merged.Code.Should().Be(0, merged.Err);
        merged.Out.Should().Contain("merged 3 tile shards of yard");
        RunFolders.ShouldMatchButForTimings(Out("merged"), Out("whole"));
        RunFolders.Files(Out("whole")).Should().Contain(["report.json", "heatmap-dda-iterations.png", "pixels-dda.bin.gz", "pixels-dda.csv", "report.html"]);
    }

    [Fact]
    public void A_tile_shard_without_pixel_data_or_shards_that_disagree_are_refused()
    {
        var noPixels = Trace(Out("t1"), "--shard", "1/2", "--no-pixels");
        noPixels.Code.Should().Be(2);
        noPixels.Err.Should().Be("voxprof: error: --shard: a shard of one view's tiles is its pixel data, which --no-pixels turns off; trace the shard without --no-pixels\n");
        Directory.Exists(Out("t1")).Should().BeFalse();

        Trace(Out("t1"), "--shard", "1/2", "--strategy", "dda").Code.Should().Be(0);
        Trace(Out("t2"), "--shard", "2/2", "--strategy", "dda", "--branching", "2").Code.Should().Be(0);
        var merged = Run("merge", Out("t1"), Out("t2"), "--out", Out("merged"));
        merged.Code.Should().Be(2);
        merged.Err.Should().StartWith($"voxprof: error: {Out("t2")}: the trace options differs from {Out("t1")}'s").And.EndWith("expected shards of one run\n");
        Directory.Exists(Out("merged")).Should().BeFalse();

        Run("merge", Out("t1"), "--out", Out("merged")).Err.Should().Be("voxprof: error: merge: shard 2 of 2 missing; expected all 2 shard folders\n");
    }

    [Fact]
    public void Of_shards_read_side_by_side_the_first_damaged_in_shard_order_is_named()
    {
        for (int i = 1; i <= 3; i++)
            Trace(Out($"t{i}"), "--shard", $"{i}/3", "--strategy", "dda").Code.Should().Be(0);
        // Shard 3's file is missing, shard 2's is not the one its run wrote: shard 2 comes first, whichever finishes first.
        File.Delete(Path.Combine(Out("t3"), "pixels-dda.bin.gz"));
        File.AppendAllText(Path.Combine(Out("t2"), "pixels-dda.bin.gz"), "x");

        var merged = Run("merge", Out("t3"), Out("t1"), Out("t2"), "--out", Out("merged"));

        merged.Code.Should().Be(2);
        merged.Err.Should().StartWith($"voxprof: error: {Path.Combine(Out("t2"), "pixels-dda.bin.gz")}: ").And.NotContain(Out("t3"));
        merged.Err.TrimEnd('\n').Should().NotContain("\n", "one line");
        Directory.Exists(Out("merged")).Should().BeFalse();
    }
}
