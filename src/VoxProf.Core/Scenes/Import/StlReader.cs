using System.Buffers.Binary;
using System.Globalization;

namespace VoxProf.Core.Scenes.Import;

/// <summary>
/// STL, binary or ASCII. Binary: an 80-byte header, a little-endian uint32 triangle count, then per triangle a
/// 50-byte record (normal, three vertices as little-endian float32 x, y, z, a uint16 attribute). The stored normals
/// are ignored; the winding order gives the orientation. A file is binary when its length is exactly
/// 84 + 50 × count; otherwise it is ASCII if it starts with "solid", else a binary file of the wrong length.
/// </summary>
internal static class StlReader
{
    public const int HeaderBytes = 80;
    public const int RecordBytes = 50;

    public static TriangleMesh Read(Stream stream, long length, string file)
    {
        byte[] head = new byte[Math.Min(length, HeaderBytes + 4)];
        stream.ReadExactly(head);
        bool solid = new Words(head).Next(out ReadOnlySpan<byte> first) && Words.Is(first, "solid");
        if (length < HeaderBytes + 4)
        {
            if (solid)
                return ReadAscii(stream, head, file);
            throw new SceneFormatException(file, FilePlace.Offset(length), string.Create(CultureInfo.InvariantCulture,
                $"file ends after {length} bytes; expected an 80-byte header and a 4-byte triangle count"));
        }
        uint count = BinaryPrimitives.ReadUInt32LittleEndian(head.AsSpan(HeaderBytes));
        long expected = HeaderBytes + 4 + (long)RecordBytes * count;
        if (expected == length)
        {
            if (count > TriangleMesh.MaxTriangles)
            {
                throw new SceneFormatException(file, FilePlace.Offset(HeaderBytes), string.Create(CultureInfo.InvariantCulture,
                    $"triangle count {count}; expected at most {TriangleMesh.MaxTriangles}"));
            }
            return ReadBinary(stream, (int)count, file);
        }
        if (solid)
            return ReadAscii(stream, head, file);
        long firstShort = HeaderBytes + 4 + RecordBytes * Math.Min(count, (length - HeaderBytes - 4) / RecordBytes);
        throw new SceneFormatException(file, FilePlace.Offset(Math.Min(firstShort, length)), string.Create(CultureInfo.InvariantCulture,
            $"file holds {length} bytes; expected 84 + 50 × {count} = {expected} for the {count} triangles counted at byte offset 80 (a binary STL; an ASCII one starts with \"solid\")"));
    }

    private static TriangleMesh ReadBinary(Stream stream, int count, string file)
    {
        var builder = new MeshBuilder(file, count);
        var cursor = new BinaryCursor(stream, file, HeaderBytes + 4);
        Span<int> corner = stackalloc int[3];
        for (int t = 0; t < count; t++)
        {
            long record = cursor.Offset;
            ReadOnlySpan<byte> r = cursor.Take(RecordBytes, "a 50-byte triangle record");
            for (int k = 0; k < 3; k++)
            {
                ReadOnlySpan<byte> v = r.Slice(12 + 12 * k, 12);
                corner[k] = builder.AddVertex(BinaryPrimitives.ReadSingleLittleEndian(v),
                    BinaryPrimitives.ReadSingleLittleEndian(v[4..]), BinaryPrimitives.ReadSingleLittleEndian(v[8..]),
                    FilePlace.Offset(record + 12 + 12 * k));
            }
            builder.AddTriangle(corner[0], corner[1], corner[2], FilePlace.Offset(record));
        }
        return builder.Build();
    }

    // solid NAME / facet normal nx ny nz / outer loop / vertex x y z (three times) / endloop / endfacet / endsolid NAME
    private static TriangleMesh ReadAscii(Stream stream, byte[] head, string file)
    {
        var builder = new MeshBuilder(file);
        var lines = new TextLines(new PrefixedStream(head, stream), file);
        Span<int> corner = stackalloc int[3];
        int state = 0; // 0 outside a solid, 1 in a solid, 2 after facet, 3 in a loop, 4 after endloop
        int vertices = 0;
        bool any = false;
        while (lines.Next(out ReadOnlySpan<byte> line))
        {
            var words = new Words(line);
            if (!words.Next(out ReadOnlySpan<byte> key))
                continue;
            any = true;
            switch (state)
            {
                case 0 when Words.Is(key, "solid"):
                    state = 1;
                    break;
                case 1 when Words.Is(key, "facet"):
                    state = 2;
                    break;
                case 1 when Words.Is(key, "endsolid"):
                    state = 0;
                    break;
                case 2 when Words.Is(key, "outer") && words.Next(out ReadOnlySpan<byte> loop) && Words.Is(loop, "loop"):
                    state = 3;
                    vertices = 0;
                    break;
                case 3 when Words.Is(key, "vertex") && vertices < 3:
                    corner[vertices++] = ReadVertex(ref words, lines, builder);
                    break;
                case 3 when Words.Is(key, "endloop") && vertices == 3:
                    builder.AddTriangle(corner[0], corner[1], corner[2], lines.Where);
                    state = 4;
                    break;
                case 4 when Words.Is(key, "endfacet"):
                    state = 1;
                    break;
                default:
                    throw lines.Error($"expected {Expected(state, vertices)}, found {Words.Show(line.Trim((byte)' '))}");
            }
        }
        if (!any)
            throw lines.Error("empty file; expected an ASCII STL starting with \"solid\"");
        if (state != 0)
            throw new SceneFormatException(file, FilePlace.Line(lines.LineNumber + 1), $"file ends; expected {Expected(state, vertices)}");
        return builder.Build();
    }

    private static int ReadVertex(ref Words words, TextLines lines, MeshBuilder builder)
    {
        Span<float> v = stackalloc float[3];
        for (int k = 0; k < 3; k++)
        {
            if (!words.Next(out ReadOnlySpan<byte> w) || !Words.TryFloat(w, out v[k]))
                throw lines.Error($"expected \"vertex x y z\" with three numbers, found {Words.Show(w)}");
        }
        if (!words.Rest.IsEmpty)
            throw lines.Error($"expected \"vertex x y z\" with three numbers, found more: {Words.Show(words.Rest)}");
        return builder.AddVertex(v[0], v[1], v[2], lines.Where);
    }

    private static string Expected(int state, int vertices) => state switch
    {
        0 => "\"solid NAME\"",
        1 => "\"facet normal nx ny nz\" or \"endsolid\"",
        2 => "\"outer loop\"",
        3 when vertices < 3 => "\"vertex x y z\" (three per facet)",
        3 => "\"endloop\" after three vertices",
        _ => "\"endfacet\"",
    };
}
