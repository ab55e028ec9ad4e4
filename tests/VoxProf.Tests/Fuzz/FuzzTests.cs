using Xunit.Abstractions;

namespace VoxProf.Tests.Fuzz;

/// <summary>Shares one workspace (the sample files and a traced base report) between the fuzz cases.</summary>
public sealed class InProcessFuzzFixture : IDisposable
{
    internal FuzzHarness Harness { get; } = new(FuzzHarness.InProcess);

    public void Dispose() => Harness.Dispose();
}

/// <summary>
/// A small seeded fuzz run in the main suite (the sweep project runs a larger one in real processes): mutated
/// sample scenes through trace and inspect, mutated reports through compare; every run must end with exit code 0,
/// 1 or 2, at most one stderr line, within the time limit.
/// </summary>
public sealed class FuzzTests(InProcessFuzzFixture fixture, ITestOutputHelper log) : IClassFixture<InProcessFuzzFixture>
{
    public const int Cases = 120;

    public static TheoryData<int> Seeds() => [.. Enumerable.Range(0, Cases)];

    [Theory]
    [MemberData(nameof(Seeds))]
    public void A_mutated_input_ends_in_exit_0_1_or_2_with_at_most_one_line_in_time(int seed) => fixture.Harness.Expect(seed, log);
}
