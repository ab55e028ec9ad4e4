using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;

namespace VoxProf.Reports.Images;

/// <summary>
/// What an image says about itself: the heading (what is shown: scene, camera, strategy, map) and the details (unit,
/// size, scale). Each is a list of short fields; the band joins them with " · " and wraps between fields.
/// </summary>
public sealed record ImageTitle(IReadOnlyList<string> Heading, IReadOnlyList<string> Details)
{
    public ImageTitle WithDetails(params string[] more) => this with { Details = [.. Details, .. more] };
}

/// <summary>One wrapped line of a title band.</summary>
public readonly record struct TitleLine(string Text, bool IsHeading);

/// <summary>The band across the top of every image, in the pixel font: the heading bright, the details a little dimmer.</summary>
public static class TitleBand
{
    public const string Separator = " · ";

    public static readonly Rgba32 HeadingInk = new(245, 245, 245, 255);
    public static readonly Rgba32 DetailInk = new(200, 202, 208, 255);

    /// <summary>Space above the first line and below the last, in font pixels.</summary>
    public const int Padding = 3;

    /// <summary>Left edge of the text, in font pixels.</summary>
    public const int Indent = 3;

    public static int Height(int lines, int scale) =>
        lines == 0 ? 0 : (2 * Padding + lines * PixelFont.LineHeight - (PixelFont.LineHeight - PixelFont.CellHeight)) * scale;

    /// <summary>Top of line <paramref name="index"/> in image pixels.</summary>
    public static int LineTop(int index, int scale) => (Padding + index * PixelFont.LineHeight) * scale;

    public static int TextLeft(int scale) => Indent * scale;

    /// <summary>
    /// Lays the heading and then the details out in lines that fit <paramref name="width"/>: whole fields go on a line
    /// while they fit; a field too long for a line of its own is broken between words, a word too long at any
    /// character.
    /// </summary>
    public static IReadOnlyList<TitleLine> Wrap(ImageTitle title, int width, int scale)
    {
        int perLine = Math.Max(1, PixelFont.CharactersIn(width - 2 * TextLeft(scale), scale));
        var lines = new List<TitleLine>();
        Add(title.Heading, true);
        Add(title.Details, false);
        return lines;

        void Add(IReadOnlyList<string> fields, bool heading)
        {
            string current = "";
            foreach (string field in fields.Where(f => f.Length > 0))
            {
                string joined = current.Length == 0 ? field : current + Separator + field;
                if (joined.Length <= perLine)
                {
                    current = joined;
                    continue;
                }
                if (current.Length > 0)
                    lines.Add(new TitleLine(current, heading));
                current = "";
                foreach (string word in field.Split(' '))
                {
                    string next = current.Length == 0 ? word : current + " " + word;
                    if (next.Length <= perLine)
                    {
                        current = next;
                        continue;
                    }
                    if (current.Length > 0)
                        lines.Add(new TitleLine(current, heading));
                    current = word;
                    while (current.Length > perLine)
                    {
                        lines.Add(new TitleLine(current[..perLine], heading));
                        current = current[perLine..];
                    }
                }
            }
            if (current.Length > 0)
                lines.Add(new TitleLine(current, heading));
        }
    }

    public static void Draw(Image<Rgba32> image, IReadOnlyList<TitleLine> lines, int scale)
    {
        for (int i = 0; i < lines.Count; i++)
            PixelFont.Draw(image, TextLeft(scale), LineTop(i, scale), lines[i].Text, lines[i].IsHeading ? HeadingInk : DetailInk, scale);
    }
}
