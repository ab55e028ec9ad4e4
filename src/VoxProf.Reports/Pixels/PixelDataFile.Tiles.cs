using System.Buffers.Binary;
using System.Runtime.InteropServices;
using VoxProf.Core;
using VoxProf.Core.Traversal;

namespace VoxProf.Reports.Pixels;

/// <summary>A merge's read of one tile shard's pixels from its whole-image file.</summary>
public static partial class PixelDataFile
{
    /// <summary>
    /// Reads the pixels of <paramref name="share"/>'s tracer tiles from a file of a <paramref name="width"/> ×
    /// <paramref name="height"/> image straight into the whole image's buffers, leaving every other pixel as it is:
    /// <paramref name="counters"/>[i] receives the file's counter named <paramref name="counterNames"/>[i] (any case).
    /// A merge of tile shards reads each shard's file this way: reading every array whole, as
    /// <see cref="Read(Stream, string, IReadOnlyCollection{string}?)"/> does, made a file at 2560×1440 about 260 MB of
    /// fresh memory only to copy the shard's half or less of it (docs/performance.md, "The memory model's passes, `merge`
    /// and `compare` reading").
    /// </summary>
    public static void ReadTiles(Stream stream, string source, TileShare share, int width, int height,
        IReadOnlyList<string> counterNames, uint[][] counters, PixelHit[] hits)
    {
        if (counters.Length != counterNames.Count || counters.Any(c => c.Length != width * height) || hits.Length != width * height)
            throw new ArgumentException("one whole-image buffer per counter name and one for the hits", nameof(counters));
        Open(stream, source, (r, header) =>
        {
            (string strategy, int w, int h, string[] names) = header;
            if (w != width || h != height)
                throw new InputException($"{source}: {w}x{h} pixels, expected {width}x{height}; trace the shard again");
            var into = new uint[]?[names.Length];
            for (int i = 0; i < counterNames.Count; i++)
            {
                int at = Array.FindIndex(names, name => string.Equals(name, counterNames[i], StringComparison.OrdinalIgnoreCase));
                if (at < 0)
                    throw new InputException($"{source}: pixel data of {strategy} has no counter {counterNames[i]}; trace the shards again");
                into[at] = counters[i];
            }
            int n = width * height;
            var runs = new PixelRuns(share, width, height);
            var scratch = new byte[ChunkLength * sizeof(double)];
            foreach (uint[]? target in into)
            {
                if (target is null)
                    Skip(r, (long)n * sizeof(uint), scratch, source);
                else
                    ReadRuns(r, target, runs, scratch, source);
            }
            ReadHits(r, width, n, scratch, source, hits, runs);
            return true;
        });
    }

    /// <summary>One counter array, a chunk at a time through <paramref name="scratch"/>, its kept runs copied into <paramref name="target"/>.</summary>
    private static void ReadRuns(BinaryReader r, uint[] target, PixelRuns runs, byte[] scratch, string source)
    {
        for (int start = 0; start < target.Length; start += ChunkLength)
        {
            int k = Math.Min(ChunkLength, target.Length - start);
            Span<byte> bytes = scratch.AsSpan(0, k * sizeof(uint));
            Fill(r, bytes, source);
            Span<uint> values = MemoryMarshal.Cast<byte, uint>(bytes);
            if (!BitConverter.IsLittleEndian)
                BinaryPrimitives.ReverseEndianness(values, values);
            for (int i = start; i < start + k;)
            {
                int end = runs.RunEnd(i, start + k, out bool held);
                if (held)
                    values[(i - start)..(end - start)].CopyTo(target.AsSpan(i, end - i));
                i = end;
            }
        }
    }
}
