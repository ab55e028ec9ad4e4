namespace VoxProf.Sweeps.Fuzz;

/// <summary>
/// Tests that start real processes under a wall-clock limit run in this collection, after every parallel sweep has
/// finished: beside the full-size agreement sweeps, which keep both cores busy, a two-second trace once took over two
/// minutes and failed the limit for reasons that had nothing to do with its input.
/// </summary>
[CollectionDefinition(Name, DisableParallelization = true)]
public sealed class RunsAlone
{
    public const string Name = "runs alone";
}
