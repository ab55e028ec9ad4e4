using System.Text.Json;
using VoxProf.Core;
using VoxProf.Core.Memory;
using VoxProf.Core.Statistics;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Export;
using VoxProf.Reports.Model;
using VoxProf.Reports.Pixels;

namespace VoxProf.Reports.Shards;

/// <summary>One strategy's share of the memory model: totals and per-group lines of the shard's tiles (zero elsewhere).</summary>
public sealed record TileShardMemory(long Accesses, long Hits, IReadOnlyList<uint[]> GroupLines);

/// <summary>One strategy as a tile shard traced it.</summary>
/// <param name="MemorySeconds">The memory model's time, apart from <paramref name="Seconds"/> (absent from shards
/// written before it was timed apart).</param>
public sealed record TileShardStrategy(string Name, double Seconds, TileShardMemory? Memory, double? MemorySeconds = null);

/// <summary>tile-shard.json: what a tile shard traced, so merge can check the shards belong together.</summary>
public sealed record TileShardDocument(
    string Kind, int SchemaVersion, string ToolVersion, string ToolCommit, string Scene, string? SceneSha256, string View,
    int Width, int Height, IReadOnlyList<string> CommandLine, int Index, int Count, IReadOnlyList<TileShardStrategy> Strategies)
{
    public const string FileName = "tile-shard.json";
    public const string ShardKind = "tile-shard";
    public const int CurrentSchema = 1;
}

/// <summary>
/// A tile shard of one view (docs/reports.md, "Shards of one view's tiles"): the per-pixel data of its tiles, written
/// by trace, and read back by merge, which lays the shards' tiles side by side into the trace of the whole image.
/// </summary>
public static class TileShard
{
    /// <summary>Writes the shard's pixel files and tile-shard.json into <paramref name="output"/>; the caller commits.</summary>
    public static void Write(OutputDirectory output, TraceRun run, ReportOptions options, TileShare share)
    {
        foreach (StrategyResult r in run.Results)
            output.Write(OutputNames.PixelData(r.Strategy.Name), s => PixelDataFile.Write(PixelData.From(r), s));
        var strategies = run.Results.Select(r => new TileShardStrategy(r.Strategy.Name, r.Elapsed.TotalSeconds,
            r.Memory is { } m ? new TileShardMemory(m.Accesses, m.Hits, m.Groups.Select(g => g.Lines).ToArray()) : null,
            r.Memory is not null ? r.MemoryElapsed.TotalSeconds : null)).ToArray();
        var doc = new TileShardDocument(TileShardDocument.ShardKind, TileShardDocument.CurrentSchema, options.ToolVersion, options.ToolCommit,
            run.Scene.Name, run.Scene.ContentHash, run.Camera.Name, run.Settings.Width, run.Settings.Height, options.CommandLine,
            share.Index, share.Count, strategies);
        output.Write(TileShardDocument.FileName, s => JsonSerializer.Serialize(s, doc, ReportJson.Options));
    }

    /// <summary>Whether <paramref name="folder"/> holds a tile shard rather than a shard of views.</summary>
    public static bool IsTileShard(string folder) => File.Exists(Path.Combine(folder, TileShardDocument.FileName));

    /// <summary>Reads a tile shard's tile-shard.json, checked against its manifest.</summary>
    public static TileShardFolder Read(string folder)
    {
        string file = Path.Combine(folder, TileShardDocument.FileName);
        var (manifest, bytes) = ReportManifest.ReadListed(folder, TileShardDocument.FileName, "a folder written whole by `voxprof trace --shard I/N`");
        TileShardDocument? doc;
        try
        {
            doc = JsonSerializer.Deserialize<TileShardDocument>(JsonText.WithoutBom(bytes).Span, ReportJson.Options);
        }
        catch (JsonException ex)
        {
            throw new InputException($"{file}: {Compare.ReportLoader.Where(ex)}: {Compare.ReportLoader.Problem(ex)}", ex);
        }
        if (doc is null || doc.Kind != TileShardDocument.ShardKind || doc.SchemaVersion != TileShardDocument.CurrentSchema)
            throw new InputException($"{file}: expected a tile shard of schema {TileShardDocument.CurrentSchema}; merge shards with the voxprof that traced them");
        return new TileShardFolder(folder, doc, manifest);
    }

    /// <summary>Refuses tile shards that are not the N distinct shares of one view traced alike; returns them by index.</summary>
    public static IReadOnlyList<TileShardFolder> Check(IReadOnlyList<TileShardFolder> shards, string toolVersion, string toolCommit)
    {
        TileShardFolder first = shards[0];
        TileShardDocument a = first.Document;
        if (a.ToolVersion != toolVersion || a.ToolCommit != toolCommit)
            throw new InputException($"{first.Folder}: traced by voxprof {a.ToolVersion} commit {a.ToolCommit}, this is {toolVersion} commit {toolCommit}; merge tile shards with the voxprof that traced them");
        foreach (TileShardFolder s in shards.Skip(1))
        {
            TileShardDocument b = s.Document;
            string Pair(string what, string x, string y) =>
                $"{s.Folder}: {what} differs from {first.Folder}'s ({y} against {x}); expected shards of one run";
            if (a.Scene != b.Scene || !string.Equals(a.SceneSha256, b.SceneSha256, StringComparison.OrdinalIgnoreCase))
                throw new InputException(Pair("the scene", $"{a.Scene} sha256 {a.SceneSha256}", $"{b.Scene} sha256 {b.SceneSha256}"));
            if (a.ToolVersion != b.ToolVersion || a.ToolCommit != b.ToolCommit)
                throw new InputException(Pair("the voxprof build", $"{a.ToolVersion} commit {a.ToolCommit}", $"{b.ToolVersion} commit {b.ToolCommit}"));
            if (!a.CommandLine.SequenceEqual(b.CommandLine))
                throw new InputException(Pair("the trace options", string.Join(" ", a.CommandLine), string.Join(" ", b.CommandLine)));
            if (a.Count != b.Count)
                throw new InputException(Pair("the number of shards", a.Count.ToString(System.Globalization.CultureInfo.InvariantCulture), b.Count.ToString(System.Globalization.CultureInfo.InvariantCulture)));
        }
        var byIndex = new TileShardFolder?[a.Count];
        foreach (TileShardFolder s in shards)
        {
            if (s.Document.Index < 1 || s.Document.Index > a.Count)
                throw new InputException($"{Path.Combine(s.Folder, TileShardDocument.FileName)}: $.index: {s.Document.Index} is out of range, expected 1..{a.Count}");
            if (byIndex[s.Document.Index - 1] is { } twice)
                throw new InputException($"{s.Folder}: shard {s.Document.Index} of {a.Count} is given twice (also {twice.Folder})");
            byIndex[s.Document.Index - 1] = s;
        }
        var missing = Enumerable.Range(1, a.Count).Where(i => byIndex[i - 1] is null).ToArray();
        if (missing.Length > 0)
            throw new InputException($"merge: shard{(missing.Length == 1 ? "" : "s")} {string.Join(", ", missing)} of {a.Count} missing; expected all {a.Count} shard folders");
        return byIndex!;
    }

    /// <summary>
    /// The results of <paramref name="request"/>, laid together from the shards' tiles instead of traced: each tile's
    /// pixels from the shard that traced it, the memory model's totals and group lines summed (each group lies in
    /// one tile, so the other shards hold zeros there), the times summed.
    /// </summary>
    public static IReadOnlyList<StrategyResult> Assemble(IReadOnlyList<TileShardFolder> shards, TraceRequest request)
    {
        TileShardDocument a = shards[0].Document;
        if (request.Scene.ContentHash is { } hash && !string.Equals(hash, a.SceneSha256, StringComparison.OrdinalIgnoreCase))
            throw new InputException($"{request.Scene.SourcePath ?? request.Scene.Name}: the scene's SHA-256 is {hash}, the shards traced {a.SceneSha256}; merge with the scene file the shards traced");
        if (request.Width != a.Width || request.Height != a.Height || !request.Strategies.Select(s => s.Name).SequenceEqual(a.Strategies.Select(s => s.Name)))
            throw new InputException($"{shards[0].Folder}: the shard's image or strategies differ from its recorded command; trace the shards again");
        int width = request.Width, height = request.Height;
        var results = new List<StrategyResult>();
        // The trace's own buffers: a counter no shard can have counted stays the trace's shared zeros, and is not read.
        ResultBuffers[] buffers = ResultBuffers.For(request);
        for (int k = 0; k < request.Strategies.Count; k++)
        {
            StrategyDefinition definition = request.Strategies[k];
            uint[][] counters = buffers[k].Counters;
            PixelHit[] hits = buffers[k].Hits;
            string[] names = [.. definition.CounterNames.Where((_, c) => buffers[k].Produced[c])];
            uint[][] filled = [.. counters.Where((_, c) => buffers[k].Produced[c])];
            // The shards' files side by side (inflating one is a single core's work, 260 MB at 2560×1440): each copies
            // its own tiles, which no other shard holds.
            SideBySide.For(shards.Count, i => shards[i].ReadTiles(definition, new TileShare(shards[i].Document.Index, a.Count), width, height, names, filled, hits));
            double seconds = shards.Sum(s => s.Document.Strategies[k].Seconds);
            double memorySeconds = shards.Sum(s => s.Document.Strategies[k].MemorySeconds ?? 0);
            results.Add(new StrategyResult(definition, width, height, counters, hits, TimeSpan.FromSeconds(seconds))
            {
                Memory = request.Memory is { } settings ? Memory(shards, k, settings) : null,
                MemoryElapsed = TimeSpan.FromSeconds(memorySeconds),
            });
        }
        return results;
    }

    private static MemoryResult Memory(IReadOnlyList<TileShardFolder> shards, int strategy, MemorySettings settings)
    {
        TileShardMemory[] parts = [.. shards.Select(s => s.Document.Strategies[strategy].Memory
            ?? throw new InputException($"{s.Folder}: no memory model in {TileShardDocument.FileName}; trace the shards again"))];
        var groups = new List<GroupLines>();
        for (int g = 0; g < SubgroupShape.Standard.Count; g++)
        {
            uint[] lines = new uint[parts[0].GroupLines[g].Length];
            foreach (TileShardMemory p in parts)
            {
                for (int i = 0; i < lines.Length; i++)
                    lines[i] += p.GroupLines[g][i];
            }
            groups.Add(new GroupLines(SubgroupShape.Standard[g], lines));
        }
        return new MemoryResult(settings, groups, parts.Sum(p => p.Accesses), parts.Sum(p => p.Hits));
    }
}

/// <summary>A tile shard's folder as read for a merge.</summary>
public sealed record TileShardFolder(string Folder, TileShardDocument Document, ReportManifest Manifest)
{
    /// <summary>
    /// The shard's pixels of <paramref name="strategy"/> in <paramref name="share"/>'s tiles, from its pixel file
    /// (checked against its manifest) into the whole image's buffers, one per name of <paramref name="counterNames"/>.
    /// </summary>
    public void ReadTiles(StrategyDefinition strategy, TileShare share, int width, int height, IReadOnlyList<string> counterNames,
        uint[][] counters, PixelHit[] hits)
    {
        string name = OutputNames.PixelData(strategy.Name);
        string path = Path.Combine(Folder, name);
        if (!File.Exists(path))
            throw new InputException($"{path}: not found; expected the pixel data of the shard's tiles (trace the shard without --no-pixels)");
        byte[] bytes = File.ReadAllBytes(path);
        Manifest.Verify(Folder, name, bytes);
        using var stream = new MemoryStream(bytes);
        PixelDataFile.ReadTiles(stream, path, share, width, height, counterNames, counters, hits);
    }
}
