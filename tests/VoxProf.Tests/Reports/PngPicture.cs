using System.Buffers.Binary;
using System.Text;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;
using StbImageSharp;
using VoxProf.Reports.Images;

namespace VoxProf.Tests.Reports;

/// <summary>
/// A VoxProf PNG read back without ImageSharp: pixels decoded by StbImageSharp (an independent decoder) and tEXt
/// chunks found by walking the file's chunks as the PNG specification lays them out (W3C PNG, 2nd edition, §5.3:
/// length, type, data, CRC). The "Picture" chunk says where the picture lies between the title and legend bands.
/// </summary>
internal sealed class PngPicture
{
    private PngPicture(ImageResult image, Dictionary<string, string> text)
    {
        Image = image;
        Text = text;
        var fields = text[ImageLayout.PictureKeyword].Split(' ').Select(f => f.Split('=')).ToDictionary(p => p[0], p => int.Parse(p[1], System.Globalization.CultureInfo.InvariantCulture));
        (X, Y, Width, Height) = (fields["x"], fields["y"], fields["width"], fields["height"]);
    }

    /// <summary>The whole image, title and legend included, as RGBA.</summary>
    public ImageResult Image { get; }

    public IReadOnlyDictionary<string, string> Text { get; }

    /// <summary>The picture's place in the image.</summary>
    public int X { get; }

    public int Y { get; }

    public int Width { get; }

    public int Height { get; }

    public static PngPicture Read(byte[] png) =>
        new(ImageResult.FromMemory(png, ColorComponents.RedGreenBlueAlpha), TextChunks(png));

    public static PngPicture Read(string path) => Read(File.ReadAllBytes(path));

    /// <summary>Encodes with VoxProf's encoder, then reads back independently.</summary>
    public static PngPicture Encode(Image<Rgba32> image)
    {
        using var ms = new MemoryStream();
        Png.Save(image, ms);
        return Read(ms.ToArray());
    }

    /// <summary>A pixel of the whole image.</summary>
    public Rgba32 At(int x, int y)
    {
        int i = (y * Image.Width + x) * 4;
        return new Rgba32(Image.Data[i], Image.Data[i + 1], Image.Data[i + 2], Image.Data[i + 3]);
    }

    /// <summary>A pixel of the picture, in the picture's own coordinates.</summary>
    public Rgba32 Pixel(int x, int y)
    {
        if ((uint)x >= (uint)Width || (uint)y >= (uint)Height)
            throw new ArgumentOutOfRangeException(nameof(x), $"({x}, {y}) is outside the {Width}x{Height} picture");
        return At(X + x, Y + y);
    }

    /// <summary>The picture alone as RGB, for tests that index pixels as (y * width + x) * 3.</summary>
    public ImageResult CropRgb()
    {
        var data = new byte[Width * Height * 3];
        for (int y = 0; y < Height; y++)
        {
            for (int x = 0; x < Width; x++)
            {
                Rgba32 c = Pixel(x, y);
                int i = (y * Width + x) * 3;
                (data[i], data[i + 1], data[i + 2]) = (c.R, c.G, c.B);
            }
        }
        return new ImageResult { Width = Width, Height = Height, SourceComp = ColorComponents.RedGreenBlue, Comp = ColorComponents.RedGreenBlue, Data = data };
    }

    private static Dictionary<string, string> TextChunks(byte[] png)
    {
        var text = new Dictionary<string, string>();
        for (int at = 8; at + 12 <= png.Length;)
        {
            int length = BinaryPrimitives.ReadInt32BigEndian(png.AsSpan(at));
            string type = Encoding.ASCII.GetString(png, at + 4, 4);
            if (type == "tEXt")
            {
                var data = png.AsSpan(at + 8, length);
                int nul = data.IndexOf((byte)0);
                text[Encoding.Latin1.GetString(data[..nul])] = Encoding.Latin1.GetString(data[(nul + 1)..]);
            }
            at += 12 + length;
        }
        return text;
    }
}
