using System.Globalization;
using CsvHelper;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Model;
using VoxProf.Reports.Pixels;

namespace VoxProf.Reports.Export;

/// <summary>
/// pixels-STRATEGY.bin.gz for every strategy: what compare needs for per-pixel differences. Left out with --no-pixels.
/// </summary>
public sealed class PixelDataExporter : IReportExporter
{
    public string Name => "pixel data";

    public void Export(ReportContext context, OutputDirectory output)
    {
        if (!context.Options.PixelData)
            return;
        foreach (StrategyResult r in context.Run.Results)
            output.Write(OutputNames.PixelData(r.Strategy.Name), s => PixelDataFile.Write(PixelData.From(r), s));
    }
}

/// <summary>pixels-STRATEGY.csv, only with --per-pixel: one record per pixel for the user's own analysis.</summary>
public sealed class PixelCsvExporter : IReportExporter
{
    public static IReadOnlyList<string> FixedColumns { get; } = ["x", "y", "hit", "vx", "vy", "vz", "face", "t", "material"];

    public string Name => "per-pixel CSV";

    public void Export(ReportContext context, OutputDirectory output)
    {
        if (!context.Options.PerPixel)
            return;
        foreach (StrategyResult r in context.Run.Results)
            output.WriteText(OutputNames.PixelCsv(r.Strategy.Name), w => Write(r, w));
    }

    public static void Write(StrategyResult r, TextWriter writer)
    {
        using var csv = CsvWriter.Create(writer, null, leaveOpen: true);
        csv.WriteHeader([.. FixedColumns, .. r.CounterNames]);
        var inv = CultureInfo.InvariantCulture;
        for (int y = 0; y < r.Height; y++)
        {
            for (int x = 0; x < r.Width; x++)
            {
                int i = y * r.Width + x;
                ref readonly PixelHit h = ref r.Hits[i];
                csv.WriteField(x, default, inv);
                csv.WriteField(y, default, inv);
                csv.WriteField(h.Hit ? 1 : 0, default, inv);
                if (h.Hit)
                {
                    csv.WriteField(h.X, default, inv);
                    csv.WriteField(h.Y, default, inv);
                    csv.WriteField(h.Z, default, inv);
                    csv.WriteField(PixelHit.FaceName(h.Face));
                    csv.WriteField(h.T, "R", inv);
                    csv.WriteField((int)h.Material, default, inv);
                }
                else
                {
                    for (int k = 0; k < 6; k++)
                        csv.WriteField("");
                }
                foreach (uint[] counter in r.Counters)
                    csv.WriteField(counter[i], default, inv);
                csv.EndRecord();
            }
        }
        csv.Flush();
    }
}
