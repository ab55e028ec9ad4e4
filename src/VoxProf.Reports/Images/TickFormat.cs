using System.Globalization;

namespace VoxProf.Reports.Images;

/// <summary>Short legend labels that fit the pixel font: 950, 1.5k, 12M, 3e9, +25%.</summary>
public static class TickFormat
{
    public static string Compact(double value, bool signed = false)
    {
        string sign = value < 0 ? "-" : signed && value > 0 ? "+" : "";
        double a = Math.Abs(value);
        string body = a switch
        {
            >= 1e9 => Exponent(a),
            >= 1e6 => Trim(a / 1e6, 1) + "M",
            >= 1e3 => Trim(a / 1e3, 1) + "k",
            _ => Trim(a, a >= 100 ? 0 : a >= 10 ? 1 : 2),
        };
        return body == "0" ? "0" : sign + body;
    }

    /// <summary>A fraction as a percentage: 0.25 → 25%, with a sign when asked.</summary>
    public static string Percent(double fraction, bool signed = false)
    {
        double p = fraction * 100;
        string sign = p < 0 ? "-" : signed && p > 0 ? "+" : "";
        string body = Trim(Math.Abs(p), Math.Abs(p) >= 10 ? 0 : 1);
        return body == "0" ? "0%" : sign + body + "%";
    }

    private static string Exponent(double a)
    {
        int e = (int)Math.Floor(Math.Log10(a));
        double m = a / Math.Pow(10, e);
        return Trim(m, 1) + "e" + e.ToString(CultureInfo.InvariantCulture);
    }

    private static string Trim(double v, int decimals) =>
        Math.Round(v, decimals, MidpointRounding.AwayFromZero).ToString("0." + new string('#', Math.Max(decimals, 1)), CultureInfo.InvariantCulture);
}
