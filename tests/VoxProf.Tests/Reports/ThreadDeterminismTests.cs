using VoxProf.Core.Memory;
using VoxProf.Core.Scenes;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;
using VoxProf.Reports.Export;
using VoxProf.Reports.Model;

namespace VoxProf.Tests.Reports;

public sealed class ThreadDeterminismTests : IDisposable
{
    private readonly string _dir = Path.Combine(Path.GetTempPath(), $"voxprof-threads-{Guid.NewGuid():N}");

    public void Dispose()
    {
        if (Directory.Exists(_dir))
            Directory.Delete(_dir, recursive: true);
    }

    private ReportResult Trace(Scene scene, BrickTree tree, int threads, string sub)
    {
        var request = new TraceRequest(scene, tree, scene.Cameras[0], 48, 32, [BuiltInStrategies.Grid, BuiltInStrategies.DdaMask, BuiltInStrategies.Hdda], 4, threads);
        TraceRun run = Tracer.Run(request);
        return ReportWriter.WriteAll(run, TestRuns.Options with { Threads = threads }, Path.Combine(_dir, sub));
    }

    [Fact]
    public void Two_traces_with_different_thread_counts_write_identical_reports_apart_from_timings()
    {
        Scene scene = SceneLoader.Load(Path.Combine(AppContext.BaseDirectory, "samples", "hollow-shell.vpscene.json"));
        BrickTree tree = TreeBuilder.Build(scene, 4, 1);

        ReportResult one = Trace(scene, tree, 1, "one");
        ReportResult two = Trace(scene, tree, 2, "two");

        one.Failures.Should().BeEmpty();
        two.Failures.Should().BeEmpty();
        one.Document.Timings.Threads.Should().Be(1);
        two.Document.Timings.Threads.Should().Be(2);
        ReportJson.Serialize(one.Document with { Timings = two.Document.Timings }).Should().Be(ReportJson.Serialize(two.Document));
        foreach (string name in new[] { "summary.csv", "pixels-grid.bin.gz", "pixels-hdda.bin.gz", "heatmap-dda-mask-iterations.png", "preview.png" })
            File.ReadAllBytes(Path.Combine(_dir, "one", name)).Should().Equal(File.ReadAllBytes(Path.Combine(_dir, "two", name)), name);
    }
}

public sealed class ModelTimingTests : IDisposable
{
    private readonly string _dir = Path.Combine(Path.GetTempPath(), $"voxprof-model-timing-{Guid.NewGuid():N}");

    public void Dispose()
    {
        if (Directory.Exists(_dir))
            Directory.Delete(_dir, recursive: true);
    }

    [Fact]
    public void The_memory_models_time_is_reported_apart_from_each_strategys_tracing_and_only_when_it_ran()
    {
        Scene scene = SceneLoader.Load(Path.Combine(AppContext.BaseDirectory, "samples", "hollow-shell.vpscene.json"));
        BrickTree tree = TreeBuilder.Build(scene, 4, 1);
        var request = new TraceRequest(scene, tree, scene.Cameras[0], 48, 32, [BuiltInStrategies.Grid, BuiltInStrategies.DdaMask], Threads: 1);

        TimingInfo on = ReportWriter.WriteAll(Tracer.Run(request with { Memory = MemorySettings.Default }), TestRuns.Options, Path.Combine(_dir, "on")).Document.Timings;
        TimingInfo off = ReportWriter.WriteAll(Tracer.Run(request), TestRuns.Options, Path.Combine(_dir, "off")).Document.Timings;

        on.MemorySeconds.Should().NotBeNull();
        on.MemorySeconds!.Keys.Should().BeEquivalentTo("grid", "dda-mask");
        on.MemorySeconds.Values.Should().OnlyContain(s => s > 0, "every tile's reads went through the model");
        off.MemorySeconds.Should().BeNull();
        File.ReadAllText(Path.Combine(_dir, "on", "report.json")).Should().Contain("\"memorySeconds\"");
        File.ReadAllText(Path.Combine(_dir, "off", "report.json")).Should().NotContain("memorySeconds");
    }
}
