namespace VoxProf.Reports.Images;

public enum ScaleKind
{
    Linear,
    Log,
}

/// <summary>
/// Maps a cost to a position in [0, 1] along the ramp. The log scale uses log10(1 + v) so that a cost of 0 has a
/// place on it. Values outside [Min, Max] are clamped to the ends.
/// </summary>
public sealed record HeatmapScale(ScaleKind Kind, double Min, double Max)
{
    public static HeatmapScale Auto(ScaleKind kind, double max) => new(kind, 0, Math.Max(max, 1));

    public double Fraction(double value)
    {
        double lo = Transform(Min), hi = Transform(Max);
        if (!(hi > lo))
            return value > Min ? 1 : 0;
        return Math.Clamp((Transform(Math.Clamp(value, Min, Max)) - lo) / (hi - lo), 0, 1);
    }

    /// <summary>Tick values and their positions along the bar: round linear steps, or powers of ten on a log scale.</summary>
    public IReadOnlyList<(double Value, double Position)> Ticks(int maxTicks)
    {
        var values = new List<double>();
        if (Kind == ScaleKind.Log)
        {
            if (Min <= 0)
                values.Add(0);
            double p = Math.Pow(10, Math.Ceiling(Math.Log10(Math.Max(Min, 1))));
            var decades = new List<double>();
            for (; p <= Max * (1 + 1e-12); p *= 10)
                decades.Add(p);
            int every = Math.Max(1, (int)Math.Ceiling(decades.Count / (double)Math.Max(1, maxTicks - values.Count)));
            for (int i = 0; i < decades.Count; i += every)
                values.Add(decades[i]);
        }
        else
        {
            // The finest round step that still gives at most maxTicks ticks.
            double span = Max - Min;
            double step = NiceStep(span / Math.Max(1, maxTicks));
            while (Math.Floor(span / step + 1e-9) + 1 > Math.Max(2, maxTicks))
                step = NiceStep(step * 1.0001);
            for (double v = Math.Ceiling(Min / step) * step; v <= Max + step * 1e-9; v += step)
                values.Add(Math.Abs(v) < step * 1e-9 ? 0 : v);
        }
        if (values.Count == 0 || values[0] > Min)
            values.Insert(0, Min);
        return values.Select(v => (v, Fraction(v))).ToList();
    }

    /// <summary>1, 2, 2.5 or 5 times a power of ten, at least <paramref name="raw"/>.</summary>
    public static double NiceStep(double raw)
    {
        if (!(raw > 0))
            return 1;
        double p = Math.Pow(10, Math.Floor(Math.Log10(raw)));
        foreach (double m in new[] { 1.0, 2.0, 2.5, 5.0, 10.0 })
        {
            if (m * p >= raw * (1 - 1e-12))
                return m * p;
        }
        return 10 * p;
    }

    private double Transform(double v) => Kind == ScaleKind.Log ? Math.Log10(1 + Math.Max(v, 0)) : v;
}
