using System.Text.Json;
using VoxProf.Core;
using VoxProf.Reports.Export;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Views;

/// <summary>A shard's folder as read for a merge: its run-level report and its manifest.</summary>
public sealed record ShardFolder(string Folder, RunDocument Document, ReportManifest Manifest);

/// <summary>
/// Combines the folders of `trace --shard I/N` into the folder the run traced whole would have written: the views'
/// folders copied byte for byte (each file checked against its shard's manifest), then the run level written from
/// them as trace writes it. Shards of different scenes, commands, tool builds or view lists are refused.
/// </summary>
public static class RunMerge
{
    private static readonly JsonSerializerOptions Strict = new(ReportJson.Options)
    {
        RespectRequiredConstructorParameters = true,
        RespectNullableAnnotations = true,
    };

    /// <summary>Reads the run-level report.json of a shard folder, checked against its manifest.</summary>
    public static ShardFolder Read(string folder)
    {
        string file = Path.Combine(folder, OutputNames.ReportJson);
        if (!Directory.Exists(folder))
            throw new InputException($"{folder}: not found; expected a folder written by `voxprof trace --shard I/N`");
        if (!File.Exists(file))
            throw new InputException($"{file}: not found; expected a folder written by `voxprof trace --shard I/N`");
        var (manifest, bytes) = ReportManifest.ReadListed(folder, OutputNames.ReportJson, "a folder written whole by `voxprof trace --shard I/N`");
        RunDocument? run;
        try
        {
            using var json = JsonDocument.Parse(JsonText.WithoutBom(bytes));
            if (json.RootElement.ValueKind != JsonValueKind.Object || !json.RootElement.TryGetProperty("kind", out JsonElement kind)
                || kind.ValueKind != JsonValueKind.String || kind.GetString() != RunDocument.RunKind)
                throw new InputException($"{file}: the report of a single view; expected the report.json of a run traced with --shard I/N");
            if (!json.RootElement.TryGetProperty("schemaVersion", out JsonElement v) || !v.TryGetInt32(out int schema) || schema != RunDocument.CurrentSchema)
                throw new InputException($"{file}: $.schemaVersion: expected run schema {RunDocument.CurrentSchema}; merge shards with the voxprof that traced them");
            run = json.RootElement.Deserialize<RunDocument>(Strict);
        }
        catch (JsonException ex)
        {
            throw new InputException($"{file}: {Compare.ReportLoader.Where(ex)}: {Compare.ReportLoader.Problem(ex)}", ex);
        }
        if (run is null)
            throw new InputException($"{file}: expected a run report, found null");
        if (run.Shard is null)
            throw new InputException($"{file}: a whole run, not a shard; expected folders written by `voxprof trace --shard I/N`");
        return new ShardFolder(folder, run, manifest);
    }

    /// <summary>Refuses shards that are not the N distinct shares of one run; returns the views in run order with their shard.</summary>
    public static IReadOnlyList<(RunView View, ShardFolder Shard)> Check(IReadOnlyList<ShardFolder> shards)
    {
        if (shards.Count == 0)
            throw new InputException("merge: no shard folders given; expected the folders of trace --shard 1/N … N/N");
        ShardFolder first = shards[0];
        RunDocument a = first.Document;
        foreach (ShardFolder s in shards.Skip(1))
        {
            RunDocument b = s.Document;
            string Pair(string what, string x, string y) =>
                $"{s.Folder}: {what} differs from {first.Folder}'s ({y} against {x}); expected shards of one run";
            if (a.Scene.Name != b.Scene.Name || !string.Equals(a.Scene.Sha256, b.Scene.Sha256, StringComparison.OrdinalIgnoreCase))
                throw new InputException(Pair("the scene", $"{a.Scene.Name} sha256 {a.Scene.Sha256}", $"{b.Scene.Name} sha256 {b.Scene.Sha256}"));
            if (a.ToolVersion != b.ToolVersion || a.ToolCommit != b.ToolCommit)
                throw new InputException(Pair("the voxprof build", $"{a.ToolVersion} commit {a.ToolCommit}", $"{b.ToolVersion} commit {b.ToolCommit}"));
            if (!a.CommandLine.SequenceEqual(b.CommandLine))
                throw new InputException(Pair("the trace options", string.Join(" ", a.CommandLine), string.Join(" ", b.CommandLine)));
            if (a.Shard!.Count != b.Shard!.Count)
                throw new InputException(Pair("the number of shards", a.Shard.Count.ToString(System.Globalization.CultureInfo.InvariantCulture), b.Shard.Count.ToString(System.Globalization.CultureInfo.InvariantCulture)));
            if (!SameViews(a.Views, b.Views))
                throw new InputException(Pair("the list of views", $"{a.Views.Count} views", $"{b.Views.Count} views"));
        }
        int count = a.Shard!.Count;
        var byIndex = new Dictionary<int, ShardFolder>();
        foreach (ShardFolder s in shards)
        {
            if (!byIndex.TryAdd(s.Document.Shard!.Index, s))
                throw new InputException($"{s.Folder}: shard {s.Document.Shard.Index} of {count} is given twice (also {byIndex[s.Document.Shard.Index].Folder})");
        }
        var missing = Enumerable.Range(1, count).Where(i => !byIndex.ContainsKey(i)).ToArray();
        if (missing.Length > 0)
            throw new InputException($"merge: shard{(missing.Length == 1 ? "" : "s")} {string.Join(", ", missing)} of {count} missing; expected all {count} shard folders");

        var owner = new Dictionary<string, ShardFolder>(StringComparer.Ordinal);
        foreach (ShardFolder s in shards)
        {
            foreach (string view in s.Document.Shard!.Views)
            {
                if (!owner.TryAdd(view, s))
                    throw new InputException($"{s.Folder}: view {view} is also in {owner[view].Folder}; expected each view in one shard");
            }
        }
        var result = new List<(RunView, ShardFolder)>();
        foreach (RunView v in a.Views)
        {
            if (!owner.TryGetValue(v.Name, out ShardFolder? s))
                throw new InputException($"merge: view {v.Name} is in no shard; expected every view of the run traced");
            result.Add((v, s));
        }
        return result;
    }

    /// <summary>Copies every view's files into <paramref name="output"/> and writes the run level; the caller commits.</summary>
    public static (RunDocument Document, IReadOnlyList<ExportFailure> Failures) Merge(IReadOnlyList<ShardFolder> shards, OutputDirectory output)
    {
        var views = Check(shards);
        foreach (var (view, shard) in views)
        {
            string prefix = view.Folder + "/";
            var files = shard.Manifest.Files.Where(f => f.Name.StartsWith(prefix, StringComparison.Ordinal)).ToArray();
            if (!files.Any(f => f.Name == prefix + OutputNames.ReportJson))
                throw new InputException($"{Path.Combine(shard.Folder, view.Folder)}: no {OutputNames.ReportJson} listed in the shard's manifest; trace the shard again");
            OutputDirectory target = output.Folder(view.Folder);
            foreach (ManifestFile f in files)
            {
                string path = Path.Combine(shard.Folder, f.Name);
                byte[] bytes = File.Exists(path) ? File.ReadAllBytes(path) : throw new InputException($"{path}: listed in {ReportManifest.FileName} but missing; trace the shard again");
                shard.Manifest.Verify(shard.Folder, f.Name, bytes);
                target.Write(f.Name[prefix.Length..], s => s.Write(bytes));
            }
        }

        RunDocument a = shards[0].Document;
        IReadOnlyList<ViewReport> reports = RunWriter.ReadViews(output, a.Views);
        var header = new RunHeader(a.ToolVersion, a.ToolCommit, a.Scene, a.CommandLine, a.Views, a.Files.Contains(OutputNames.ReportHtml), a.Environment)
        {
            LinkBase = a.LinkBase is { } lb ? new Uri(lb) : null,
        };
        var timings = new RunTimings(shards.Sum(s => s.Document.Timings.TreeBuildSeconds), shards.Sum(s => s.Document.Timings.TraceSeconds), a.Timings.Threads);
        RunDocument merged = RunWriter.Build(header, reports, null, timings);
        return (merged, RunWriter.Write(output, merged, reports));
    }

    private static bool SameViews(IReadOnlyList<RunView> a, IReadOnlyList<RunView> b) =>
        a.Count == b.Count && a.Zip(b).All(p => p.First.Name == p.Second.Name && p.First.Folder == p.Second.Folder
            && p.First.Camera.Eye.SequenceEqual(p.Second.Camera.Eye) && p.First.Camera.Target.SequenceEqual(p.Second.Camera.Target)
            && p.First.Camera.Up.SequenceEqual(p.Second.Camera.Up) && p.First.Camera.FovDegrees == p.Second.Camera.FovDegrees);
}
