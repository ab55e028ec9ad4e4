using System.Globalization;
using System.Text;

namespace VoxProf.Core.Scenes.Import;

/// <summary>
/// The header of an NRRD file (the format of the Teem toolkit: a magic line <c>NRRD000N</c>, then <c>field: value</c>
/// lines, <c>#</c> comments and <c>key:=value</c> pairs, ended by a blank line, the data following at once). VoxProf
/// reads three-dimensional volumes of <c>uchar</c>, <c>ushort</c> or <c>float</c> samples, <c>raw</c> or <c>gzip</c>
/// encoded, with the data in the same file; fields that only describe the space (spacings, directions, kinds, labels,
/// units) are read past.
/// </summary>
internal sealed class NrrdHeader
{
    private static readonly string[] Unsupported = ["data file", "datafile", "line skip", "lineskip", "byte skip", "byteskip"];

    public VoxelType Type { get; private set; }
    public int[] Sizes { get; private set; } = [];
    public bool BigEndian { get; private set; }
    public bool Gzip { get; private set; }

    /// <summary>Bytes from the start of the file to the first data byte.</summary>
    public long Length { get; private set; }

    public static NrrdHeader Read(TextLines lines)
    {
        string file = lines.File;
        if (!lines.Next(out ReadOnlySpan<byte> magic) || !magic.StartsWith("NRRD000"u8) || magic.Length != 8)
            throw lines.Error($"expected the magic line \"NRRD0001\" to \"NRRD0005\", found {Words.Show(magic)}");
        var fields = new Dictionary<string, (string Value, long Line)>(StringComparer.Ordinal);
        while (true)
        {
            if (!lines.Next(out ReadOnlySpan<byte> line))
                throw new SceneFormatException(file, FilePlace.Line(lines.LineNumber + 1), "file ends in the header; expected a blank line and then the data");
            if (line.IsEmpty)
                break;
            if (line[0] == '#')
                continue;
            string text = Encoding.ASCII.GetString(line);
            int kv = text.IndexOf(":=", StringComparison.Ordinal);
            int colon = text.IndexOf(": ", StringComparison.Ordinal);
            if (kv >= 0 && (colon < 0 || kv < colon))
                continue;
            if (colon <= 0)
                throw lines.Error($"expected \"field: value\", \"key:=value\" or a # comment, found {Words.Show(line)}");
            string field = text[..colon].Trim().ToLowerInvariant();
            if (Unsupported.Contains(field))
                throw lines.Error($"field \"{field}\" is not supported; expected the data in the same file, right after the header");
            if (!fields.TryAdd(field, (text[(colon + 2)..].Trim(), lines.LineNumber)))
                throw lines.Error($"field \"{field}\" given twice; expected it once");
        }

        var header = new NrrdHeader { Length = lines.Consumed };
        (string value, long at) = Field(fields, "dimension", file);
        if (value != "3")
            throw Error(file, at, $"dimension {value}; expected 3");
        (value, at) = Field(fields, "type", file);
        header.Type = value.ToLowerInvariant() switch
        {
            "uchar" or "unsigned char" or "uint8" or "uint8_t" => VoxelType.U8,
            "ushort" or "unsigned short" or "unsigned short int" or "uint16" or "uint16_t" => VoxelType.U16,
            "float" => VoxelType.F32,
            _ => throw Error(file, at, $"type \"{value}\"; expected uchar, ushort or float (8-bit, 16-bit unsigned or 32-bit float samples)"),
        };
        (value, at) = Field(fields, "sizes", file);
        string[] parts = value.Split(' ', StringSplitOptions.RemoveEmptyEntries);
        header.Sizes = new int[3];
        for (int a = 0; a < 3; a++)
        {
            if (parts.Length != 3 || !int.TryParse(parts[a], NumberStyles.None, CultureInfo.InvariantCulture, out header.Sizes[a])
                || header.Sizes[a] < 1 || header.Sizes[a] > Scene.MaxExtent)
                throw Error(file, at, $"sizes \"{value}\"; expected three integers from 1 to {Scene.MaxExtent.ToString(CultureInfo.InvariantCulture)}");
        }
        (value, at) = Field(fields, "encoding", file);
        header.Gzip = value.ToLowerInvariant() switch
        {
            "raw" => false,
            "gzip" or "gz" => true,
            _ => throw Error(file, at, $"encoding \"{value}\"; expected raw or gzip"),
        };
        if (fields.TryGetValue("endian", out var endian))
        {
            header.BigEndian = endian.Value.ToLowerInvariant() switch
            {
                "little" => false,
                "big" => true,
                _ => throw Error(file, endian.Line, $"endian \"{endian.Value}\"; expected little or big"),
            };
        }
        else if (header.Type != VoxelType.U8)
        {
            throw new SceneFormatException(file, "header", "no endian field; expected \"endian: little\" or \"endian: big\" for samples wider than a byte");
        }
        return header;
    }

    private static (string Value, long Line) Field(Dictionary<string, (string Value, long Line)> fields, string name, string file) =>
        fields.TryGetValue(name, out var f) ? f : throw new SceneFormatException(file, "header", $"no \"{name}\" field; expected one");

    private static SceneFormatException Error(string file, long line, string problem) => new(file, FilePlace.Line(line), problem);
}
