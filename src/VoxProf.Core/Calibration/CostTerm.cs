using VoxProf.Core.Statistics;

namespace VoxProf.Core.Calibration;

/// <summary>
/// One priced quantity of a frame: the fixed cost of a pixel (<see cref="Measure"/> null), or the cost of one unit
/// of a work measure summed over the frame's pixels.
/// </summary>
/// <param name="Nanoseconds">GPU time per pixel or per unit of the measure, in nanoseconds; never negative.</param>
public sealed record CostTerm(MeasureDefinition? Measure, double Nanoseconds)
{
    /// <summary>The name of the fixed per-pixel cost in calibration files and reports.</summary>
    public const string PixelName = "pixels";

    /// <summary><see cref="PixelName"/> or the measure's name.</summary>
    public string Name => Measure?.Name ?? PixelName;

    public bool IsPixel => Measure is null;

    /// <summary>What one unit is: "pixel", or the measure's unit ("count").</summary>
    public string Per => Measure?.Unit ?? "pixel";

    /// <summary>This term's share of a frame: <see cref="Nanoseconds"/> × the frame's pixels or the measure's total.</summary>
    public double FrameNanoseconds(long pixels, Func<MeasureDefinition, double> total) =>
        Nanoseconds * (Measure is null ? pixels : total(Measure));
}

/// <summary>The quantities a calibration may price: the pixel, and every measure that counts work.</summary>
public static class CostFeatures
{
    /// <summary>
    /// Measures a cost can be fitted to: every counter and derived total whose rise is more work. prepass-skip
    /// counts distance saved, and a non-negative cost per voxel saved would be meaningless.
    /// </summary>
    public static IReadOnlyList<MeasureDefinition> Usable { get; } = Measures.All.Where(m => m.LowerIsBetter).ToArray();

    /// <summary>
    /// total-iterations and total-node-fetches (the loop and the memory reads, the prepass's share included, so runs
    /// with and without the prepass are priced alike) and slab-tests (the arithmetic that differs most between
    /// strategies).
    /// </summary>
    public static IReadOnlyList<MeasureDefinition> Default { get; } =
        [Measures.TotalIterations, Measures.TotalNodeFetches, Find("slab-tests")!];

    /// <summary>The usable measure called <paramref name="name"/> (case-insensitive), if any.</summary>
    public static MeasureDefinition? Find(string name) =>
        Usable.FirstOrDefault(m => string.Equals(m.Name, name, StringComparison.OrdinalIgnoreCase));

    public static bool TryParse(string name, out MeasureDefinition measure)
    {
        measure = Find(name)!;
        return measure is not null;
    }

    public static string ValidList => string.Join(", ", Usable.Select(m => m.Name));
}
