namespace VoxProf.Core.Traversal;

/// <summary>
/// How a strategy's timed region divides between tracing and the memory model. Every worker runs a tile's kernel and
/// then the model's pass over that tile's reads, one after the other, so the region's wall time is split in
/// proportion to the time all tiles spent in each; on one thread that is exactly the time of each.
/// </summary>
public static class TimedSplit
{
    /// <summary>
    /// The tracing's and the model's shares of <paramref name="wall"/>, from the summed times (any unit, both the
    /// same) the tiles spent tracing and modelling. With no model time, all of it is the tracing's.
    /// </summary>
    public static (TimeSpan Tracing, TimeSpan Model) Split(TimeSpan wall, long tracing, long model)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(tracing);
        ArgumentOutOfRangeException.ThrowIfNegative(model);
        if (model == 0)
            return (wall, TimeSpan.Zero);
        long modelTicks = (long)Math.Round(wall.Ticks * ((double)model / ((double)tracing + model)));
        return (TimeSpan.FromTicks(wall.Ticks - modelTicks), TimeSpan.FromTicks(modelTicks));
    }
}
