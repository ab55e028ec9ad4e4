using System.CommandLine;
using System.Globalization;
using VoxProf.Core;
using VoxProf.Core.Calibration;
using VoxProf.Core.Memory;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Export;

namespace VoxProf.Cli;

/// <summary>The trace options of the memory model (docs/counters.md, "Memory traffic"): on or off, and its cache.</summary>
internal sealed class MemoryOptions
{
    private static readonly MemorySettings Defaults = MemorySettings.Default;

    private readonly Option<string> _memory = new("--memory")
    {
        Description = "Memory model: on (cache-lines, lines-per-group and the cache replay) or off (tracing as fast as without it).",
        DefaultValueFactory = _ => "on",
    };

    private readonly Option<int?> _line = new("--cache-line")
    {
        Description = $"Cache line size in bytes: {string.Join(" or ", MemorySettings.LineSizes)} (default {Defaults.LineBytes}).",
    };

    private readonly Option<int?> _kib = new("--cache-kib")
    {
        Description = $"Size of the simulated cache in KiB (default {Defaults.CacheBytes / 1024}).",
    };

    private readonly Option<int?> _ways = new("--cache-ways")
    {
        Description = $"Lines per set of the simulated cache, 1 to {MemorySettings.MaxWays} (default {Defaults.Ways}).",
    };

    public void AddTo(Command command)
    {
        command.Options.Add(_memory);
        command.Options.Add(_line);
        command.Options.Add(_kib);
        command.Options.Add(_ways);
    }

    /// <summary>
    /// The model's settings, or null for --memory off; <paramref name="heatmaps"/> and the measures a calibration
    /// prices (<paramref name="calibration"/>) are checked against it.
    /// </summary>
    public MemorySettings? Settings(ParseResult parse, IEnumerable<string> heatmaps, CostModel? calibration)
    {
        bool on = OptionParsing.Choice(parse.GetValue(_memory)!, "--memory", "on", "off") == "on";
        int? line = parse.GetValue(_line), kib = parse.GetValue(_kib), ways = parse.GetValue(_ways);
        if (!on)
        {
            string? given = line is not null ? "--cache-line" : kib is not null ? "--cache-kib" : ways is not null ? "--cache-ways" : null;
            if (given is not null)
                throw new InputException($"{given}: sets the memory model's cache, which --memory off turns off; drop one of them");
            if (heatmaps.FirstOrDefault(HeatmapNames.NeedsMemoryModel) is { } map)
                throw new InputException($"--counters: {map} comes from the memory model, which --memory off turns off; drop one of them");
            // A priced counter the model did not measure would be 0, and predicted-ms silently too low.
            if (calibration?.Terms.FirstOrDefault(t => t.Measure?.Parts.Any(c => c.NeedsMemoryModel()) == true) is { } term)
                throw new InputException($"--calibration: prices {term.Name}, which comes from the memory model, which --memory off turns off; drop one of them");
            return null;
        }
        if (line is { } l && !MemorySettings.LineSizes.Contains(l))
            throw new InputException($"--cache-line: {l} is not valid, expected {string.Join(" or ", MemorySettings.LineSizes)} (bytes)");
        if (ways is { } w && w is < 1 or > MemorySettings.MaxWays)
            throw new InputException($"--cache-ways: {w} is not valid, expected 1 to {MemorySettings.MaxWays}");
        if (kib is { } k && k is < 1 or > 64 * 1024)
            throw new InputException($"--cache-kib: {k} is not valid, expected 1 to {64 * 1024} (KiB)");
        var settings = new MemorySettings(line ?? Defaults.LineBytes, (kib ?? Defaults.CacheBytes / 1024) * 1024, ways ?? Defaults.Ways);
        if (settings.Problem() is { } problem)
            throw new InputException(string.Create(CultureInfo.InvariantCulture, $"--cache-kib: {settings.CacheBytes / 1024} KiB with {settings.Ways} ways of {settings.LineBytes}-byte lines: {problem}"));
        return settings;
    }
}
