using System.Text.Json;
using VoxProf.Cli;
using VoxProf.Tests.Compare;

namespace VoxProf.Tests.Cli.Commands;

/// <summary>The memory model from the command line to the files: heatmaps, report.json and a gate rule.</summary>
public sealed class MemoryTraceTests : IDisposable
{
    private static readonly string RingPost = Path.Combine(AppContext.BaseDirectory, "samples", "ring-post.vpscene.json");

    private readonly TempDir _tmp = new();
    private readonly StringWriter _out = new();
    private readonly StringWriter _err = new();

    public void Dispose() => _tmp.Dispose();

    private string Trace(string name, params string[] extra)
    {
        string dir = Path.Combine(_tmp.Path, name);
        VoxProf.Cli.Cli.Run(["trace", RingPost, "--size", "24x16", "--strategy", "dda,hdda", "--quiet", "--out", dir, .. extra], _out, _err)
            .Should().Be(ExitCodes.Ok, _err.ToString());
        return dir;
    }

    private static JsonElement Strategy(JsonDocument report, string name) =>
        report.RootElement.GetProperty("strategies").EnumerateArray().Single(s => s.GetProperty("name").GetString() == name).GetProperty("values");

    [Fact]
    public void A_trace_draws_the_memory_maps_and_reports_the_cache_and_a_trace_with_the_model_off_reports_none()
    {
        string on = Trace("on", "--counters", "cache-lines,lines-per-group32", "--cache-line", "128");
        string off = Trace("off", "--memory", "off");

        File.Exists(Path.Combine(on, "heatmap-dda-cache-lines.png")).Should().BeTrue();
        File.Exists(Path.Combine(on, "heatmap-hdda-lines-per-group32.png")).Should().BeTrue();
        using JsonDocument withModel = JsonDocument.Parse(File.ReadAllText(Path.Combine(on, "report.json")));
        using JsonDocument without = JsonDocument.Parse(File.ReadAllText(Path.Combine(off, "report.json")));

        withModel.RootElement.GetProperty("run").GetProperty("memory").GetProperty("lineBytes").GetInt32().Should().Be(128);
        JsonElement dda = Strategy(withModel, "dda");
        dda.GetProperty("cache-lines.mean").GetDouble().Should().BeGreaterThan(0);
        dda.GetProperty("subgroup32.lines-per-group-max").GetDouble().Should().BeGreaterThanOrEqualTo(dda.GetProperty("cache-lines.max").GetDouble());
        dda.GetProperty("cache.hit-rate").GetDouble().Should().BeInRange(0, 1);
        (dda.GetProperty("cache.bytes-fetched").GetDouble() % 128).Should().Be(0, "whole 128-byte lines are fetched");

        without.RootElement.GetProperty("run").TryGetProperty("memory", out _).Should().BeFalse();
        JsonElement plain = Strategy(without, "dda");
        plain.GetProperty("cache-lines.mean").ValueKind.Should().Be(JsonValueKind.Null, "not measured, rather than no traffic");
        plain.TryGetProperty("cache.hit-rate", out _).Should().BeFalse();
        plain.GetProperty("iterations.total").GetDouble().Should().Be(dda.GetProperty("iterations.total").GetDouble(), "the model changes no count");
    }

    [Fact]
    public void A_gate_rule_on_bytes_fetched_fails_when_a_smaller_cache_fetches_more()
    {
        string big = Trace("big", "--cache-kib", "64");
        string small = Trace("small", "--cache-kib", "1", "--cache-ways", "1");
        int code = VoxProf.Cli.Cli.Run(["compare", big, small, "--out", Path.Combine(_tmp.Path, "cmp"), "--quiet",
            "--fail-on", "dda.cache.bytes-fetched:1%"], _out, _err);
        code.Should().Be(ExitCodes.RuleBroken, _out.ToString());
        _out.ToString().Should().Contain("cache.bytes-fetched");
    }
}
