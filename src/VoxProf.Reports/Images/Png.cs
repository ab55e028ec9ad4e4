using SixLabors.ImageSharp;
using SixLabors.ImageSharp.Formats.Png;
using SixLabors.ImageSharp.PixelFormats;

namespace VoxProf.Reports.Images;

/// <summary>PNG encoding with VoxProf's text chunks (tEXt keyword/value pairs).</summary>
public static class Png
{
    /// <summary>
    /// The encoder every image is written with. Deflate level 3 with the Paeth filter encodes the demo's heatmaps in
    /// about a third of the time of ImageSharp's default (level 6, which also filters with Paeth), for files about 37%
    /// larger (docs/performance.md, "PNG encoding"): a trace's images are read once in review, written on every run.
    /// </summary>
    public static PngEncoder Encoder { get; } = new()
    {
        ColorType = PngColorType.Rgb,
        BitDepth = PngBitDepth.Bit8,
        CompressionLevel = PngCompressionLevel.Level3,
        FilterMethod = PngFilterMethod.Paeth,
    };

    public static void AddText(Image<Rgba32> image, string keyword, string value) =>
        image.Metadata.GetPngMetadata().TextData.Add(new PngTextData(keyword, value, string.Empty, string.Empty));

    public static void Save(Image<Rgba32> image, Stream stream) => image.SaveAsPng(stream, Encoder);
}
