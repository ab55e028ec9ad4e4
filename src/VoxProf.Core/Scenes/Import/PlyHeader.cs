using System.Text;

namespace VoxProf.Core.Scenes.Import;

/// <summary>A PLY scalar type, by the names of the format description (both the old and the sized spellings).</summary>
internal enum PlyType : byte
{
    None,
    Int8,
    UInt8,
    Int16,
    UInt16,
    Int32,
    UInt32,
    Float32,
    Float64,
}

/// <summary>One property line: a scalar, or a list with a count type and an item type.</summary>
internal sealed record PlyProperty(string Name, PlyType Type, PlyType CountType)
{
    public bool IsList => CountType != PlyType.None;
}

/// <summary>One element line and the properties that follow it.</summary>
internal sealed record PlyElement(string Name, long Count, List<PlyProperty> Properties, long Line);

/// <summary>
/// The PLY header as the format description defines it (Turk, "The PLY Polygon File Format", 1994): the magic line
/// <c>ply</c>, one <c>format ascii|binary_little_endian|binary_big_endian 1.0</c> line, <c>comment</c> and
/// <c>obj_info</c> lines, <c>element NAME COUNT</c> lines each followed by its <c>property TYPE NAME</c> or
/// <c>property list COUNTTYPE ITEMTYPE NAME</c> lines, and <c>end_header</c>.
/// </summary>
internal sealed class PlyHeader
{
    public const int MaxCorners = 4096;

    public string Format { get; private set; } = "";
    public List<PlyElement> Elements { get; } = [];

    /// <summary>Bytes from the start of the file to the first data byte.</summary>
    public long Length { get; private set; }

    public bool Binary => Format != "ascii";
    public bool BigEndian => Format == "binary_big_endian";

    public static PlyHeader Read(TextLines lines)
    {
        var header = new PlyHeader();
        if (!lines.Next(out ReadOnlySpan<byte> magic) || !magic.SequenceEqual("ply"u8))
            throw lines.Error($"expected the magic line \"ply\", found {Words.Show(magic)}");
        while (true)
        {
            if (!lines.Next(out ReadOnlySpan<byte> line))
                throw new SceneFormatException(lines.File, FilePlace.Line(lines.LineNumber + 1), "file ends in the header; expected \"end_header\"");
            var words = new Words(line);
            if (!words.Next(out ReadOnlySpan<byte> key))
                continue;
            if (key.SequenceEqual("end_header"u8))
                break;
            if (key.SequenceEqual("comment"u8) || key.SequenceEqual("obj_info"u8))
                continue;
            if (key.SequenceEqual("format"u8))
                header.ReadFormat(ref words, lines, line);
            else if (key.SequenceEqual("element"u8))
                header.ReadElement(ref words, lines, line);
            else if (key.SequenceEqual("property"u8))
                header.ReadProperty(ref words, lines, line);
            else
                throw lines.Error($"expected format, element, property, comment, obj_info or end_header, found {Words.Show(line)}");
        }
        if (header.Format.Length == 0)
            throw lines.Error("header has no format line; expected \"format ascii 1.0\" (or binary_little_endian, binary_big_endian) after \"ply\"");
        header.Length = lines.Consumed;
        return header;
    }

    public static int Size(PlyType t) => t switch
    {
        PlyType.Int8 or PlyType.UInt8 => 1,
        PlyType.Int16 or PlyType.UInt16 => 2,
        PlyType.Int32 or PlyType.UInt32 or PlyType.Float32 => 4,
        _ => 8,
    };

    private void ReadFormat(ref Words words, TextLines lines, ReadOnlySpan<byte> line)
    {
        if (Format.Length > 0)
            throw lines.Error("second format line; expected one");
        if (!words.Next(out ReadOnlySpan<byte> f) || !words.Next(out ReadOnlySpan<byte> version) || !version.SequenceEqual("1.0"u8)
            || !words.Rest.IsEmpty || !(f.SequenceEqual("ascii"u8) || f.SequenceEqual("binary_little_endian"u8) || f.SequenceEqual("binary_big_endian"u8)))
            throw lines.Error($"expected \"format ascii 1.0\", \"format binary_little_endian 1.0\" or \"format binary_big_endian 1.0\", found {Words.Show(line)}");
        Format = Encoding.ASCII.GetString(f);
    }

    private void ReadElement(ref Words words, TextLines lines, ReadOnlySpan<byte> line)
    {
        if (!words.Next(out ReadOnlySpan<byte> name) || !words.Next(out ReadOnlySpan<byte> count) || !words.Rest.IsEmpty
            || !Words.TryLong(count, out long n) || n < 0)
            throw lines.Error($"expected \"element NAME COUNT\" with a count of 0 or more, found {Words.Show(line)}");
        string elementName = Encoding.ASCII.GetString(name);
        if (Elements.Any(e => e.Name == elementName))
            throw lines.Error($"second element \"{elementName}\"; expected each element once");
        Elements.Add(new PlyElement(elementName, n, [], lines.LineNumber));
    }

    private void ReadProperty(ref Words words, TextLines lines, ReadOnlySpan<byte> line)
    {
        if (Elements.Count == 0)
            throw lines.Error("property before any element; expected \"element NAME COUNT\" first");
        const string Expected = "\"property TYPE NAME\" or \"property list COUNTTYPE ITEMTYPE NAME\"";
        if (!words.Next(out ReadOnlySpan<byte> type))
            throw lines.Error($"expected {Expected}, found {Words.Show(line)}");
        PlyType countType = PlyType.None;
        if (type.SequenceEqual("list"u8))
        {
            if (!words.Next(out ReadOnlySpan<byte> ct) || (countType = TypeOf(ct)) is PlyType.None or PlyType.Float32 or PlyType.Float64
                || !words.Next(out type))
                throw lines.Error($"expected {Expected} with an integer count type, found {Words.Show(line)}");
        }
        PlyType itemType = TypeOf(type);
        if (itemType == PlyType.None)
        {
            throw lines.Error($"unknown type {Words.Show(type)}; expected char, uchar, short, ushort, int, uint, float, double "
                + "(or int8, uint8, int16, uint16, int32, uint32, float32, float64)");
        }
        if (!words.Next(out ReadOnlySpan<byte> name) || !words.Rest.IsEmpty)
            throw lines.Error($"expected {Expected}, found {Words.Show(line)}");
        Elements[^1].Properties.Add(new PlyProperty(Encoding.ASCII.GetString(name), itemType, countType));
    }

    private static PlyType TypeOf(ReadOnlySpan<byte> word) => Encoding.ASCII.GetString(word) switch
    {
        "char" or "int8" => PlyType.Int8,
        "uchar" or "uint8" => PlyType.UInt8,
        "short" or "int16" => PlyType.Int16,
        "ushort" or "uint16" => PlyType.UInt16,
        "int" or "int32" => PlyType.Int32,
        "uint" or "uint32" => PlyType.UInt32,
        "float" or "float32" => PlyType.Float32,
        "double" or "float64" => PlyType.Float64,
        _ => PlyType.None,
    };

    /// <summary>Fewest bytes one record of the element can take in a binary file (lists counted as empty).</summary>
    public static long MinRecordBytes(PlyElement e) => e.Properties.Sum(p => (long)Size(p.IsList ? p.CountType : p.Type));
}
