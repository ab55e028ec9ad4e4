using System.Globalization;

namespace VoxProf.Reports.Images;

/// <summary>How many values of an image fall below and above a scale, and so take its end colours.</summary>
public readonly record struct ScaleClip(long Below, long Above, long Total)
{
    public string BelowShare => ShareOf(Below);

    public string AboveShare => ShareOf(Above);

    /// <summary>Below and above together.</summary>
    public string BeyondShare => ShareOf(Below + Above);

    public static ScaleClip Count(ReadOnlySpan<uint> values, double min, double max)
    {
        long below = 0, above = 0;
        foreach (uint v in values)
        {
            if (v < min)
                below++;
            else if (v > max)
                above++;
        }
        return new ScaleClip(below, above, values.Length);
    }

    /// <summary>A share of the pixels as a percentage that never rounds a nonzero count to "0%".</summary>
    public string ShareOf(long count)
    {
        double p = Total == 0 ? 0 : 100.0 * count / Total;
        return p switch
        {
            0 => "0%",
            < 0.1 => "<0.1%",
            < 10 => p.ToString("0.0", CultureInfo.InvariantCulture) + "%",
            _ => p.ToString("0", CultureInfo.InvariantCulture) + "%",
        };
    }
}
