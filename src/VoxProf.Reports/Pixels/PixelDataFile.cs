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
public static partial class PixelDataFile
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

    /// <summary>
    /// Reads a file written by <see cref="Write(PixelData, Stream)"/>; <paramref name="source"/> names it in errors.
    /// With <paramref name="counters"/>, only those counters (by name, any case) are kept: the others are read past in
    /// small pieces and never held, so a reader that needs one of twelve counters does not fault in the other eleven
    /// (compare's difference heatmaps at 2560×1440: about 100 MB a file instead of 350, hit records included).
    /// </summary>
    public static PixelData Read(Stream stream, string source, IReadOnlyCollection<string>? counters = null) =>
        Open(stream, source, (r, header) =>
        {
            (string strategy, int width, int height, string[] names) = header;
            int n = width * height;
            var keptNames = new List<string>();
            var values = new List<uint[]>();
            var scratch = new byte[ChunkLength * sizeof(double)];
            foreach (string name in names)
            {
                if (counters is null || counters.Contains(name, StringComparer.OrdinalIgnoreCase))
                {
                    keptNames.Add(name);
                    values.Add(ReadArray<uint>(r, n, source));
                }
                else
                {
                    Skip(r, (long)n * sizeof(uint), scratch, source);
                }
            }
            // Every field of every record is read below; huge pages where the system offers them (LargeArrays).
            PixelHit[] hits = LargeArrays.Uninitialized<PixelHit>(n);
            ReadHits(r, width, n, scratch, source, hits, PixelRuns.All);
            return new PixelData(strategy, width, height, keptNames, [.. values], hits);
        });

    /// <summary>
    /// Opens the file's gzip stream, reads its header and hands both to <paramref name="read"/>, turning the stream's
    /// own failures (a file cut short, or not gzip at all) into one-line input errors naming <paramref name="source"/>.
    /// </summary>
    private static T Open<T>(Stream stream, string source, Func<BinaryReader, (string Strategy, int Width, int Height, string[] Names), T> read)
    {
        try
        {
            using var gzip = new GZipStream(stream, CompressionMode.Decompress, leaveOpen: true);
            using var r = new BinaryReader(gzip, Encoding.UTF8, leaveOpen: true);
            return read(r, ReadHeader(r, source));
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

    /// <summary>The magic, version, image size, strategy and counter names, each checked.</summary>
    private static (string Strategy, int Width, int Height, string[] Names) ReadHeader(BinaryReader r, string source)
    {
        byte[] magic = r.ReadBytes(4);
        if (!magic.AsSpan().SequenceEqual(Magic))
            throw new InputException($"{source}: not a VoxProf pixel data file (expected magic VXPX)");
        ushort version = r.ReadUInt16();
        if (version != Version)
            throw new InputException($"{source}: pixel data version {version} is not supported, expected {Version} (run voxprof trace again to write it in this version)");
        int counterCount = r.ReadUInt16();
        int width = r.ReadInt32(), height = r.ReadInt32();
        if (width is < 1 or > MaxSide || height is < 1 or > MaxSide)
            throw new InputException($"{source}: image size {width}x{height} is out of range, expected 1..{MaxSide} per side");
        string strategy = ReadName(r, source);
        var names = new string[counterCount];
        for (int c = 0; c < counterCount; c++)
            names[c] = ReadName(r, source);
        return (strategy, width, height, names);
    }

    /// <summary>
    /// The seven hit arrays straight into the hit records of the pixels <paramref name="runs"/> keeps, a chunk at a
    /// time (full-size copies of each array were another 92 MB of fresh memory per file at 2560×1440).
    /// </summary>
    private static void ReadHits(BinaryReader r, int width, int n, byte[] scratch, string source, PixelHit[] hits, PixelRuns runs)
    {
        for (int plane = 0; plane < 7; plane++)
        {
            int size = plane < 3 ? 1 : plane < 6 ? sizeof(int) : sizeof(double);
            for (int start = 0; start < n; start += ChunkLength)
            {
                int k = Math.Min(ChunkLength, n - start);
                Span<byte> chunk = scratch.AsSpan(0, k * size);
                Fill(r, chunk, source);
                for (int i = start; i < start + k;)
                {
                    int end = runs.RunEnd(i, start + k, out bool held);
                    if (held)
                        ReadPlane(hits.AsSpan(i, end - i), chunk[((i - start) * size)..((end - start) * size)], plane, i, width, source);
                    i = end;
                }
            }
        }
    }

    /// <summary>A run of one plane's values (<paramref name="bytes"/>, little-endian) into the run's hit records.</summary>
    private static void ReadPlane(Span<PixelHit> h, Span<byte> bytes, int plane, int start, int width, string source)
    {
        if (plane < 3)
        {
            ReadBytes(h, bytes, plane, start, width, source);
            return;
        }
        // The file is little-endian whatever the machine: swap on a big-endian host.
        if (plane < 6)
        {
            Span<int> ints = MemoryMarshal.Cast<byte, int>(bytes);
            if (!BitConverter.IsLittleEndian)
                BinaryPrimitives.ReverseEndianness(ints, ints);
            for (int i = 0; i < h.Length; i++)
            {
                if (plane == 3) h[i].X = ints[i];
                else if (plane == 4) h[i].Y = ints[i];
                else h[i].Z = ints[i];
            }
            return;
        }
        Span<long> bits = MemoryMarshal.Cast<byte, long>(bytes);
        if (!BitConverter.IsLittleEndian)
            BinaryPrimitives.ReverseEndianness(bits, bits);
        for (int i = 0; i < h.Length; i++)
            h[i].T = BitConverter.Int64BitsToDouble(bits[i]);
    }

    /// <summary>A chunk of one of the byte planes (hit flag, face, material) into the hit records.</summary>
    private static void ReadBytes(Span<PixelHit> h, ReadOnlySpan<byte> bytes, int plane, int start, int width, string source)
    {
        // One loop a plane: a test of the plane per byte made this a tenth of a large compare's time.
        bytes = bytes[..h.Length];
        if (plane == 0)
        {
            for (int i = 0; i < bytes.Length; i++)
                h[i].Hit = bytes[i] != 0;
        }
        else if (plane == 1)
        {
            int bad = bytes.IndexOfAnyExceptInRange((byte)HitFace.None, (byte)HitFace.PosZ);
            if (bad >= 0)
                throw new InputException($"{source}: pixel {(start + bad) % width},{(start + bad) / width}: face code {bytes[bad]} is not 0..6");
            for (int i = 0; i < bytes.Length; i++)
                h[i].Face = (HitFace)bytes[i];
        }
        else
        {
            for (int i = 0; i < bytes.Length; i++)
                h[i].Material = bytes[i];
        }
    }

    /// <summary>Reads exactly <paramref name="bytes"/>.Length bytes, or fails naming the file.</summary>
    private static void Fill(BinaryReader r, Span<byte> bytes, string source)
    {
        int read = 0;
        while (read < bytes.Length)
        {
            int k = r.Read(bytes[read..]);
            if (k == 0)
                throw new InputException($"{source}: truncated pixel data file (expected {bytes.Length} bytes of an array, found {read})");
            read += k;
        }
    }

    /// <summary>Reads past <paramref name="count"/> bytes through <paramref name="scratch"/>.</summary>
    private static void Skip(BinaryReader r, long count, byte[] scratch, string source)
    {
        while (count > 0)
        {
            int k = (int)Math.Min(count, scratch.Length);
            Fill(r, scratch.AsSpan(0, k), source);
            count -= k;
        }
    }

    /// <summary><see cref="Read(Stream, string, IReadOnlyCollection{string}?)"/> of a file.</summary>
    public static PixelData Read(string path, IReadOnlyCollection<string>? counters = null)
    {
        try
        {
            using var file = File.OpenRead(path);
            return Read(file, path, counters);
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
        // Every element is read into: no clearing first, and huge pages where the system offers them.
        T[] values = LargeArrays.Uninitialized<T>(count);
        Fill(r, MemoryMarshal.AsBytes(values.AsSpan()), source);
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
