using System.Buffers.Binary;
using System.Reflection;

namespace VoxProf.Reports.Html;

/// <summary>One image of a report directory, ready to inline: its data URI, its size, and where the picture lies in it.</summary>
/// <param name="Origin">The top-left corner of the traced picture inside the PNG (below the title band).</param>
public sealed record InlineImage(string File, string DataUri, int Width, int Height, (int X, int Y) Origin)
{
    /// <summary>The PNG <paramref name="file"/> in <paramref name="directory"/>, or null when it is missing or not a PNG.</summary>
    public static InlineImage? Load(string directory, string file)
    {
        string path = Path.Combine(directory, file);
        if (!System.IO.File.Exists(path))
            return null;
        byte[] bytes = System.IO.File.ReadAllBytes(path);
        // PNG (ISO/IEC 15948): an 8-byte signature, then the IHDR chunk whose data starts with width and height, big-endian.
        if (bytes.Length < 24 || !bytes.AsSpan(0, 8).SequenceEqual(PngSignature) || !bytes.AsSpan(12, 4).SequenceEqual("IHDR"u8))
            return null;
        int width = BinaryPrimitives.ReadInt32BigEndian(bytes.AsSpan(16, 4));
        int height = BinaryPrimitives.ReadInt32BigEndian(bytes.AsSpan(20, 4));
        return new InlineImage(file, "data:image/png;base64," + Convert.ToBase64String(bytes), width, height, PictureOrigin(bytes));
    }

    /// <summary>
    /// The picture's corner from the PNG's "Picture" text chunk ("x=0 y=52 width=1280 height=720", written by
    /// <see cref="Images.ImageLayout"/>), or (0, 0) for an image without one.
    /// </summary>
    public static (int X, int Y) PictureOrigin(ReadOnlySpan<byte> png)
    {
        // Chunks: length (4, big-endian), type (4), data, CRC (4). A tEXt chunk's data is keyword, NUL, Latin-1 text.
        int at = 8;
        while (at + 12 <= png.Length)
        {
            int length = BinaryPrimitives.ReadInt32BigEndian(png.Slice(at, 4));
            if (length < 0 || at + 12 + length > png.Length)
                break;
            ReadOnlySpan<byte> type = png.Slice(at + 4, 4), data = png.Slice(at + 8, length);
            if (type.SequenceEqual("IDAT"u8))
                break;
            int nul = data.IndexOf((byte)0);
            if (type.SequenceEqual("tEXt"u8) && nul > 0 && System.Text.Encoding.Latin1.GetString(data[..nul]) == Images.ImageLayout.PictureKeyword)
            {
                string text = System.Text.Encoding.Latin1.GetString(data[(nul + 1)..]);
                return (Field(text, "x"), Field(text, "y"));
            }
            at += 12 + length;
        }
        return (0, 0);
    }

    private static int Field(string text, string name)
    {
        foreach (string part in text.Split(' '))
        {
            if (part.StartsWith(name + "=", StringComparison.Ordinal) &&
                int.TryParse(part.AsSpan(name.Length + 1), System.Globalization.NumberStyles.None, System.Globalization.CultureInfo.InvariantCulture, out int v))
                return v;
        }
        return 0;
    }

    private static ReadOnlySpan<byte> PngSignature => [0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A];
}

/// <summary>
/// The frame every VoxProf page shares: one file that loads nothing. The Content-Security-Policy forbids every
/// fetch (images may only be data: URIs; style and script only inline), so a stray reference cannot reach the
/// network even by mistake.
/// </summary>
public static class HtmlPage
{
    public const string ContentSecurityPolicy = "default-src 'none'; img-src data:; style-src 'unsafe-inline'; script-src 'unsafe-inline'";

    public static string Css { get; } = Asset("report.css");

    public static string Script { get; } = Asset("report.js");

    public static void Begin(TextWriter w, string title, string brand, string heading, string subtitle)
    {
        w.Write("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n");
        w.Write("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n");
        w.Write($"<meta http-equiv=\"Content-Security-Policy\" content=\"{ContentSecurityPolicy}\">\n");
        w.Write($"<meta name=\"generator\" content=\"VoxProf\">\n<title>{HtmlText.Encode(title)}</title>\n");
        w.Write("<style>\n");
        w.Write(Css);
        w.Write("</style>\n</head>\n<body>\n<header class=\"top\">\n");
        w.Write($"<p class=\"brand\">{HtmlText.Encode(brand)}</p>\n<h1>{HtmlText.Encode(heading)}</h1>\n");
        w.Write($"<p class=\"sub\">{HtmlText.Encode(subtitle)}</p>\n</header>\n<main>\n");
    }

    /// <summary>Closes main, writes the footer and the page script; <paramref name="beforeScript"/> adds data blocks.</summary>
    public static void End(TextWriter w, string footer, Action<TextWriter>? beforeScript = null)
    {
        w.Write($"</main>\n<footer>{HtmlText.Encode(footer)}</footer>\n");
        beforeScript?.Invoke(w);
        w.Write("<script>\n");
        w.Write(Script);
        w.Write("</script>\n</body>\n</html>\n");
    }

    /// <summary>A row of radio buttons named <paramref name="name"/>, the first (or <paramref name="selected"/>) checked.</summary>
    public static void Switch(TextWriter w, string name, string legend, IEnumerable<(string Value, string Label)> options, string? selected = null)
    {
        w.Write($"<fieldset class=\"switch\" data-switch=\"{HtmlText.Encode(name)}\"><legend>{HtmlText.Encode(legend)}</legend>");
        bool first = true;
        foreach (var (value, label) in options)
        {
            bool check = selected is null ? first : value == selected;
            w.Write($"<label><input type=\"radio\" name=\"{HtmlText.Encode(name)}\" value=\"{HtmlText.Encode(value)}\"{(check ? " checked" : "")}>" +
                $"<span>{HtmlText.Encode(label)}</span></label>");
            first = false;
        }
        w.Write("</fieldset>\n");
    }

    /// <summary>A header cell that sorts its table when clicked.</summary>
    public static string SortHeader(string label, string? title = null, bool text = false) =>
        $"<th{(text ? " class=\"text\"" : "")}{(title is null ? "" : $" title=\"{HtmlText.Encode(title)}\"")}><button type=\"button\">{HtmlText.Encode(label)}</button></th>";

    /// <summary>A figure cell: <paramref name="display"/> shown, <paramref name="value"/> sorted by (null sorts last).</summary>
    public static string NumberCell(string display, double? value, string? cls = null) =>
        $"<td{(cls is null ? "" : $" class=\"{cls}\"")} data-v=\"{(value is { } v && double.IsFinite(v) ? v.ToString("R", System.Globalization.CultureInfo.InvariantCulture) : "")}\">{display}</td>";

    /// <summary>An image in a viewer, shown when the switches select its attributes (data-strategy, data-map).</summary>
    public static void ViewerImage(TextWriter w, InlineImage image, IReadOnlyDictionary<string, string> attributes, string caption, string alt)
    {
        var origin = image.Origin;
        w.Write("<img");
        foreach (var (key, value) in attributes)
            w.Write($" data-{key}=\"{HtmlText.Encode(value)}\"");
        w.Write($" data-x0=\"{origin.X}\" data-y0=\"{origin.Y}\" data-caption=\"{HtmlText.Encode(caption)}\"");
        string aspect = (image.Width / (double)Math.Max(1, image.Height)).ToString("0.####", System.Globalization.CultureInfo.InvariantCulture);
        w.Write($" width=\"{image.Width}\" height=\"{image.Height}\" style=\"--aspect: {aspect}; --w: {image.Width}\" alt=\"{HtmlText.Encode(alt)}\" hidden src=\"");
        w.Write(image.DataUri);
        w.Write("\">\n");
    }

    private static string Asset(string name)
    {
        using Stream stream = Assembly.GetExecutingAssembly().GetManifestResourceStream("VoxProf.Html." + name)
            ?? throw new InvalidOperationException($"embedded page asset {name} is missing from the build");
        using var reader = new StreamReader(stream);
        return reader.ReadToEnd();
    }
}
