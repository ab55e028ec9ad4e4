using SixLabors.ImageSharp;
using SixLabors.ImageSharp.Advanced;
using SixLabors.ImageSharp.PixelFormats;

namespace VoxProf.Reports.Images;

/// <summary>
/// Where the parts of every VoxProf image go: a title band across the top, the picture (left-aligned, at its own
/// size) and a legend band under it. The image is at least <see cref="MinWidth"/> wide so that a tiny trace still
/// gets a readable title and legend.
/// </summary>
public readonly record struct ImageLayout(int Width, int FontScale, int TitleHeight, int DataWidth, int DataHeight, int LegendHeight)
{
    public const int MinWidth = 240;

    /// <summary>Width at which the font grows past twice its size.</summary>
    public const int WidthPerFontStep = 640;

    public static readonly Rgba32 Background = new(24, 24, 28, 255);

    public int DataTop => TitleHeight;

    public int LegendTop => TitleHeight + DataHeight;

    public int Height => LegendTop + LegendHeight;

    /// <summary>PNG text keyword that says where the picture lies, for tools that read the pixels back.</summary>
    public const string PictureKeyword = "Picture";

    /// <summary>"x=0 y=52 width=1280 height=720": the picture's place in the image.</summary>
    public string PictureText => FormattableString.Invariant($"x=0 y={DataTop} width={DataWidth} height={DataHeight}");

    public static int WidthFor(int dataWidth) => Math.Max(dataWidth, MinWidth);

    /// <summary>
    /// The font is drawn at twice its size, so that an image shown at half size (a typical inline size in a code
    /// review) still has every font pixel; wider images, which are shrunk further, get a larger one.
    /// </summary>
    public static int FontScaleFor(int width) => Math.Max(2, width / WidthPerFontStep);

    /// <summary>
    /// A new image for a picture of <paramref name="dataWidth"/> × <paramref name="dataHeight"/> pixels, filled with
    /// the background, its title band drawn, and room for a legend band of <paramref name="legendHeight"/>(width,
    /// font scale) rows.
    /// </summary>
    public static (Image<Rgba32> Image, ImageLayout Layout) Create(int dataWidth, int dataHeight, ImageTitle title, Func<int, int, int> legendHeight)
    {
        int width = WidthFor(dataWidth);
        int scale = FontScaleFor(width);
        IReadOnlyList<TitleLine> lines = TitleBand.Wrap(title, width, scale);
        var layout = new ImageLayout(width, scale, TitleBand.Height(lines.Count, scale), dataWidth, dataHeight, legendHeight(width, scale));
        var image = new Image<Rgba32>(layout.Width, layout.Height, Background);
        TitleBand.Draw(image, lines, scale);
        Png.AddText(image, PictureKeyword, layout.PictureText);
        return (image, layout);
    }

    /// <summary>Row <paramref name="y"/> of the picture area, <see cref="DataWidth"/> pixels long, to write directly.</summary>
    public Span<Rgba32> DataRow(Image<Rgba32> image, int y) =>
        image.DangerousGetPixelRowMemory(DataTop + y).Span[..DataWidth];
}
