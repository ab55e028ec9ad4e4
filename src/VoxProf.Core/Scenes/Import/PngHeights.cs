using System.Globalization;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.Formats;
using SixLabors.ImageSharp.Formats.Png;
using SixLabors.ImageSharp.PixelFormats;

namespace VoxProf.Core.Scenes.Import;

/// <summary>An 8- or 16-bit greyscale PNG decoded by ImageSharp into one value per pixel, row 0 first.</summary>
internal sealed record PngHeights(ushort[] Values, int Width, int Height, int MaxValue)
{
    public static PngHeights Read(byte[] bytes, string file, long maxPixels)
    {
        IImageInfo? info;
        IImageFormat? format;
        try
        {
            info = Image.Identify(bytes, out format);
        }
        catch (Exception ex) when (ex is ImageFormatException or InvalidDataException)
        {
            throw new SceneFormatException(file, "$", "not a readable PNG (" + ex.Message + "); expected an 8- or 16-bit greyscale PNG");
        }
        if (info is null || format is not PngFormat)
            throw new SceneFormatException(file, "$", $"not a PNG (found {format?.Name ?? "an unknown format"}); expected an 8- or 16-bit greyscale PNG");
        PngMetadata png = info.Metadata.GetPngMetadata();
        if (png.ColorType != PngColorType.Grayscale || png.BitDepth is not (PngBitDepth.Bit8 or PngBitDepth.Bit16))
        {
            throw new SceneFormatException(file, "$", string.Create(CultureInfo.InvariantCulture,
                $"colour type {png.ColorType}, {BitsOf(png.BitDepth)} bits; expected greyscale with 8 or 16 bits"));
        }
        if ((long)info.Width * info.Height > maxPixels)
        {
            throw new SceneFormatException(file, "$", string.Create(CultureInfo.InvariantCulture,
                $"{info.Width} × {info.Height} pixels; expected at most {maxPixels}"));
        }
        int max = png.BitDepth == PngBitDepth.Bit8 ? 255 : 65535;
        // Decoded as 16-bit luminance: ImageSharp widens an 8-bit v to 257·v, so dividing by 65535 gives v/255 exactly.
        using Image<L16> image = Image.Load<L16>(bytes);
        var values = new ushort[(long)image.Width * image.Height];
        image.ProcessPixelRows(rows =>
        {
            for (int y = 0; y < rows.Height; y++)
            {
                Span<L16> row = rows.GetRowSpan(y);
                for (int x = 0; x < row.Length; x++)
                    values[(long)y * image.Width + x] = max == 255 ? (ushort)(row[x].PackedValue / 257) : row[x].PackedValue;
            }
        });
        return new PngHeights(values, image.Width, image.Height, max);
    }

    private static string BitsOf(PngBitDepth? depth) => depth switch
    {
        PngBitDepth.Bit1 => "1",
        PngBitDepth.Bit2 => "2",
        PngBitDepth.Bit4 => "4",
        PngBitDepth.Bit8 => "8",
        PngBitDepth.Bit16 => "16",
        _ => "unknown",
    };
}
