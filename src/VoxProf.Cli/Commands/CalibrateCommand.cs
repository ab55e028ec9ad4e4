using System.CommandLine;
using System.Globalization;
using VoxProf.Core;
using VoxProf.Core.Calibration;
using VoxProf.Core.Statistics;
using VoxProf.Reports.Calibration;
using VoxProf.Reports.Compare;
using VoxProf.Reports.Export;

namespace VoxProf.Cli.Commands;

/// <summary>
/// <c>voxprof calibrate TIMES.csv REPORT...</c>: fit per-counter GPU costs to times measured in an engine
/// (docs/calibration.md).
/// </summary>
public static class CalibrateCommand
{
    public const string DefaultOut = "voxprof-out/calibration";

    public static Command Create(TextWriter output, TextWriter error)
    {
        var times = new Argument<string>("times") { Description = "CSV of measured GPU times: scene, camera, strategy, gpu-ms; optionally prepass, branching, size, note." };
        var reports = new Argument<string[]>("reports")
        {
            Description = "Report directories written by `voxprof trace` (or their report.json), one per measured view.",
            Arity = ArgumentArity.OneOrMore,
        };
        var device = new Option<string>("--device") { Description = "The GPU and driver the times were measured on (free text, recorded in the calibration).", Required = true };
        var features = new Option<string?>("--features")
        {
            Description = $"Comma-separated measures to price besides the per-pixel cost (default {string.Join(",", CostFeatures.Default.Select(m => m.Name))}): {CostFeatures.ValidList}.",
        };
        var outDir = new Option<string>("--out", "-o") { Description = "Directory for calibration.json and calibration.md.", DefaultValueFactory = _ => DefaultOut };

        var cmd = new Command("calibrate", "Fit per-counter GPU costs to measured times; write calibration.json for trace --calibration.")
        {
            times, reports, device, features, outDir,
        };
        cmd.SetAction(parse =>
        {
            return Guard.Run(error, () => Execute(parse.GetValue(times)!, parse.GetValue(reports) ?? [], parse.GetValue(device)!,
                parse.GetValue(features), parse.GetValue(outDir) ?? DefaultOut, output, error));
        });
        return cmd;
    }

    private static int Execute(string timesPath, string[] reportPaths, string device, string? featureList, string outDir,
        TextWriter output, TextWriter error)
    {
        // Options first: a typo should not wait for the reports to load.
        List<MeasureDefinition> features = featureList is null
            ? [.. CostFeatures.Default]
            : OptionParsing.List<MeasureDefinition>(featureList, "--features", "measure", CostFeatures.TryParse, CostFeatures.ValidList);
        device = device.Trim();
        if (device.Length == 0)
            throw new InputException("--device: empty; expected the GPU and driver the times were measured on, e.g. --device \"lab card A, driver 551.2\"");
        if (File.Exists(outDir))
            throw new InputException($"{outDir}: is a file, expected an output directory");

        IReadOnlyList<TimeRow> rows = TimesCsv.Read(timesPath);
        var loaded = new List<LoadedReport>();
        foreach (string path in reportPaths)
        {
            LoadedReport read = ReportLoader.Load(path);
            // A run of several views gives each of its views, never the mean over them.
            IEnumerable<LoadedReport> reports = read.Views is { } runViews
                ? runViews.Select(v => ReportLoader.Load(Path.Combine(read.Directory, v.Folder)))
                : [read];
            foreach (LoadedReport report in reports)
            {
                if (!loaded.Any(r => Path.GetFullPath(r.File) == Path.GetFullPath(report.File)))
                    loaded.Add(report);
            }
        }
        IReadOnlyList<MeasuredView> views = MeasuredViews.Match(timesPath, rows, loaded, features);
        int needed = CostFitter.MinimumSamples(features.Count);
        if (views.Count < needed)
        {
            throw new InputException($"{timesPath}: {views.Count} rows for {features.Count + 1} costs ({CostTerm.PixelName}, {string.Join(", ", features.Select(f => f.Name))}); " +
                $"calibrate needs at least {needed}, one more than the costs, from views whose counts differ (several cameras and strategies)");
        }

        CostFit fit = CostFitter.Fit(features, views.Select(v => v.Sample).ToArray());
        CalibrationDocument doc = CalibrationBuilder.Build(device, views, fit, ToolInfo.Version);
        using OutputDirectory directory = OutputDirectory.Open(outDir);
        IReadOnlyList<string> written = CalibrationFile.Write(directory, doc);
        directory.Commit();

        WriteSummary(output, doc);
        output.WriteLine($"wrote {string.Join(", ", written)} to {directory.FullPath}");
        foreach (string w in doc.Warnings)
            error.WriteLine($"voxprof: warning: {w}");
        foreach (LoadedReport unused in loaded.Where(r => !views.Any(v => ReferenceEquals(v.Report, r))))
            error.WriteLine($"voxprof: warning: {unused.File}: no row of {timesPath} measures this report's view; it was not used");
        return ExitCodes.Ok;
    }

    private static void WriteSummary(TextWriter output, CalibrationDocument doc)
    {
        var scope = doc.FittedOn;
        output.WriteLine($"calibration for {doc.Device} from {scope.Rows} views (branching {string.Join(", ", scope.Branchings)}; {string.Join(", ", scope.Sizes)})");
        var lines = new List<string[]> { new[] { "cost", "ns", "per", "share" } };
        lines.AddRange(doc.Costs.Select(c => new[]
        {
            c.Feature, CalibrationMarkdown.Number(c.Nanoseconds), c.Per, c.Share is { } s ? s.ToString("0.0%", CultureInfo.InvariantCulture) : "",
        }));
        int[] widths = Enumerable.Range(0, 4).Select(i => lines.Max(l => l[i].Length)).ToArray();
        foreach (string[] line in lines)
            output.WriteLine($"{line[0].PadRight(widths[0])}  {line[1].PadLeft(widths[1])}  {line[2].PadRight(widths[2])}  {line[3].PadLeft(widths[3])}".TrimEnd());
        var fit = doc.Fit;
        string r2 = fit.RSquared is { } r ? r.ToString("0.0000", CultureInfo.InvariantCulture) : "undefined";
        output.WriteLine($"R² {r2}, RMS residual {CalibrationMarkdown.Number(fit.RmsResidualMs)} ms; leave-one-out: RMS error " +
            $"{CalibrationMarkdown.Number(fit.LooRmsErrorMs)} ms, mean |error| {fit.LooMeanAbsPercent.ToString("0.0", CultureInfo.InvariantCulture)}%");
    }
}
