using System.Buffers.Binary;
using System.Globalization;

namespace VoxProf.Core.Scenes.Import;

/// <summary>
/// PLY, ASCII or binary (little or big endian): the <c>vertex</c> element's <c>x</c>, <c>y</c>, <c>z</c> properties and
/// the <c>face</c> element's <c>vertex_indices</c> (or <c>vertex_index</c>) list, polygons split into triangle fans.
/// Other properties and elements are read past. The vertex element must come before the face element.
/// </summary>
internal static class PlyReader
{
    public static TriangleMesh Read(Stream stream, long length, string file)
    {
        var lines = new TextLines(stream, file);
        PlyHeader header = PlyHeader.Read(lines);
        var (vertex, face) = Check(header, lines);

        if (header.Binary)
        {
            // A short file is refused before any data is read: every record has a least size.
            long least = header.Length + header.Elements.Sum(e => e.Count * PlyHeader.MinRecordBytes(e));
            if (length < least)
            {
                throw new SceneFormatException(file, FilePlace.Offset(length), string.Create(CultureInfo.InvariantCulture,
                    $"file ends after {length} bytes; expected at least {least} for the element counts in the header"));
            }
        }

        var builder = new MeshBuilder(file);
        var ids = new int[vertex.Count];
        var source = header.Binary
            ? new Source(file, new BinaryCursor(new PrefixedStream(lines.Leftover, stream), file, header.Length), header.BigEndian)
            : new Source(file, lines);
        foreach (PlyElement element in header.Elements)
        {
            for (long r = 0; r < element.Count; r++)
            {
                source.BeginRecord(element);
                if (element == vertex)
                    ids[r] = ReadVertex(source, element, builder);
                else if (element == face)
                    ReadFace(source, element, builder, ids, r);
                else
                    source.SkipRecord(element);
                source.EndRecord(element);
            }
        }
        return builder.Build();
    }

    private static (PlyElement Vertex, PlyElement Face) Check(PlyHeader header, TextLines lines)
    {
        string file = lines.File;
        PlyElement? vertex = header.Elements.FirstOrDefault(e => e.Name == "vertex");
        PlyElement? face = header.Elements.FirstOrDefault(e => e.Name == "face");
        if (vertex is null || face is null)
            throw new SceneFormatException(file, "header", "expected a \"vertex\" element and a \"face\" element");
        string where = FilePlace.Line(vertex.Line);
        foreach (string axis in (string[])["x", "y", "z"])
        {
            if (!vertex.Properties.Any(p => p.Name == axis && !p.IsList))
                throw new SceneFormatException(file, where, $"vertex element has no scalar property \"{axis}\"; expected x, y and z");
        }
        if (header.Elements.IndexOf(face) < header.Elements.IndexOf(vertex))
            throw new SceneFormatException(file, FilePlace.Line(face.Line), "face element before the vertex element; expected vertices first");
        if (!face.Properties.Any(p => p.IsList && p.Name is "vertex_indices" or "vertex_index"))
            throw new SceneFormatException(file, FilePlace.Line(face.Line), "face element has no list property \"vertex_indices\" (or \"vertex_index\")");
        if (vertex.Count > TriangleMesh.MaxVertices)
        {
            throw new SceneFormatException(file, where, string.Create(CultureInfo.InvariantCulture,
                $"{vertex.Count} vertices; expected at most {TriangleMesh.MaxVertices}"));
        }
        if (face.Count > TriangleMesh.MaxTriangles)
        {
            throw new SceneFormatException(file, FilePlace.Line(face.Line), string.Create(CultureInfo.InvariantCulture,
                $"{face.Count} faces; expected at most {TriangleMesh.MaxTriangles}"));
        }
        return (vertex, face);
    }

    private static int ReadVertex(Source source, PlyElement element, MeshBuilder builder)
    {
        string where = source.Where;
        double x = 0, y = 0, z = 0;
        foreach (PlyProperty p in element.Properties)
        {
            if (p.IsList)
            {
                source.SkipList(p);
                continue;
            }
            double v = source.Scalar(p.Type, $"vertex property {p.Name}");
            if (p.Name == "x")
                x = v;
            else if (p.Name == "y")
                y = v;
            else if (p.Name == "z")
                z = v;
        }
        return builder.AddVertex((float)x, (float)y, (float)z, where);
    }

    private static void ReadFace(Source source, PlyElement element, MeshBuilder builder, int[] ids, long record)
    {
        string where = source.Where;
        Span<int> corners = stackalloc int[PlyHeader.MaxCorners];
        int n = 0;
        foreach (PlyProperty p in element.Properties)
        {
            if (!p.IsList || p.Name is not ("vertex_indices" or "vertex_index") || n > 0)
            {
                if (p.IsList)
                    source.SkipList(p);
                else
                    source.Scalar(p.Type, $"face property {p.Name}");
                continue;
            }
            long count = (long)source.Scalar(p.CountType, "a face's corner count");
            if (count < 3 || count > PlyHeader.MaxCorners)
            {
                throw new SceneFormatException(source.File, where, string.Create(CultureInfo.InvariantCulture,
                    $"face {record} has {count} corners; expected 3 to {PlyHeader.MaxCorners}"));
            }
            for (int k = 0; k < count; k++)
            {
                double index = source.Scalar(p.Type, "a face's vertex index");
                if (index < 0 || index >= ids.Length || index != Math.Floor(index))
                {
                    throw new SceneFormatException(source.File, where, string.Create(CultureInfo.InvariantCulture,
                        $"face {record} vertex index {index} is out of range; expected 0 to {ids.Length - 1}"));
                }
                corners[k] = ids[(long)index];
            }
            n = (int)count;
        }
        builder.AddPolygon(corners[..n], where);
    }

    /// <summary>Values of the data section, from text lines (one record a line) or from binary records.</summary>
    private sealed class Source
    {
        private readonly TextLines? _lines;
        private readonly BinaryCursor? _cursor;
        private readonly bool _bigEndian;
        private string[] _words = [];
        private int _next;

        public Source(string file, TextLines lines)
        {
            File = file;
            _lines = lines;
        }

        public Source(string file, BinaryCursor cursor, bool bigEndian)
        {
            File = file;
            _cursor = cursor;
            _bigEndian = bigEndian;
        }

        public string File { get; }

        public string Where => _cursor?.Where ?? _lines!.Where;

        public void BeginRecord(PlyElement element)
        {
            if (_lines is null)
                return;
            ReadOnlySpan<byte> line;
            do
            {
                if (!_lines.Next(out line))
                {
                    throw new SceneFormatException(_lines.File, FilePlace.Line(_lines.LineNumber + 1),
                        $"file ends; expected a line holding a \"{element.Name}\" record");
                }
            }
            while (line.Trim(" \t"u8).IsEmpty);
            _words = System.Text.Encoding.ASCII.GetString(line).Split([' ', '\t'], StringSplitOptions.RemoveEmptyEntries);
            _next = 0;
        }

        public void EndRecord(PlyElement element)
        {
            if (_lines is not null && _next < _words.Length)
                throw _lines.Error($"{_words.Length - _next} values left over; expected one \"{element.Name}\" record a line");
        }

        public double Scalar(PlyType type, string what)
        {
            if (_cursor is not null)
            {
                ReadOnlySpan<byte> b = _cursor.Take(PlyHeader.Size(type), what);
                return type switch
                {
                    PlyType.Int8 => (sbyte)b[0],
                    PlyType.UInt8 => b[0],
                    PlyType.Int16 => _bigEndian ? BinaryPrimitives.ReadInt16BigEndian(b) : BinaryPrimitives.ReadInt16LittleEndian(b),
                    PlyType.UInt16 => _bigEndian ? BinaryPrimitives.ReadUInt16BigEndian(b) : BinaryPrimitives.ReadUInt16LittleEndian(b),
                    PlyType.Int32 => _bigEndian ? BinaryPrimitives.ReadInt32BigEndian(b) : BinaryPrimitives.ReadInt32LittleEndian(b),
                    PlyType.UInt32 => _bigEndian ? BinaryPrimitives.ReadUInt32BigEndian(b) : BinaryPrimitives.ReadUInt32LittleEndian(b),
                    PlyType.Float32 => _cursor.Float(b, _bigEndian),
                    _ => _bigEndian ? BinaryPrimitives.ReadDoubleBigEndian(b) : BinaryPrimitives.ReadDoubleLittleEndian(b),
                };
            }
            if (_next >= _words.Length)
                throw _lines!.Error($"line ends; expected {what}");
            string word = _words[_next++];
            bool integer = type is not (PlyType.Float32 or PlyType.Float64);
            if (!double.TryParse(word, integer ? NumberStyles.AllowLeadingSign : NumberStyles.Float, CultureInfo.InvariantCulture, out double v))
                throw _lines!.Error($"expected {what} ({(integer ? "an integer" : "a number")}), found \"{word}\"");
            return v;
        }

        public void SkipList(PlyProperty p)
        {
            long count = (long)Scalar(p.CountType, $"the count of list {p.Name}");
            if (count < 0 || count > PlyHeader.MaxCorners)
            {
                throw new SceneFormatException(File, Where, string.Create(CultureInfo.InvariantCulture,
                    $"list {p.Name} holds {count} items; expected 0 to {PlyHeader.MaxCorners}"));
            }
            for (long k = 0; k < count; k++)
                Scalar(p.Type, $"an item of list {p.Name}");
        }

        public void SkipRecord(PlyElement element)
        {
            foreach (PlyProperty p in element.Properties)
            {
                if (p.IsList)
                    SkipList(p);
                else
                    Scalar(p.Type, $"{element.Name} property {p.Name}");
            }
        }
    }
}
