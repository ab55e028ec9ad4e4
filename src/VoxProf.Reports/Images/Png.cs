using SixLabors.ImageSharp;
using SixLabors.ImageSharp.Formats.Png;
using SixLabors.ImageSharp.PixelFormats;

namespace VoxProf.Reports.Images;

/// <summary>PNG encoding with VoxProf's text chunks (tEXt keyword/value pairs).</summary>
public static class Png
{
    private static readonly PngEncoder Encoder = new()
    {
        ColorType = PngColorType.Rgb,
        BitDepth = PngBitDepth.Bit8,
        CompressionLevel = PngCompressionLevel.DefaultCompression,
    };

    public static void AddText(Image<Rgba32> image, string keyword, string value) =>
        image.Metadata.GetPngMetadata().TextData.Add(new PngTextData(keyword, value, string.Empty, string.Empty));

    public static void Save(Image<Rgba32> image, Stream stream) => image.SaveAsPng(stream, Encoder);
}
