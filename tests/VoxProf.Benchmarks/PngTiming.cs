using System.Diagnostics;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.Formats.Png;
using SixLabors.ImageSharp.PixelFormats;
using VoxProf.Reports.Images;

namespace VoxProf.Benchmarks;

/// <summary>
/// PNG encoder settings against each other on a trace's own images: every PNG in a directory is decoded once, then
/// encoded with each setting (after one warm-up round) <c>rounds</c> times on one thread; prints the median wall and
/// process CPU time of a round (CPU time moves less on a shared machine) and the total size.
/// </summary>
public static class PngTiming
{
    public static void Run(string directory, int rounds, TextWriter output)
    {
        var images = Directory.GetFiles(directory, "*.png").Order(StringComparer.Ordinal).Select(Image.Load<Rgba32>).ToList();
        long pixels = images.Sum(i => (long)i.Width * i.Height);
        output.WriteLine($"{images.Count} images, {pixels / 1e6:F1} Mpixel, {rounds} rounds; VoxProf's setting marked *; ratios against the first row");
        output.WriteLine("level   filter     wall ms   CPU ms  total KiB");
        var settings = new List<(string Level, string Filter, PngEncoder Encoder)>
        {
            ("Level6", "(default)", Encoder(PngCompressionLevel.Level6, null)), // ImageSharp's default level and filter
            ("*" + Png.Encoder.CompressionLevel, Png.Encoder.FilterMethod?.ToString() ?? "(default)", Png.Encoder),
        };
        foreach (var level in new[] { PngCompressionLevel.Level1, PngCompressionLevel.Level2, PngCompressionLevel.Level3, PngCompressionLevel.Level4, PngCompressionLevel.Level6 })
        {
            foreach (var filter in new[] { PngFilterMethod.None, PngFilterMethod.Up, PngFilterMethod.Paeth, PngFilterMethod.Adaptive })
                settings.Add((level.ToString(), filter.ToString(), Encoder(level, filter)));
        }
        double baseMs = 0, baseKiB = 0;
        var process = System.Diagnostics.Process.GetCurrentProcess();
        foreach (var (level, filter, encoder) in settings)
        {
            Encode(images, encoder); // warm-up
            var wall = new List<double>();
            var cpu = new List<double>();
            long bytes = 0;
            for (int r = 0; r < rounds; r++)
            {
                process.Refresh();
                TimeSpan cpu0 = process.TotalProcessorTime;
                var sw = Stopwatch.StartNew();
                bytes = Encode(images, encoder);
                wall.Add(sw.Elapsed.TotalMilliseconds);
                process.Refresh();
                cpu.Add((process.TotalProcessorTime - cpu0).TotalMilliseconds);
            }
            wall.Sort();
            cpu.Sort();
            double ms = cpu[cpu.Count / 2], kib = bytes / 1024.0;
            if (baseMs == 0)
                (baseMs, baseKiB) = (ms, kib);
            output.WriteLine($"{level,-8}{filter,-10}{wall[wall.Count / 2],8:F0}{ms,9:F0}{kib,11:F0}  CPU ×{ms / baseMs:F2}, size ×{kib / baseKiB:F2}");
        }
    }

    private static PngEncoder Encoder(PngCompressionLevel level, PngFilterMethod? filter) =>
        new() { ColorType = PngColorType.Rgb, BitDepth = PngBitDepth.Bit8, CompressionLevel = level, FilterMethod = filter };

    private static long Encode(List<Image<Rgba32>> images, PngEncoder encoder)
    {
        long bytes = 0;
        foreach (var image in images)
        {
            using var stream = new MemoryStream();
            image.SaveAsPng(stream, encoder);
            bytes += stream.Length;
        }
        return bytes;
    }
}
