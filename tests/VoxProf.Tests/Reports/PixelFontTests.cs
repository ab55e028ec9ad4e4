using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;
using VoxProf.Reports.Images;

namespace VoxProf.Tests.Reports;

public class PixelFontTests
{
    [Fact]
    public void The_digit_eight_is_drawn_as_its_glyph_at_twice_the_size()
    {
        using var image = new Image<Rgba32>(10, 18);
        PixelFont.Draw(image, 0, 0, "8", Legend.Ink, 2);
        string[] rows = [".###.", "#...#", "#...#", ".###.", "#...#", "#...#", ".###.", ".....", "....."];
        for (int y = 0; y < 18; y++)
            for (int x = 0; x < 10; x++)
                (image[x, y] == Legend.Ink).Should().Be(rows[y / 2][x / 2] == '#', $"pixel ({x},{y})");
    }

    // Pairs a reader can take for each other in a small font: digits against letters, and a few letters among
    // themselves. At half size every font pixel is one screen pixel, so they must differ in several pixels.
    [Theory]
    [InlineData('0', 'O')]
    [InlineData('0', 'D')]
    [InlineData('0', 'o')]
    [InlineData('8', 'B')]
    [InlineData('8', '3')]
    [InlineData('1', 'l')]
    [InlineData('1', 'I')]
    [InlineData('1', '7')]
    [InlineData('5', 'S')]
    [InlineData('2', 'Z')]
    [InlineData('6', 'b')]
    [InlineData('6', 'G')]
    [InlineData('9', 'g')]
    [InlineData('9', 'q')]
    [InlineData('4', 'A')]
    [InlineData('l', 'I')]
    [InlineData('O', 'D')]
    [InlineData('≥', '>')]
    public void Easily_confused_glyphs_differ_in_at_least_three_pixels(char a, char b)
    {
        Difference(a, b).Should().BeGreaterThanOrEqualTo(3);
    }

    [Fact]
    public void Every_glyph_differs_from_every_other_in_at_least_two_pixels()
    {
        var chars = PixelFont.Characters.Where(c => c != ' ').ToList();
        foreach (char a in chars)
        {
            foreach (char b in chars.Where(b => b > a))
                Difference(a, b).Should().BeGreaterThanOrEqualTo(2, $"'{a}' against '{b}'");
        }
    }

    [Fact]
    public void Every_printable_ASCII_character_has_a_glyph()
    {
        for (char c = ' '; c <= '~'; c++)
        {
            if (c != '`')
                PixelFont.Supports(c).Should().BeTrue($"'{c}'");
        }
    }

    [Theory]
    [InlineData('é', 'e')]
    [InlineData('Å', 'A')]
    [InlineData('\u2212', '-')]
    [InlineData('漢', '?')]
    [InlineData('`', '?')]
    public void A_character_without_a_glyph_is_drawn_as_its_base_letter_or_a_question_mark(char c, char drawn)
    {
        PixelFont.Resolve(c).Should().Be(drawn);
    }

    private static int Difference(char a, char b)
    {
        int d = 0;
        for (int y = 0; y < PixelFont.CellHeight; y++)
            for (int x = 0; x < PixelFont.GlyphWidth; x++)
                d += PixelFont.IsSet(a, x, y) != PixelFont.IsSet(b, x, y) ? 1 : 0;
        return d;
    }
}
