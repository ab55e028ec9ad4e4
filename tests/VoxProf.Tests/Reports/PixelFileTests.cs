using System.Buffers.Binary;
using System.Globalization;
using System.IO.Compression;
using CsvHelper;
using VoxProf.Core;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Export;
using VoxProf.Reports.Pixels;

namespace VoxProf.Tests.Reports;

/// <summary>Per-pixel t is the traversal's double, written without loss in both per-pixel files (docs/reports.md).</summary>
public class PixelFileTests
{
    // Distances a float cannot hold: at t = 3000 a float's step is 2.4e-4 voxel.
    private static readonly double[] Distances = [3000.000123456789, 0.1 + 0.2, 1.0 / 3, 59999.99999999999, 0];

    private static StrategyResult Result()
    {
        int n = Distances.Length;
        var counters = new uint[CounterNames.Count][];
        for (int c = 0; c < counters.Length; c++)
            counters[c] = new uint[n];
        var hits = new PixelHit[n];
        for (int i = 0; i < n; i++)
            hits[i] = new PixelHit { Hit = true, X = i, Y = 2 * i, Z = 3 * i, T = Distances[i], Material = 1, Face = HitFace.NegY };
        return new StrategyResult(BuiltInStrategies.Hdda, n, 1, counters, hits, TimeSpan.Zero);
    }

    /// <summary>The pixel file of <paramref name="data"/> in memory, ready to read.</summary>
    internal static MemoryStream Written(PixelData data)
    {
        var stream = new MemoryStream();
        PixelDataFile.Write(data, stream);
        stream.Position = 0;
        return stream;
    }

    [Fact]
    public void The_binary_file_keeps_every_bit_of_t()
    {
        using MemoryStream stream = Written(PixelData.From(Result()));
        PixelData back = PixelDataFile.Read(stream, "mem");
        back.Hits.Select(h => h.T).Should().Equal(Distances);
        back.Hits.Should().Equal(Result().Hits);
    }

    /// <summary>300×300 pixels: more than one of the reader's 65,536-pixel chunks, every field varied.</summary>
    internal static PixelData Large()
    {
        const int w = 300, h = 300;
        var rng = new Random(11);
        var counters = new uint[CounterNames.Count][];
        for (int c = 0; c < counters.Length; c++)
            counters[c] = Enumerable.Range(0, w * h).Select(_ => (uint)rng.Next()).ToArray();
        var hits = new PixelHit[w * h];
        for (int i = 0; i < hits.Length; i++)
        {
            hits[i] = new PixelHit
            {
                Hit = rng.Next(3) > 0,
                Face = (HitFace)rng.Next(7),
                Material = (byte)rng.Next(256),
                X = rng.Next(-5, 5000),
                Y = rng.Next(),
                Z = -rng.Next(),
                T = rng.NextDouble() * 1e4,
            };
        }
        return PixelData.From(new StrategyResult(BuiltInStrategies.DdaMask, w, h, counters, hits, TimeSpan.Zero));
    }

    [Fact]
    public void Every_hit_field_and_counter_reads_back_across_chunks()
    {
        PixelData data = Large();
        using MemoryStream stream = Written(data);
        PixelData back = PixelDataFile.Read(stream, "mem");
        back.Hits.Should().Equal(data.Hits);
        back.CounterNames.Should().Equal(data.CounterNames);
        for (int c = 0; c < data.Counters.Length; c++)
            back.Counters[c].Should().Equal(data.Counters[c], data.CounterNames[c]);
    }

    [Fact]
    public void A_reader_asking_for_some_counters_gets_those_alone_and_every_hit()
    {
        PixelData data = Large();
        using MemoryStream stream = Written(data);
        PixelData back = PixelDataFile.Read(stream, "mem", ["DESCENTS", "iterations", "not-a-counter"]);
        back.CounterNames.Should().Equal("iterations", "descents");
        back.Find("iterations").Should().Equal(data.Find("iterations"));
        back.Find("descents").Should().Equal(data.Find("descents"));
        back.Find("cell-steps").Should().BeNull("it was read past, not kept");
        back.Hits.Should().Equal(data.Hits, "the counters read past leave the hits where they were");
    }

    [Fact]
    public void A_face_code_out_of_range_names_the_pixel()
    {
        PixelData data = Large();
        data.Hits[70001].Face = (HitFace)9;
        using MemoryStream stream = Written(data);
        FluentActions.Invoking(() => PixelDataFile.Read(stream, "x/pixels-dda-mask.bin.gz")).Should().Throw<InputException>()
            .Which.Message.Should().Be("x/pixels-dda-mask.bin.gz: pixel 101,233: face code 9 is not 0..6");
    }

    [Fact]
    public void A_version_1_file_is_refused_with_one_line_naming_the_file_and_both_versions()
    {
        using var file = new MemoryStream();
        using (var gzip = new GZipStream(file, CompressionLevel.Fastest, leaveOpen: true))
        {
            Span<byte> header = stackalloc byte[6];
            "VXPX"u8.CopyTo(header);
            BinaryPrimitives.WriteUInt16LittleEndian(header[4..], 1);
            gzip.Write(header);
        }
        file.Position = 0;
        FluentActions.Invoking(() => PixelDataFile.Read(file, "old/pixels-dda.bin.gz")).Should().Throw<InputException>()
            .Which.Message.Should().Be("old/pixels-dda.bin.gz: pixel data version 1 is not supported, expected 2 " +
                "(run voxprof trace again to write it in this version)");
    }

    // RFC 4180 reader from outside the project (CsvHelper); the shortest round-trip form is .NET's "R" formatting
    // contract: double.Parse gives back the same double.
    [Fact]
    public void The_csv_writes_the_shortest_text_that_reads_back_to_the_same_double()
    {
        var text = new StringWriter();
        PixelCsvExporter.Write(Result(), text);
        using var csv = CsvReader.FromText(text.ToString());
        var written = new List<string>();
        while (csv.Read())
            written.Add(csv.GetString("t")!);
        written.Should().Equal("3000.000123456789", "0.30000000000000004", "0.3333333333333333", "59999.99999999999", "0");
        written.Select(s => double.Parse(s, CultureInfo.InvariantCulture)).Should().Equal(Distances);
    }
}
