using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Tests.Traversal;
using Xunit.Abstractions;

namespace VoxProf.Sweeps.Traversal;

/// <summary>
/// The full prepass property sweep (the README's test run has a short version): fields of view from 1° to 120°,
/// K = 2, 4 and 8, distances up to 60,000 voxels, volumes up to 16,384 voxels long, every tree strategy; pixel by pixel,
/// the prepass never starts a pixel past its first hit and never changes a hit.
/// </summary>
public class PrepassSweepTests(ITestOutputHelper output)
{
    public static TheoryData<int> Batches() => [0, 1, 2, 3];

    [Theory]
    [MemberData(nameof(Batches))]
    public void The_prepass_never_changes_a_hit(int batch)
    {
        var settings = new PrepassProperty.Settings([512, 2048, 8192, 16384], 160, 120,
            [BuiltInStrategies.Slab, BuiltInStrategies.Dda, BuiltInStrategies.DdaMask, BuiltInStrategies.Hdda]);
        var tally = new PrepassProperty.Tally();
        for (int seed = 1000 + batch * 50; seed < 1000 + (batch + 1) * 50; seed++)
            PrepassProperty.Check(seed, settings, tally);
        output.WriteLine($"batch {batch}: {tally.Pixels} pixels, {tally.Hits} hits, {tally.Checks} comparisons, {tally.Skipped} voxels skipped");
        tally.Failures.Should().BeEmpty();
        tally.Hits.Should().BeGreaterThan(tally.Pixels / 20);
        tally.Skipped.Should().BeGreaterThan(0);
    }
}
