using System.CommandLine;
using System.Globalization;
using VoxProf.Core;
using VoxProf.Reports.Export;
using VoxProf.Reports.Shards;
using VoxProf.Reports.Views;

namespace VoxProf.Cli.Commands;

/// <summary>
/// <c>voxprof merge SHARD_DIRS... --out DIR</c>: the folders of <c>trace --shard I/N</c> combined into the folder the
/// run traced whole would have written (docs/ci.md, "Sharding a run over CI jobs").
/// </summary>
public static class MergeCommand
{
    public const string DefaultOut = "voxprof-out/merged";

    public static Command Create(TextWriter output, TextWriter error)
    {
        var shards = new Argument<string[]>("shards") { Description = "The folders written by `voxprof trace --shard I/N`, one per shard, in any order (shards of views, or of one view's tiles).", Arity = ArgumentArity.OneOrMore };
        var outOpt = new Option<string>("--out", "-o") { Description = "Folder for the merged run.", DefaultValueFactory = _ => DefaultOut };
        var quiet = new Option<bool>("--quiet", "-q") { Description = "Print only the line naming the folder written." };
        var cmd = new Command("merge", "Combine the shards of a trace into the report the whole run would have written.") { shards, outOpt, quiet };
        cmd.SetAction(parse =>
        {
            return Guard.Run(error, () =>
            {
                string outDir = parse.GetValue(outOpt) ?? DefaultOut;
                OutputDirectory.CheckPath(outDir, "--out");
                string[] folders = parse.GetValue(shards) ?? [];
                string outFull = Path.TrimEndingDirectorySeparator(Path.GetFullPath(outDir));
                foreach (string f in folders)
                {
                    if (string.Equals(Path.TrimEndingDirectorySeparator(Path.GetFullPath(f)), outFull, StringComparison.Ordinal))
                        throw new InputException($"--out: {outDir} is also a shard folder; expected a folder of its own for the merged run");
                }
                if (folders.Any(TileShard.IsTileShard))
                    return MergeTiles.Run(folders, outDir, parse.GetValue(quiet), output, error);
                var read = folders.Select(RunMerge.Read).ToArray();
                RunMerge.Check(read);
                using OutputDirectory folder = OutputDirectory.Open(outDir);
                var (document, failures) = RunMerge.Merge(read, folder);
                int files = folder.Written.Count;
                folder.Commit();
                if (!parse.GetValue(quiet))
                    RunConsole.Write(output, document);
                output.WriteLine($"merged {read.Length.ToString(CultureInfo.InvariantCulture)} shards: wrote {files.ToString(CultureInfo.InvariantCulture)} files to {folder.FullPath} ({document.Views.Count.ToString(CultureInfo.InvariantCulture)} views)");
                if (failures.Count == 0)
                    return ExitCodes.Ok;
                Guard.WriteError(error, "could not write " + string.Join("; ", failures.Select(f => f.Message)));
                return failures.All(f => f.Error is IOException or UnauthorizedAccessException or InputException) ? ExitCodes.BadInput : ExitCodes.InternalError;
            });
        });
        return cmd;
    }
}
