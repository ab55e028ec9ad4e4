using System.Buffers.Binary;
using System.IO.Compression;
using System.Runtime.InteropServices;
using System.Text;
using VoxProf.Core;
using VoxProf.Core.Traversal;

namespace VoxProf.Reports.Pixels;

/// <summary>
/// pixels-STRATEGY.bin.gz: a gzip stream of little-endian binary (layout in docs/reports.md): magic "VXPX", version,
/// counter count, width, height, strategy name, counter names, one uint32 array per counter, then the hit arrays
/// (flags, face, material as bytes; x, y, z as int32; t as float64), each array whole so it compresses well.
/// </summary>
public static class PixelDataFile
{
    /// <summary>Format version; 2 stores t as float64 (version 1 stored float32 and is no longer read).</summary>
    public const ushort Version = 2;
    public const int MaxSide = 16384;
    private static ReadOnlySpan<byte> Magic => "VXPX"u8;

    public static void Write(PixelData data, Stream stream)
    {
        using var gzip = new GZipStream(stream, CompressionLevel.Fastest, leaveOpen: true);
        using var w = new BinaryWriter(gzip, Encoding.UTF8, leaveOpen: true);
        w.Write(Magic);
        w.Write(Version);
        w.Write((ushort)data.CounterNames.Count);
        w.Write(data.Width);
        w.Write(data.Height);
        WriteName(w, data.Strategy);
        foreach (string name in data.CounterNames)
            WriteName(w, name);
        foreach (uint[] counter in data.Counters)
            WriteArray<uint>(w, counter);

        WriteHits(w, data.Hits);
    }

    /// <summary>Elements converted at a time: the hit arrays go out through small buffers, not full-size copies.</summary>
    private const int ChunkLength = 1 << 16;

    /// <summary>
    /// The hit arrays (flags, face, material, x, y, z, t), each whole in the file, converted a chunk at a time: at
    /// 2560×1440 full-size copies were 48 MB of fresh memory per strategy, each page faulted in once for one pass.
    /// </summary>
    private static void WriteHits(BinaryWriter w, PixelHit[] hits)
    {
        int n = hits.Length;
        var bytes = new byte[Math.Min(n, ChunkLength)];
        var ints = new int[bytes.Length];
        var doubles = new double[bytes.Length];
        for (int plane = 0; plane < 7; plane++)
        {
            for (int start = 0; start < n; start += ChunkLength)
            {
                ReadOnlySpan<PixelHit> h = hits.AsSpan(start, Math.Min(ChunkLength, n - start));
                int k = h.Length;
                switch (plane)
                {
                    case 0: for (int i = 0; i < k; i++) bytes[i] = h[i].Hit ? (byte)1 : (byte)0; break;
                    case 1: for (int i = 0; i < k; i++) bytes[i] = (byte)h[i].Face; break;
                    case 2: for (int i = 0; i < k; i++) bytes[i] = h[i].Material; break;
                    case 3: for (int i = 0; i < k; i++) ints[i] = h[i].X; break;
                    case 4: for (int i = 0; i < k; i++) ints[i] = h[i].Y; break;
                    case 5: for (int i = 0; i < k; i++) ints[i] = h[i].Z; break;
                    default: for (int i = 0; i < k; i++) doubles[i] = h[i].T; break;
                }
                if (plane < 3)
                    w.Write(bytes, 0, k);
                else if (plane < 6)
                    WriteArray<int>(w, ints.AsSpan(0, k));
                else
                    WriteArray<double>(w, doubles.AsSpan(0, k));
            }
        }
    }

    public static void Write(PixelData data, string path)
    {
        using var file = File.Create(path);
        Write(data, file);
    }

    /// <summary>Reads a file written by <see cref="Write(PixelData, Stream)"/>; <paramref name="source"/> names it in errors.</summary>
    public static PixelData Read(Stream stream, string source)
    {
        try
        {
            using var gzip = new GZipStream(stream, CompressionMode.Decompress, leaveOpen: true);
            using var r = new BinaryReader(gzip, Encoding.UTF8, leaveOpen: true);
            byte[] magic = r.ReadBytes(4);
            if (!magic.AsSpan().SequenceEqual(Magic))
                throw new InputException($"{source}: not a VoxProf pixel data file (expected magic VXPX)");
            ushort version = r.ReadUInt16();
            if (version != Version)
                throw new InputException($"{source}: pixel data version {version} is not supported, expected {Version} (run voxprof trace again to write it in this version)");
            int counters = r.ReadUInt16();
            int width = r.ReadInt32(), height = r.ReadInt32();
            if (width is < 1 or > MaxSide || height is < 1 or > MaxSide)
                throw new InputException($"{source}: image size {width}x{height} is out of range, expected 1..{MaxSide} per side");
            string strategy = ReadName(r, source);
            var names = new string[counters];
            for (int c = 0; c < counters; c++)
                names[c] = ReadName(r, source);
            int n = width * height;
            var values = new uint[counters][];
            for (int c = 0; c < counters; c++)
                values[c] = ReadArray<uint>(r, n, source);

            byte[] flags = ReadArray<byte>(r, n, source), faces = ReadArray<byte>(r, n, source), materials = ReadArray<byte>(r, n, source);
            int[] xs = ReadArray<int>(r, n, source), ys = ReadArray<int>(r, n, source), zs = ReadArray<int>(r, n, source);
            double[] ts = ReadArray<double>(r, n, source);
            var hits = new PixelHit[n];
            for (int i = 0; i < n; i++)
            {
                if (faces[i] > (byte)HitFace.PosZ)
                    throw new InputException($"{source}: pixel {i % width},{i / width}: face code {faces[i]} is not 0..6");
                hits[i] = new PixelHit { Hit = flags[i] != 0, Face = (HitFace)faces[i], Material = materials[i], X = xs[i], Y = ys[i], Z = zs[i], T = ts[i] };
            }
            return new PixelData(strategy, width, height, names, values, hits);
        }
        catch (EndOfStreamException ex)
        {
            throw new InputException($"{source}: truncated pixel data file", ex);
        }
        catch (InvalidDataException ex)
        {
            throw new InputException($"{source}: not a gzip stream ({ex.Message})", ex);
        }
    }

    public static PixelData Read(string path)
    {
        try
        {
            using var file = File.OpenRead(path);
            return Read(file, path);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            throw new InputException($"{path}: cannot read pixel data ({ex.Message})", ex);
        }
    }

    private static void WriteName(BinaryWriter w, string name)
    {
        byte[] utf8 = Encoding.UTF8.GetBytes(name);
        if (utf8.Length > 255)
            throw new ArgumentException("name longer than 255 bytes", nameof(name));
        w.Write((byte)utf8.Length);
        w.Write(utf8);
    }

    private static string ReadName(BinaryReader r, string source)
    {
        int length = r.ReadByte();
        byte[] utf8 = r.ReadBytes(length);
        if (utf8.Length != length)
            throw new InputException($"{source}: truncated pixel data file");
        return Encoding.UTF8.GetString(utf8);
    }

    private static void WriteArray<T>(BinaryWriter w, ReadOnlySpan<T> values) where T : unmanaged
    {
        if (BitConverter.IsLittleEndian)
        {
            w.Write(MemoryMarshal.AsBytes(values));
            return;
        }
        // The file is little-endian whatever the machine; swap a copy on a big-endian host.
        T[] copy = values.ToArray();
        Swap(copy);
        w.Write(MemoryMarshal.AsBytes(copy.AsSpan()));
    }

    private static T[] ReadArray<T>(BinaryReader r, int count, string source) where T : unmanaged
    {
        var values = new T[count];
        Span<byte> bytes = MemoryMarshal.AsBytes(values.AsSpan());
        int read = 0;
        while (read < bytes.Length)
        {
            int k = r.Read(bytes[read..]);
            if (k == 0)
                throw new InputException($"{source}: truncated pixel data file (expected {bytes.Length} bytes of an array, found {read})");
            read += k;
        }
        if (!BitConverter.IsLittleEndian)
            Swap(values);
        return values;
    }

    /// <summary>Reverses the byte order of each 4- or 8-byte element (bytes need none).</summary>
    private static void Swap<T>(T[] values) where T : unmanaged
    {
        if (Marshal.SizeOf<T>() == 4)
        {
            Span<int> words = MemoryMarshal.Cast<T, int>(values.AsSpan());
            BinaryPrimitives.ReverseEndianness(words, words);
        }
        else if (Marshal.SizeOf<T>() == 8)
        {
            Span<long> words = MemoryMarshal.Cast<T, long>(values.AsSpan());
            BinaryPrimitives.ReverseEndianness(words, words);
        }
    }
}
