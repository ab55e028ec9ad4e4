using System.Globalization;
using System.Numerics;
using VoxProf.Core;

namespace VoxProf.Cli;

/// <summary>Parsers for option values the command-line library leaves as text; each throws a one-line <see cref="InputException"/>.</summary>
public static class OptionParsing
{
    public const int MaxImageSide = 16384;

    /// <summary>"WxH", each side 1..<see cref="MaxImageSide"/>.</summary>
    public static (int Width, int Height) Size(string text, string option = "--size")
    {
        string[] parts = text.Trim().Split('x', 'X');
        if (parts.Length == 2 && TryInt(parts[0], out int w) && TryInt(parts[1], out int h) &&
            w is >= 1 and <= MaxImageSide && h is >= 1 and <= MaxImageSide)
            return (w, h);
        throw new InputException($"{option}: '{text}' is not a valid size, expected WxH with each side 1..{MaxImageSide} (e.g. 1280x720)");
    }

    /// <summary>"X,Y,Z" with finite invariant-culture numbers.</summary>
    public static Vector3 Vector(string text, string option)
    {
        string[] parts = text.Split(',');
        if (parts.Length == 3 && TryFloat(parts[0], out float x) && TryFloat(parts[1], out float y) && TryFloat(parts[2], out float z))
            return new Vector3(x, y, z);
        throw new InputException($"{option}: '{text}' is not a valid vector, expected X,Y,Z (e.g. 12,40.5,-8)");
    }

    /// <summary>"MIN:MAX" with 0 ≤ MIN &lt; MAX.</summary>
    public static (double Min, double Max) Range(string text, string option = "--range")
    {
        string[] parts = text.Split(':');
        if (parts.Length == 2 && TryDouble(parts[0], out double min) && TryDouble(parts[1], out double max) && min >= 0 && max > min)
            return (min, max);
        throw new InputException($"{option}: '{text}' is not a valid range, expected MIN:MAX with 0 <= MIN < MAX (e.g. 0:200)");
    }

    /// <summary>An absolute http(s) URL without query or fragment, e.g. a CI artefact folder.</summary>
    public static Uri LinkBase(string text, string option = "--link-base") =>
        Reports.Model.ReportLinks.IsValidBase(text, out Uri? uri)
            ? uri!
            : throw new InputException($"{option}: '{text}' is not an absolute http or https URL without query or fragment, expected e.g. https://ci.example.org/artifacts/run-42/");

    public delegate bool TryParser<T>(string text, out T value);

    /// <summary>Comma-separated names, each known to <paramref name="parse"/>; duplicates dropped, order kept.</summary>
    public static List<T> List<T>(string text, string option, string what, TryParser<T> parse, string validList)
    {
        var items = new List<T>();
        foreach (string raw in text.Split(','))
        {
            string name = raw.Trim();
            if (name.Length == 0)
                throw new InputException($"{option}: empty name in '{text}'; expected one of: {validList}");
            if (!parse(name, out T value))
                throw new InputException($"{option}: unknown {what} '{name}'; expected one of: {validList}");
            if (!items.Contains(value))
                items.Add(value);
        }
        return items;
    }

    /// <summary>One of a fixed set of words, case-insensitive.</summary>
    public static string Choice(string text, string option, params string[] choices) =>
        choices.FirstOrDefault(c => string.Equals(c, text.Trim(), StringComparison.OrdinalIgnoreCase))
        ?? throw new InputException($"{option}: '{text}' is not valid, expected one of: {string.Join(", ", choices)}");

    private static bool TryInt(string s, out int v) =>
        int.TryParse(s.Trim(), NumberStyles.None, CultureInfo.InvariantCulture, out v);

    private static bool TryFloat(string s, out float v) =>
        float.TryParse(s.Trim(), NumberStyles.Float, CultureInfo.InvariantCulture, out v) && float.IsFinite(v);

    private static bool TryDouble(string s, out double v) =>
        double.TryParse(s.Trim(), NumberStyles.Float, CultureInfo.InvariantCulture, out v) && double.IsFinite(v);
}
