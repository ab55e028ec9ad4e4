using VoxProf.Tests.Cli.Commands;

namespace VoxProf.Sweeps.Cli;

/// <summary>The demo scene's 72-frame village walk, traced whole and in 5 shards on different thread counts, then merged.</summary>
public sealed class DemoWalkShardTests : IDisposable
{
    private readonly string _dir = Path.Combine(Path.GetTempPath(), $"voxprof-walk-{Guid.NewGuid():N}");

    public void Dispose()
    {
        if (Directory.Exists(_dir))
            Directory.Delete(_dir, recursive: true);
    }

    private static int Run(params string[] args) => VoxProf.Cli.Cli.Run(args, new StringWriter(), new StringWriter());

    [Fact]
    public void Merged_shards_of_the_village_walk_equal_the_walk_traced_whole()
    {
        string scene = Path.Combine(AppContext.BaseDirectory, "samples", "stonebrook-quarry.vpscene.json");
        string[] trace = ["trace", scene, "--camera", "village-walk", "--size", "64x36", "-q"];
        Run([.. trace, "--threads", "2", "-o", Path.Combine(_dir, "whole")]).Should().Be(0);
        for (int i = 1; i <= 5; i++)
            Run([.. trace, "--threads", "1", "--shard", $"{i}/5", "-o", Path.Combine(_dir, $"shard{i}")]).Should().Be(0);

        Run(["merge", .. Enumerable.Range(1, 5).Select(i => Path.Combine(_dir, $"shard{i}")), "-o", Path.Combine(_dir, "merged")]).Should().Be(0);

        RunFolders.ShouldMatchButForTimings(Path.Combine(_dir, "merged"), Path.Combine(_dir, "whole"));
        Directory.GetDirectories(Path.Combine(_dir, "whole", "views")).Should().HaveCount(72);
    }
}
