using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;

namespace VoxProf.Reports.Images;

/// <summary>
/// A 3×5 pixel font for legend labels (ImageSharp 2.x has no text drawing available here): digits, A–Z,
/// '.', '-', '+', '%', ':', ' ', with lowercase 'e' and 'k' of their own; other lowercase letters use capitals.
/// </summary>
public static class PixelFont
{
    public const int GlyphWidth = 3;
    public const int GlyphHeight = 5;
    /// <summary>Horizontal distance between glyph origins, in font pixels.</summary>
    public const int Advance = 4;

    // Rows top to bottom, '#' set; one entry per character.
    private static readonly Dictionary<char, ushort> Glyphs = Parse(new Dictionary<char, string>
    {
        ['0'] = "### #.# #.# #.# ###",
        ['1'] = ".#. ##. .#. .#. ###",
        ['2'] = "### ..# ### #.. ###",
        ['3'] = "### ..# ### ..# ###",
        ['4'] = "#.# #.# ### ..# ..#",
        ['5'] = "### #.. ### ..# ###",
        ['6'] = "### #.. ### #.# ###",
        ['7'] = "### ..# ..# ..# ..#",
        ['8'] = "### #.# ### #.# ###",
        ['9'] = "### #.# ### ..# ###",
        ['.'] = "... ... ... ... .#.",
        ['-'] = "... ... ### ... ...",
        ['+'] = "... .#. ### .#. ...",
        ['%'] = "#.# ..# .#. #.. #.#",
        [':'] = "... .#. ... .#. ...",
        [' '] = "... ... ... ... ...",
        ['e'] = "... .#. ### #.. .##",
        ['k'] = "#.. #.# ##. #.# #.#",
        ['A'] = ".#. #.# ### #.# #.#",
        ['B'] = "##. #.# ##. #.# ##.",
        ['C'] = ".## #.. #.. #.. .##",
        ['D'] = "##. #.# #.# #.# ##.",
        ['E'] = "### #.. ##. #.. ###",
        ['F'] = "### #.. ##. #.. #..",
        ['G'] = ".## #.. #.# #.# .##",
        ['H'] = "#.# #.# ### #.# #.#",
        ['I'] = "### .#. .#. .#. ###",
        ['J'] = "..# ..# ..# #.# .#.",
        ['K'] = "#.# #.# ##. #.# #.#",
        ['L'] = "#.. #.. #.. #.. ###",
        ['M'] = "#.# ### ### #.# #.#",
        ['N'] = "##. #.# #.# #.# #.#",
        ['O'] = ".#. #.# #.# #.# .#.",
        ['P'] = "##. #.# ##. #.. #..",
        ['Q'] = ".#. #.# #.# ##. .##",
        ['R'] = "##. #.# ##. #.# #.#",
        ['S'] = ".## #.. .#. ..# ##.",
        ['T'] = "### .#. .#. .#. .#.",
        ['U'] = "#.# #.# #.# #.# ###",
        ['V'] = "#.# #.# #.# #.# .#.",
        ['W'] = "#.# #.# ### ### #.#",
        ['X'] = "#.# #.# .#. #.# #.#",
        ['Y'] = "#.# #.# .#. .#. .#.",
        ['Z'] = "### ..# .#. #.. ###",
    });

    public static bool Supports(char c) => Glyphs.ContainsKey(c) || Glyphs.ContainsKey(char.ToUpperInvariant(c));

    /// <summary>Whether the glyph for <paramref name="c"/> sets font pixel (gx, gy); unknown characters are blank.</summary>
    public static bool IsSet(char c, int gx, int gy)
    {
        if (!TryGlyph(c, out ushort bits) || (uint)gx >= GlyphWidth || (uint)gy >= GlyphHeight)
            return false;
        return (bits & (1 << (gy * GlyphWidth + gx))) != 0;
    }

    /// <summary>Width in image pixels of <paramref name="text"/> at <paramref name="scale"/>, without trailing space.</summary>
    public static int MeasureWidth(string text, int scale) =>
        text.Length == 0 ? 0 : ((text.Length - 1) * Advance + GlyphWidth) * scale;

    /// <summary>Draws <paramref name="text"/> with its top-left corner at (x, y); pixels outside the image are skipped.</summary>
    public static void Draw(Image<Rgba32> image, int x, int y, string text, Rgba32 colour, int scale)
    {
        for (int i = 0; i < text.Length; i++)
        {
            if (!TryGlyph(text[i], out ushort bits))
                continue;
            int ox = x + i * Advance * scale;
            for (int gy = 0; gy < GlyphHeight; gy++)
            {
                for (int gx = 0; gx < GlyphWidth; gx++)
                {
                    if ((bits & (1 << (gy * GlyphWidth + gx))) == 0)
                        continue;
                    for (int sy = 0; sy < scale; sy++)
                    {
                        for (int sx = 0; sx < scale; sx++)
                        {
                            int px = ox + gx * scale + sx, py = y + gy * scale + sy;
                            if ((uint)px < (uint)image.Width && (uint)py < (uint)image.Height)
                                image[px, py] = colour;
                        }
                    }
                }
            }
        }
    }

    private static bool TryGlyph(char c, out ushort bits) =>
        Glyphs.TryGetValue(c, out bits) || Glyphs.TryGetValue(char.ToUpperInvariant(c), out bits);

    private static Dictionary<char, ushort> Parse(Dictionary<char, string> source)
    {
        var glyphs = new Dictionary<char, ushort>();
        foreach (var (c, pattern) in source)
        {
            string rows = pattern.Replace(" ", "", StringComparison.Ordinal);
            if (rows.Length != GlyphWidth * GlyphHeight)
                throw new InvalidOperationException($"glyph '{c}' has {rows.Length} cells");
            ushort bits = 0;
            for (int i = 0; i < rows.Length; i++)
            {
                if (rows[i] == '#')
                    bits |= (ushort)(1 << i);
            }
            glyphs[c] = bits;
        }
        return glyphs;
    }
}
