namespace VoxProf.Reports.Colour;

/// <summary>A point a ramp's colour passes through, in Oklab LCh: chroma and hue angle in degrees.</summary>
/// <remarks>A hue may go past 360 so that a path turns the way it was designed, not the short way round.</remarks>
public readonly record struct HueAnchor(double Chroma, double Hue);

/// <summary>
/// Chroma and hue along a ramp, through equally spaced anchors on a uniform Catmull–Rom spline (the end anchors
/// repeated), so the colour turns smoothly instead of bending at each anchor. Lightness is the ramp's own business:
/// keeping it out of the spline keeps it exactly linear and so strictly monotone.
/// </summary>
internal static class HuePath
{
    public static (double Chroma, double Hue) At(ReadOnlySpan<HueAnchor> anchors, double t)
    {
        int segments = anchors.Length - 1;
        double x = Math.Clamp(t, 0, 1) * segments;
        int i = Math.Min((int)x, segments - 1);
        double s = x - i;
        HueAnchor p0 = anchors[Math.Max(i - 1, 0)], p1 = anchors[i], p2 = anchors[i + 1], p3 = anchors[Math.Min(i + 2, segments)];
        double chroma = CatmullRom(p0.Chroma, p1.Chroma, p2.Chroma, p3.Chroma, s);
        double hue = CatmullRom(p0.Hue, p1.Hue, p2.Hue, p3.Hue, s);
        return (Math.Max(chroma, 0), hue);
    }

    private static double CatmullRom(double p0, double p1, double p2, double p3, double s) =>
        0.5 * (2 * p1 + (p2 - p0) * s + (2 * p0 - 5 * p1 + 4 * p2 - p3) * s * s + (3 * p1 - p0 - 3 * p2 + p3) * s * s * s);
}
