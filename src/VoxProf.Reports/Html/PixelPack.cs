using System.IO.Compression;
using VoxProf.Core.Traversal;

namespace VoxProf.Reports.Html;

/// <summary>
/// The per-pixel copy report.html carries for its readout (docs/reports.md, "report.html"): a list of planes of
/// W·H 32-bit values, each value stored as the zigzag-coded difference from the pixel before it (row-major) in
/// LEB128 varint bytes, all planes one after another, then zlib (RFC 1950) and base64. Neighbouring pixels cost and
/// hit alike, so most differences fit one byte and deflate takes the rest; the page inflates it with the browser's
/// own DecompressionStream and a ten-line varint loop.
/// </summary>
public static class PixelPack
{
    /// <summary>Hit planes, in order, after the counters of a strategy that carries hits.</summary>
    public static IReadOnlyList<string> HitPlanes { get; } = ["hit", "face", "material", "x", "y", "z", "t"];

    /// <summary>The hit planes of <paramref name="hits"/>, in <see cref="HitPlanes"/> order; t as float32 bits.</summary>
    public static List<int[]> HitPlaneValues(PixelHit[] hits) =>
        Enumerable.Range(0, HitPlanes.Count).Select(p =>
        {
            var plane = new int[hits.Length];
            HitPlane(hits, p, plane);
            return plane;
        }).ToList();

    /// <summary>Fills <paramref name="values"/> with hit plane <paramref name="plane"/> (an index into <see cref="HitPlanes"/>).</summary>
    public static void HitPlane(PixelHit[] hits, int plane, int[] values)
    {
        if (plane is < 0 or > 6)
            throw new ArgumentOutOfRangeException(nameof(plane), $"hit planes are 0..{HitPlanes.Count - 1}");
        // One loop per plane rather than a switch per pixel: a profile at 2560×1440 showed the switch at 3% of a run.
        switch (plane)
        {
            case 0: for (int i = 0; i < hits.Length; i++) values[i] = hits[i].Hit ? 1 : 0; break;
            case 1: for (int i = 0; i < hits.Length; i++) values[i] = (int)hits[i].Face; break;
            case 2: for (int i = 0; i < hits.Length; i++) values[i] = hits[i].Material; break;
            case 3: for (int i = 0; i < hits.Length; i++) values[i] = hits[i].X; break;
            case 4: for (int i = 0; i < hits.Length; i++) values[i] = hits[i].Y; break;
            case 5: for (int i = 0; i < hits.Length; i++) values[i] = hits[i].Z; break;
            default: for (int i = 0; i < hits.Length; i++) values[i] = BitConverter.SingleToInt32Bits((float)hits[i].T); break;
        }
    }

    /// <summary>True when two strategies hit the same voxels through the same faces at the same t: one copy serves both.</summary>
    public static bool SameHits(PixelHit[] a, PixelHit[] b)
    {
        if (a.Length != b.Length)
            return false;
        for (int i = 0; i < a.Length; i++)
        {
            PixelHit p = a[i], q = b[i];
            if (p.Hit != q.Hit || p.Face != q.Face || p.Material != q.Material || p.X != q.X || p.Y != q.Y || p.Z != q.Z
                || BitConverter.SingleToInt32Bits((float)p.T) != BitConverter.SingleToInt32Bits((float)q.T))
                return false;
        }
        return true;
    }

    /// <summary>
    /// Deflate at zlib level 2 rather than the default 6 (CompressionLevel.Optimal): measured on the varint streams of
    /// two pages, level 6 took 0.91 s and 0.42 s, level 2 0.28 s and 0.10 s, for 13% and 28% more bytes (a 2560×1440
    /// trace of a raw terrain scene, 10.7 → 12.1 MB; the demo's main-street at 1280×720 with every strategy,
    /// 3.4 → 4.4 MB). Level 1 and the run-length strategy were faster still but grew the demo's by 40–85%.
    /// docs/performance.md, "Where a trace's time goes outside the kernels".
    /// </summary>
    private static readonly ZLibCompressionOptions Deflate = new() { CompressionLevel = 2 };

    /// <summary>The zlib-compressed varint stream of <paramref name="planes"/> (before base64).</summary>
    public static byte[] Encode(IEnumerable<int[]> planes)
    {
        using var packed = new MemoryStream();
        using (var zlib = new ZLibStream(packed, Deflate, leaveOpen: true))
            WriteVarints(planes, zlib);
        return packed.ToArray();
    }

    /// <summary>The varint stream before compression: zigzag (ZigZag) and base-128 varints as Protocol Buffers define them.</summary>
    internal static void WriteVarints(IEnumerable<int[]> planes, Stream output)
    {
        byte[] buffer = new byte[1 << 16];
        int used = 0;
        foreach (int[] plane in planes)
        {
            int previous = 0;
            foreach (int value in plane)
            {
                if (used > buffer.Length - 5)
                {
                    output.Write(buffer, 0, used);
                    used = 0;
                }
                int delta = unchecked(value - previous);
                previous = value;
                uint zigzag = (uint)((delta << 1) ^ (delta >> 31));
                while (zigzag >= 0x80)
                {
                    buffer[used++] = (byte)(zigzag | 0x80);
                    zigzag >>= 7;
                }
                buffer[used++] = (byte)zigzag;
            }
        }
        output.Write(buffer, 0, used);
    }

    /// <summary>The inverse of <see cref="Encode"/>: <paramref name="count"/> planes of <paramref name="length"/> values.</summary>
    public static int[][] Decode(byte[] packed, int count, int length)
    {
        using var zlib = new ZLibStream(new MemoryStream(packed), CompressionMode.Decompress);
        using var bytes = new BufferedStream(zlib, 1 << 16);
        var planes = new int[count][];
        for (int c = 0; c < count; c++)
        {
            var plane = new int[length];
            int previous = 0;
            for (int i = 0; i < length; i++)
            {
                uint zigzag = 0;
                int shift = 0, b;
                do
                {
                    b = bytes.ReadByte();
                    if (b < 0)
                        throw new InvalidDataException($"pixel pack ends inside plane {c} at value {i}");
                    zigzag |= (uint)(b & 0x7F) << shift;
                    shift += 7;
                }
                while ((b & 0x80) != 0);
                int delta = (int)(zigzag >> 1) ^ -(int)(zigzag & 1);
                previous = unchecked(previous + delta);
                plane[i] = previous;
            }
            planes[c] = plane;
        }
        return planes;
    }
}
