using System.Globalization;

namespace VoxProf.Reports.Images;

/// <summary>Short legend labels that fit the pixel font: 950, 1.25k, 12M, 3e9, +25%.</summary>
public static class TickFormat
{
    public static string Compact(double value, bool signed = false)
    {
        string sign = value < 0 ? "-" : signed && value > 0 ? "+" : "";
        double a = Math.Abs(value);
        string body = a switch
        {
            >= 1e9 => Exponent(a),
            >= 1e6 => Mantissa(a / 1e6) + "M",
            >= 1e3 => Mantissa(a / 1e3) + "k",
            _ => Mantissa(a),
        };
        return body == "0" ? "0" : sign + body;
    }

    /// <summary>Three significant digits at most: 950, 12.5, 1.25 (enough for round tick steps such as 1.25k).</summary>
    private static string Mantissa(double m) => Trim(m, m >= 100 ? 0 : m >= 10 ? 1 : 2);

    /// <summary>A fraction as a percentage: 0.25 → 25%, with a sign when asked.</summary>
    public static string Percent(double fraction, bool signed = false)
    {
        double p = fraction * 100;
        string sign = p < 0 ? "-" : signed && p > 0 ? "+" : "";
        string body = Trim(Math.Abs(p), Math.Abs(p) >= 10 ? 0 : 1);
        return body == "0" ? "0%" : sign + body + "%";
    }

    /// <summary>A value for a title: up to four significant digits, no exponent below 10^9 (116, 12.35, 41230).</summary>
    public static string Precise(double value)
    {
        double a = Math.Abs(value);
        if (a >= 1e9)
            return (value < 0 ? "-" : "") + Exponent(a);
        int decimals = a >= 1000 ? 0 : a >= 100 ? 1 : a >= 10 ? 2 : 3;
        string text = Trim(value, decimals);
        return text == "-0" ? "0" : text;
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
