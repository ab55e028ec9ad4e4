using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;
using VoxProf.Reports.Images;

namespace VoxProf.Tests.Reports;

/// <summary>Reads text back out of a decoded image by drawing the expected text with the same font and comparing.</summary>
internal static class TextInPixels
{
    /// <summary>
    /// The first pixel (as a message) where the image differs from <paramref name="text"/> drawn at (x, y) in
    /// <paramref name="ink"/> on <paramref name="background"/>, over the text's whole cell box; null when it matches.
    /// </summary>
    public static string? Mismatch(PngPicture png, int x, int y, string text, Rgba32 ink, Rgba32 background, int scale)
    {
        int width = PixelFont.MeasureWidth(text, scale), height = PixelFont.CellHeight * scale;
        using var expected = new Image<Rgba32>(width, height, background);
        PixelFont.Draw(expected, 0, 0, text, ink, scale);
        for (int dy = 0; dy < height; dy++)
        {
            for (int dx = 0; dx < width; dx++)
            {
                if (x + dx >= png.Image.Width || y + dy >= png.Image.Height)
                    return $"\"{text}\" runs out of the image at ({x + dx}, {y + dy})";
                if (png.At(x + dx, y + dy) != expected[dx, dy])
                    return $"\"{text}\" differs at ({x + dx}, {y + dy}): {png.At(x + dx, y + dy)} instead of {expected[dx, dy]}";
            }
        }
        return null;
    }
}
