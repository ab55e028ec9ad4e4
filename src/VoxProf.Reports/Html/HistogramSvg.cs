using System.Globalization;
using System.Text;

namespace VoxProf.Reports.Html;

/// <summary>
/// A <see cref="CostHistogram"/> as inline SVG: a bar per bin, the pixels above the range as a last bar set apart,
/// the mean and the 90th percentile as marked lines, and a native tooltip on every bar. Colours come from the
/// page's style sheet (classes hist-*), so the figure follows the page.
/// </summary>
public static class HistogramSvg
{
    public const int Width = 420;
    public const int Height = 200;
    private const double Left = 52, Right = 12, Top = 14, Bottom = 38;
    private const double PlotWidth = Width - Left - Right, PlotHeight = Height - Top - Bottom;

    /// <param name="title">What the figure shows, for its &lt;title&gt; (read out by screen readers).</param>
    /// <param name="unit">The cost's unit, for the axis and tooltips ("iterations").</param>
    public static string Render(CostHistogram h, string title, string unit)
    {
        var inv = CultureInfo.InvariantCulture;
        var sb = new StringBuilder();
        long pixels = Math.Max(1, h.Pixels);
        int slots = h.Counts.Length + (h.Above > 0 ? 2 : 0);
        double slot = PlotWidth / Math.Max(1, slots);
        double yTop = NiceShare(Math.Max(h.Counts.DefaultIfEmpty(0).Max(), h.Above) / (double)pixels);
        double X(double value) => Left + value / h.Top * slot * h.Counts.Length;
        double Y(double share) => Top + PlotHeight * (1 - share / yTop);

        sb.Append(inv, $"<svg class=\"hist\" xmlns=\"http://www.w3.org/2000/svg\" viewBox=\"0 0 {Width} {Height}\" role=\"img\">");
        sb.Append("<title>").Append(HtmlText.Encode(title)).Append("</title>");

        // Grid lines and the share axis.
        foreach (double share in ShareTicks(yTop))
        {
            double y = Y(share);
            sb.Append(inv, $"<line class=\"hist-grid\" x1=\"{Left:0.#}\" y1=\"{y:0.#}\" x2=\"{Width - Right:0.#}\" y2=\"{y:0.#}\"/>");
            sb.Append(inv, $"<text class=\"hist-label\" x=\"{Left - 6:0.#}\" y=\"{y + 4:0.#}\" text-anchor=\"end\">{Percent(share)}</text>");
        }

        for (int i = 0; i < h.Counts.Length; i++)
        {
            long from = i * h.BinWidth, to = from + h.BinWidth - 1;
            string range = from == to ? $"{from}" : $"{from}–{to}";
            Bar(sb, "hist-bar", Left + i * slot, slot, Y(h.Counts[i] / (double)pixels), h.Counts[i], pixels, $"{range} {unit}");
        }
        if (h.Above > 0)
            Bar(sb, "hist-above", Left + (h.Counts.Length + 1) * slot, slot, Y(h.Above / (double)pixels), h.Above, pixels, $"≥ {h.Top} {unit}");

        // Cost axis: round values under the bins, and the label of the set-apart bar.
        double baseline = Top + PlotHeight;
        sb.Append(inv, $"<line class=\"hist-axis\" x1=\"{Left:0.#}\" y1=\"{baseline:0.#}\" x2=\"{Width - Right:0.#}\" y2=\"{baseline:0.#}\"/>");
        long step = CostHistogram.WholeStep(h.Top / 5.0);
        for (long v = 0; v <= h.Top; v += step)
        {
            double x = X(v);
            sb.Append(inv, $"<line class=\"hist-axis\" x1=\"{x:0.#}\" y1=\"{baseline:0.#}\" x2=\"{x:0.#}\" y2=\"{baseline + 4:0.#}\"/>");
            sb.Append(inv, $"<text class=\"hist-label\" x=\"{x:0.#}\" y=\"{baseline + 16:0.#}\" text-anchor=\"middle\">{v}</text>");
        }
        if (h.Above > 0)
        {
            double x = Left + (h.Counts.Length + 1.5) * slot;
            sb.Append(inv, $"<text class=\"hist-label\" x=\"{x:0.#}\" y=\"{baseline + 16:0.#}\" text-anchor=\"middle\">≥{h.Top}</text>");
        }
        sb.Append(inv, $"<text class=\"hist-label\" x=\"{Left + PlotWidth / 2:0.#}\" y=\"{Height - 4}\" text-anchor=\"middle\">{HtmlText.Encode(unit)} per pixel</text>");

        Mark(sb, "hist-mean", h.Mean, "mean", h, X);
        Mark(sb, "hist-p90", h.P90, "p90", h, X);
        sb.Append("</svg>");
        return sb.ToString();
    }

    private static void Bar(StringBuilder sb, string cls, double x, double slot, double y, long count, long pixels, string what)
    {
        double height = Top + PlotHeight - y;
        sb.Append(CultureInfo.InvariantCulture,
            $"<rect class=\"{cls}\" x=\"{x + 0.5:0.##}\" y=\"{y:0.##}\" width=\"{Math.Max(0.5, slot - 1):0.##}\" height=\"{height:0.##}\">");
        sb.Append(CultureInfo.InvariantCulture, $"<title>{HtmlText.Encode(what)}: {count} pixels ({Percent(count / (double)pixels)})</title></rect>");
    }

    /// <summary>A labelled vertical line at <paramref name="value"/>, left out when it is past the bins.</summary>
    private static void Mark(StringBuilder sb, string cls, double value, string name, CostHistogram h, Func<double, double> x)
    {
        if (!(value >= 0 && value < h.Top))
            return;
        double px = x(value);
        var inv = CultureInfo.InvariantCulture;
        sb.Append(inv, $"<line class=\"{cls}\" x1=\"{px:0.#}\" y1=\"{Top:0.#}\" x2=\"{px:0.#}\" y2=\"{Top + PlotHeight:0.#}\"/>");
        bool right = px < Left + PlotWidth * 0.75;
        sb.Append(inv, $"<text class=\"hist-label {cls}\" x=\"{px + (right ? 4 : -4):0.#}\" y=\"{Top + (name == "mean" ? 10 : 22):0.#}\" text-anchor=\"{(right ? "start" : "end")}\">{name} {value:0.#}</text>");
    }

    /// <summary>The top of the share axis: 1, 2 or 5 × 10ⁿ percent at or above <paramref name="largest"/>.</summary>
    private static double NiceShare(double largest)
    {
        if (!(largest > 0))
            return 0.01;
        double step = 0.001;
        while (true)
        {
            foreach (double m in new[] { 1.0, 2.0, 5.0 })
            {
                if (m * step >= largest * (1 - 1e-12))
                    return Math.Min(1, m * step);
            }
            step *= 10;
        }
    }

    /// <summary>Ticks at round shares: the top is 1, 2 or 5 × 10ⁿ, so fifths of a 5 and quarters of a 1 or 2 are round.</summary>
    private static IEnumerable<double> ShareTicks(double top)
    {
        double mantissa = top / Math.Pow(10, Math.Floor(Math.Log10(top) + 1e-9));
        int parts = Math.Abs(mantissa - 5) < 1e-6 ? 5 : 4;
        for (int i = 0; i <= parts; i++)
            yield return top * i / parts;
    }

    private static string Percent(double share)
    {
        double p = share * 100;
        return p.ToString(p >= 10 || p == 0 ? "0" : p >= 1 ? "0.#" : "0.##", CultureInfo.InvariantCulture) + "%";
    }
}
