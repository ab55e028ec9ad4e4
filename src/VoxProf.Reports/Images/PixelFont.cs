using System.Text;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;

namespace VoxProf.Reports.Images;

/// <summary>
/// A 5×7 pixel font with descenders (ImageSharp 2.x has no text drawing available here), for the title bands and
/// legends of every image. Glyphs are in <see cref="PixelFontGlyphs"/>. Characters it lacks are drawn as their base
/// letter when they have one (é as e), else as '?', so no label silently loses a character.
/// </summary>
public static class PixelFont
{
    public const int GlyphWidth = 5;

    /// <summary>Rows from the cap line to the baseline.</summary>
    public const int CapHeight = 7;

    /// <summary>Rows of a glyph cell: cap height plus two rows of descender.</summary>
    public const int CellHeight = CapHeight + 2;

    /// <summary>Horizontal distance between glyph origins, in font pixels.</summary>
    public const int Advance = GlyphWidth + 1;

    /// <summary>Vertical distance between lines, in font pixels.</summary>
    public const int LineHeight = CellHeight + 2;

    private static readonly Dictionary<char, ulong> Glyphs = Parse(PixelFontGlyphs.Source);

    /// <summary>Characters with a glyph of their own.</summary>
    public static IEnumerable<char> Characters => Glyphs.Keys;

    public static bool Supports(char c) => Glyphs.ContainsKey(c);

    /// <summary>The character whose glyph is drawn for <paramref name="c"/>.</summary>
    public static char Resolve(char c)
    {
        if (Glyphs.ContainsKey(c))
            return c;
        switch (c)
        {
            case '\u2212': // minus sign
            case '\u2010': // hyphen
            case '\u2013': // en dash
                return '-';
            case '\u00A0':
                return ' ';
        }
        // A letter with marks (é, ñ, Å) decomposes into its base letter followed by the marks.
        string decomposed = c.ToString().Normalize(NormalizationForm.FormD);
        return decomposed.Length > 1 && char.IsLetter(decomposed[0]) && Glyphs.ContainsKey(decomposed[0]) ? decomposed[0] : '?';
    }

    /// <summary>Whether the glyph drawn for <paramref name="c"/> sets font pixel (gx, gy); gy counts from the cap line.</summary>
    public static bool IsSet(char c, int gx, int gy)
    {
        if ((uint)gx >= GlyphWidth || (uint)gy >= CellHeight)
            return false;
        return (Glyphs[Resolve(c)] & (1UL << (gy * GlyphWidth + gx))) != 0;
    }

    /// <summary>Width in image pixels of <paramref name="text"/> at <paramref name="scale"/>, without trailing space.</summary>
    public static int MeasureWidth(string text, int scale) =>
        text.Length == 0 ? 0 : ((text.Length - 1) * Advance + GlyphWidth) * scale;

    /// <summary>How many characters fit in <paramref name="width"/> image pixels at <paramref name="scale"/>.</summary>
    public static int CharactersIn(int width, int scale) =>
        width < GlyphWidth * scale ? 0 : 1 + (width - GlyphWidth * scale) / (Advance * scale);

    /// <summary>
    /// Draws <paramref name="text"/> with the top-left corner of its first cell at (x, y), each font pixel a
    /// <paramref name="scale"/> × <paramref name="scale"/> square; pixels outside the image are skipped.
    /// </summary>
    public static void Draw(Image<Rgba32> image, int x, int y, string text, Rgba32 colour, int scale)
    {
        for (int i = 0; i < text.Length; i++)
        {
            ulong bits = Glyphs[Resolve(text[i])];
            int ox = x + i * Advance * scale;
            for (int gy = 0; gy < CellHeight; gy++)
            {
                for (int gx = 0; gx < GlyphWidth; gx++)
                {
                    if ((bits & (1UL << (gy * GlyphWidth + gx))) != 0)
                        Fill(image, ox + gx * scale, y + gy * scale, scale, colour);
                }
            }
        }
    }

    private static void Fill(Image<Rgba32> image, int x, int y, int size, Rgba32 colour)
    {
        for (int py = Math.Max(y, 0); py < Math.Min(y + size, image.Height); py++)
            for (int px = Math.Max(x, 0); px < Math.Min(x + size, image.Width); px++)
                image[px, py] = colour;
    }

    private static Dictionary<char, ulong> Parse(Dictionary<char, string> source)
    {
        var glyphs = new Dictionary<char, ulong>();
        foreach (var (c, pattern) in source)
        {
            string[] rows = pattern.Split(' ');
            if ((rows.Length != CapHeight && rows.Length != CellHeight) || rows.Any(r => r.Length != GlyphWidth))
                throw new InvalidOperationException($"glyph '{c}' must have {CapHeight} or {CellHeight} rows of {GlyphWidth} cells");
            ulong bits = 0;
            for (int gy = 0; gy < rows.Length; gy++)
            {
                for (int gx = 0; gx < GlyphWidth; gx++)
                {
                    if (rows[gy][gx] == '#')
                        bits |= 1UL << (gy * GlyphWidth + gx);
                }
            }
            glyphs[c] = bits;
        }
        return glyphs;
    }
}
