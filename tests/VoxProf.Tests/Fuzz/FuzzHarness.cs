using System.Diagnostics;
using VoxProf.Tests.Compare;

namespace VoxProf.Tests.Fuzz;

/// <summary>What one command run printed and how long it took.</summary>
internal sealed record RunOutcome(int Code, string Error, TimeSpan Elapsed, bool TimedOut);

/// <summary>
/// Seeded fuzz cases over the sample scenes and a traced report: each case mutates one input, runs one command
/// on it, and must end with exit code 0, 1 or 2, at most one line on stderr (a "voxprof: error:" line for 2) and
/// within the time limit. The runner is given: in process for the main suite, a real process for the sweep.
/// </summary>
internal sealed class FuzzHarness : IDisposable
{
    /// <summary>
    /// Longest a case may run: generous for a loaded 2-core CI machine (the slowest valid mutation, the demo scene's
    /// tree built and walked twice by inspect, takes about 3 s there when the machine is idle).
    /// </summary>
    public static readonly TimeSpan Limit = TimeSpan.FromSeconds(60);

    private static readonly string[] Scenes =
    [
        "ring-post.vpscene.json", "hollow-shell.vpscene.json", "sheet-lattice.vpscene.json", "far-dust.vpscene.json",
        "ring-post.vpscene.json", "stonebrook-quarry.vpscene.json",
    ];

    private readonly TempDir _tmp = new();
    private readonly Func<string[], RunOutcome> _run;

    public FuzzHarness(Func<string[], RunOutcome> run)
    {
        _run = run;
        string samples = Path.Combine(AppContext.BaseDirectory, "samples");
        foreach (string file in Directory.GetFiles(samples))
            File.Copy(file, Path.Combine(_tmp.Path, Path.GetFileName(file)));
        Base = Path.Combine(_tmp.Path, "base");
        Outcome traced = Check(["trace", Path.Combine(_tmp.Path, "ring-post.vpscene.json"), "--size", "24x16", "--strategy", "grid,dda,hdda", "--quiet", "--out", Base], "the base trace");
        if (traced.Problem is not null || traced.Run.Code != 0)
            throw new InvalidOperationException($"the base report could not be traced: {traced.Problem ?? traced.Run.Error}");
    }

    /// <summary>The report every report case mutates.</summary>
    public string Base { get; }

    public void Dispose() => _tmp.Dispose();

    /// <summary>A case's verdict: null problem when the run behaved.</summary>
    public sealed record Outcome(string Description, RunOutcome Run, string? Problem);

    /// <summary>Runs case <paramref name="seed"/>, logs what it did and printed, and fails the test if it misbehaved.</summary>
    public void Expect(int seed, Xunit.Abstractions.ITestOutputHelper log)
    {
        Outcome outcome = RunCase(seed);
        log.WriteLine($"{outcome.Description}: exit {outcome.Run.Code}, {outcome.Run.Elapsed.TotalSeconds:0.00} s: {outcome.Run.Error.TrimEnd()}");
        outcome.Problem.Should().BeNull($"case {seed} ({outcome.Description}) printed: {outcome.Run.Error}");
    }

    /// <summary>Case <paramref name="seed"/>: two in three mutate a scene, one in three a report.</summary>
    public Outcome RunCase(int seed)
    {
        string dir = Path.Combine(_tmp.Path, $"case-{seed}");
        Directory.CreateDirectory(dir);
        try
        {
            return seed % 3 == 2 ? ReportCase(seed, dir) : SceneCase(seed, dir);
        }
        finally
        {
            TryDelete(dir);
        }
    }

    // Option values a typo, a script bug or a hostile job definition produce.
    private static readonly (string Option, string[] Values)[] OptionValues =
    [
        ("--size", ["0x0", "16384x16384", "16385x1", "-1x5", "1x1", "x", "1e3x2", "99999999999x1", "8x8x8", ""]),
        ("--fov", ["0", "180", "NaN", "-5", "1e999", "0.999", "179.001"]),
        ("--range", ["5:1", "0:0", "-1:5", "NaN:1", "0:1e999", "a:b", "1:2:3"]),
        ("--eye", ["1,2", "NaN,0,0", "1e999,0,0", "0,0,0", "a,b,c", ""]),
        ("--out", ["", " ", "line\nbreak", "/proc/self", "/", "."]),
        ("--max-work", ["0", "-1", "NaN", "1e999", "1", "abc", ""]),
        ("--prepass", ["3", "-1", "99999999999", "x"]),
        ("--threads", ["-1", "99999999999", "100000"]),
        ("--counters", ["", ",", "iterations,,", "nope", "subgroup7"]),
        ("--baseline", ["grid", "nope", ""]),
        ("--branching", ["8", "0", "-4", "x"]),
        ("--strategy", ["", ",", "grid,grid", "nope", "GRID"]),
    ];

    private Outcome OptionCase(int seed, string dir)
    {
        var rng = new Random(seed);
        var (option, values) = OptionValues[rng.Next(OptionValues.Length)];
        string value = values[rng.Next(values.Length)].Replace("\\n", "\n", StringComparison.Ordinal);
        if (option == "--out" && value == ".")
            value = dir;
        string scene = Path.Combine(_tmp.Path, Scenes[rng.Next(4)]);
        var options = new Dictionary<string, string> { ["--size"] = "24x16", ["--strategy"] = "dda", ["--out"] = Path.Combine(dir, "out") };
        options[option] = value;
        if (option == "--eye")
            options["--target"] = "30,10,30";
        string[] args = ["trace", scene, "--quiet", .. options.SelectMany(o => new[] { o.Key, o.Value })];
        return Check(args, $"{option} '{value}'");
    }

    private Outcome SceneCase(int seed, string dir)
    {
        if (seed % 7 == 3)
            return OptionCase(seed, dir);
        string name = Scenes[seed / 3 % Scenes.Length];
        byte[] original = File.ReadAllBytes(Path.Combine(_tmp.Path, name));
        Mutation m = seed % 5 == 4 ? InputMutator.MutateMany(original, seed, 3) : InputMutator.Mutate(original, seed);
        // Beside the sample files, so the mutated scene still finds (or fails to find) its raw, mesh and image files.
        string scene = Path.Combine(_tmp.Path, $"fuzz-{seed}.vpscene.json");
        File.WriteAllBytes(scene, m.Bytes);
        try
        {
            string[] args = seed % 4 == 0
                ? ["inspect", scene, "--format", seed % 8 == 0 ? "json" : "text"]
                : ["trace", scene, "--size", "24x16", "--strategy", seed % 2 == 0 ? "dda,grid" : "hdda,dda-mask", "--quiet", "--out", Path.Combine(dir, "out")];
            return Check(args, $"{name}: {m.Description}");
        }
        finally
        {
            File.Delete(scene);
        }
    }

    private Outcome ReportCase(int seed, string dir)
    {
        string candidate = Path.Combine(dir, "candidate");
        Directory.CreateDirectory(candidate);
        // The pixel files come along (compare reads them for the difference heatmaps), the manifest does not: a
        // mutated report.json beside it would only ever be refused as a mix of runs.
        foreach (string file in Directory.GetFiles(Base).Where(f => !f.EndsWith("manifest.json", StringComparison.Ordinal)))
            File.Copy(file, Path.Combine(candidate, Path.GetFileName(file)));
        Mutation m = InputMutator.Mutate(File.ReadAllBytes(Path.Combine(Base, "report.json")), seed);
        File.WriteAllBytes(Path.Combine(candidate, "report.json"), m.Bytes);
        string[] rules = (seed / 3 % 4) switch
        {
            0 => [],
            1 => ["--fail-on", "all.iterations.mean:5%"],
            2 => ["--fail-on", "dda.all:0"],
            _ => ["--fail-on", "hdda.subgroup32.simd-efficiency:-1%", "--fail-on", "all.hit-rate:0"],
        };
        bool swap = seed % 2 == 0;
        return Check(["compare", swap ? candidate : Base, swap ? Base : candidate, .. rules, "--out", Path.Combine(dir, "cmp")], $"report.json: {m.Description}");
    }

    private Outcome Check(string[] args, string description)
    {
        RunOutcome run = _run(args);
        string error = run.Error.TrimEnd('\n', '\r');
        string? problem = null;
        if (run.TimedOut || run.Elapsed > Limit)
            problem = $"ran {run.Elapsed.TotalSeconds:0.0} s, over the {Limit.TotalSeconds:0} s limit";
        else if (run.Code is not (0 or 1 or 2))
            problem = $"exit code {run.Code}";
        else if (error.Contains('\n', StringComparison.Ordinal))
            problem = $"{error.Split('\n').Length} lines on stderr";
        else if (run.Code == 2 && !error.StartsWith("voxprof: error: ", StringComparison.Ordinal))
            problem = "exit code 2 without a \"voxprof: error:\" line";
        else if (run.Code != 2 && error.Length > 0)
            problem = $"exit code {run.Code} with something on stderr";
        return new Outcome(description, run, problem);
    }

    /// <summary>Runs the command line inside this process on its own thread, giving up waiting at <see cref="Limit"/>.</summary>
    public static RunOutcome InProcess(string[] args)
    {
        var output = new StringWriter();
        var error = new StringWriter();
        var clock = Stopwatch.StartNew();
        var task = Task.Factory.StartNew(() => VoxProf.Cli.Cli.Run(args, output, error), TaskCreationOptions.LongRunning);
        bool done = task.Wait(Limit + TimeSpan.FromSeconds(5));
        return new RunOutcome(done ? task.Result : -1, done ? error.ToString() : "", clock.Elapsed, !done);
    }

    private static void TryDelete(string dir)
    {
        try
        {
            Directory.Delete(dir, recursive: true);
        }
        catch (IOException)
        {
            // A case's leftovers go with the harness's folder.
        }
    }
}
