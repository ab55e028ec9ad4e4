using System.Globalization;
using VoxProf.Core.Statistics;
using VoxProf.Core.Traversal;

namespace VoxProf.Core.Calibration;

/// <summary>An image size, written WxH.</summary>
public readonly record struct ImageSize(int Width, int Height)
{
    public long Pixels => (long)Width * Height;

    public override string ToString() => string.Create(CultureInfo.InvariantCulture, $"{Width}x{Height}");
}

/// <summary>What a calibration was fitted on: the tree branching factors and image sizes of its rows.</summary>
public sealed record FitScope(IReadOnlyList<int> Branchings, IReadOnlyList<ImageSize> Sizes);

/// <summary>
/// A fitted calibration as a trace applies it: predicted GPU time = Σ cost × (pixels or the measure's frame total).
/// </summary>
/// <param name="Device">The GPU and driver the times were measured on, as the user wrote it.</param>
/// <param name="Terms">The per-pixel cost first, then one per feature.</param>
public sealed record CostModel(string Device, IReadOnlyList<CostTerm> Terms, FitScope FittedOn)
{
    /// <summary>Predicted GPU time of a frame of <paramref name="pixels"/> pixels whose measures total <paramref name="total"/>, in ms.</summary>
    public double PredictMs(long pixels, Func<MeasureDefinition, double> total) =>
        Terms.Sum(t => t.FrameNanoseconds(pixels, total)) / 1e6;

    /// <summary>Predicted GPU time of one strategy's frame, in ms.</summary>
    public double PredictMs(StrategyStatistics s) => PredictMs(s.Pixels, m => s[m.Name].Total);

    /// <summary>
    /// Each pixel's predicted cost in picoseconds (rounded; at most <see cref="uint.MaxValue"/>): its fixed cost plus
    /// each cost times the pixel's own count. The pixels add up to <see cref="PredictMs(StrategyStatistics)"/>
    /// within the rounding of half a picosecond each.
    /// </summary>
    public uint[] PixelPicoseconds(StrategyResult result)
    {
        int n = result.Width * result.Height;
        var cost = new double[n];
        foreach (CostTerm term in Terms)
        {
            double ps = term.Nanoseconds * 1000;
            if (term.Measure is null)
            {
                for (int i = 0; i < n; i++)
                    cost[i] += ps;
                continue;
            }
            uint[] values = term.Measure.Values(result);
            for (int i = 0; i < n; i++)
                cost[i] += ps * values[i];
        }
        var pixels = new uint[n];
        for (int i = 0; i < n; i++)
            pixels[i] = (uint)Math.Min(uint.MaxValue, Math.Round(cost[i]));
        return pixels;
    }

    /// <summary>
    /// Why a prediction for a trace of this branching and size may mislead, in one line: the branching factor or
    /// image size the calibration was not fitted on. Null when both match.
    /// </summary>
    public string? ScopeWarning(int branching, int width, int height)
    {
        var fitted = new List<string>();
        var used = new List<string>();
        if (FittedOn.Branchings.Count > 0 && !FittedOn.Branchings.Contains(branching))
        {
            fitted.Add($"branching {List(FittedOn.Branchings)}");
            used.Add($"branching {branching.ToString(CultureInfo.InvariantCulture)}");
        }
        var size = new ImageSize(width, height);
        if (FittedOn.Sizes.Count > 0 && !FittedOn.Sizes.Contains(size))
        {
            fitted.Add($"{List(FittedOn.Sizes)} images");
            used.Add($"{size} images");
        }
        return fitted.Count == 0 ? null
            : $"calibration for {Device} was fitted on {string.Join(" and ", fitted)}, this trace uses {string.Join(" and ", used)}: predicted-ms may not hold";
    }

    private static string List<T>(IEnumerable<T> items) =>
        string.Join(" or ", items.Select(i => string.Format(CultureInfo.InvariantCulture, "{0}", i)));
}
