using VoxProf.Tests.Fuzz;
using Xunit.Abstractions;

namespace VoxProf.Sweeps.Fuzz;

public sealed class ProcessFuzzFixture : IDisposable
{
    internal FuzzHarness Harness { get; } = new(ProcessRunner.Run);

    public void Dispose() => Harness.Dispose();
}

/// <summary>
/// The larger fuzz run (issue 13): 500 seeded mutations of the sample scenes, of a traced report and of option
/// values, each run as a real process: exit code 0, 1 or 2, at most one stderr line, within the time limit. Seeds
/// continue after the main suite's, so the two runs cover different cases.
/// </summary>
[Collection(RunsAlone.Name)]
public sealed class ProcessFuzzTests(ProcessFuzzFixture fixture, ITestOutputHelper log) : IClassFixture<ProcessFuzzFixture>
{
    public const int Cases = 500;

    public static TheoryData<int> Seeds() => [.. Enumerable.Range(VoxProf.Tests.Fuzz.FuzzTests.Cases, Cases)];

    [Theory]
    [MemberData(nameof(Seeds))]
    public void A_real_process_given_a_mutated_input_ends_in_exit_0_1_or_2_with_at_most_one_line_in_time(int seed) =>
        fixture.Harness.Expect(seed, log);
}
