using System.CommandLine;
using VoxProf.Core;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Export;
using VoxProf.Reports.Shards;

namespace VoxProf.Cli.Commands;

/// <summary>
/// merge of the tile shards of one view (docs/reports.md, "Shards of one view's tiles"): the shards' recorded trace
/// command is run again with its trace step replaced by the shards' tiles laid side by side, so the report is made by
/// the very code that makes a whole trace's. The scene is loaded and its tree built again (for the tree's facts);
/// nothing is traced.
/// </summary>
internal static class MergeTiles
{
    public static int Run(IReadOnlyList<string> folders, string outDir, bool quiet, TextWriter output, TextWriter error)
    {
        var read = folders.Select(f => TileShard.IsTileShard(f)
            ? TileShard.Read(f)
            : throw new InputException($"{f}: a shard of views or no shard; expected the tile shards of one view like {folders.First(TileShard.IsTileShard)}")).ToArray();
        IReadOnlyList<TileShardFolder> shards = TileShard.Check(read, ToolInfo.Version, ToolInfo.Commit);
        IReadOnlyList<string> command = shards[0].Document.CommandLine;
        if (command.Count == 0 || command[0] != "trace")
            throw new InputException($"{shards[0].Folder}: the recorded command is not a trace; trace the shards again");

        var pipeline = TracePipeline.Default with
        {
            Trace = (request, _) =>
            {
                var settings = new TraceSettings(request.Width, request.Height, request.Tree.Branching, request.PrepassBlock,
                    request.Threads > 0 ? request.Threads : Environment.ProcessorCount);
                return new TraceRun(request.Scene, request.Camera, settings, request.Tree.Stats, TileShard.Assemble(shards, request));
            },
        };
        var root = new RootCommand { TraceCommand.Create(output, error, pipeline) };
        string[] args = [.. command, "--out", outDir, "--quiet"];
        var parse = root.Parse(args);
        if (parse.Errors.Count > 0)
            throw new InputException($"{shards[0].Folder}: the recorded command no longer parses ({parse.Errors[0].Message}); merge with the voxprof that traced the shards");
        int code = parse.Invoke(new InvocationConfiguration { Output = output, Error = error });
        if (code == ExitCodes.Ok && !quiet)
            output.WriteLine($"merged {shards.Count} tile shards of {shards[0].Document.View}");
        return code;
    }
}
