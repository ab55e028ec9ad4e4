using System.CommandLine;
using VoxProf.Cli.Formatting;
using VoxProf.Core.Limits;
using VoxProf.Core.Scenes;
using VoxProf.Core.Trees;

namespace VoxProf.Cli.Commands;

/// <summary>
/// <c>voxprof inspect SCENE</c>: builds the scene's tree and prints its shape and memory per level, then each layer
/// (kind, label, file, the voxels it set, load and voxelisation time) and each camera.
/// </summary>
public static class InspectCommand
{
    public static Command Create(TextWriter output, TextWriter error)
    {
        var sceneArg = new Argument<string>("scene") { Description = "Scene file (JSON)." };
        var branching = new Option<int>("--branching")
        {
            Description = "Cells per node side: 2 (octree), 4 (4x4x4 bricks, one 64-bit mask) or 8 (8x8x8 bricks, 512-bit masks).",
            DefaultValueFactory = _ => 4,
        };
        branching.Validators.Add(r =>
        {
            // Validators also run when the value did not parse; leave that error to the parser.
            if (r.Tokens.Count == 1 && int.TryParse(r.Tokens[0].Value, out int n) && !BrickTree.Branchings.Contains(n))
                r.AddError($"--branching: expected 2, 4 or 8, got {n}");
        });
        var format = new Option<string>("--format")
        {
            Description = "Output format: text or json.",
            DefaultValueFactory = _ => "text",
        };
        format.AcceptOnlyFromAmong("text", "json");
        var threads = new Option<int>("--threads")
        {
            Description = "Build threads; 0 uses every processor.",
            DefaultValueFactory = _ => 0,
        };
        threads.Validators.Add(r =>
        {
            if (r.Tokens.Count == 1 && int.TryParse(r.Tokens[0].Value, out int n) && n < 0)
                r.AddError($"--threads: expected 0 or more, got {n}");
        });

        var cmd = new Command("inspect", "Build a scene's sparse tree and print its size per level, its layers and its cameras.")
        {
            sceneArg, branching, format, threads,
        };
        var sceneOptions = new SceneOptions();
        sceneOptions.AddTo(cmd);
        cmd.SetAction(parse =>
        {
            return Guard.Run(error, () =>
            {
                string path = parse.GetValue(sceneArg)!;
                double maxWork = sceneOptions.MaxWork(parse);
                Scene scene = SceneLoader.Load(path, sceneOptions.LoadOptions(parse));
                RunChecks.BeforeBuild(scene, parse.GetValue(branching), maxWork, MemoryLimit.Probe());
                BrickTree tree = TreeBuilder.Build(scene, parse.GetValue(branching), parse.GetValue(threads));
                // A second walk, apart from the builder, credits each voxel to the layer that set it last and times each layer.
                LayerTally[] census = LayerCensus.Run(scene, parse.GetValue(threads));
                output.Write(parse.GetValue(format) == "json"
                    ? TreeSummary.Json(scene, tree, census)
                    : TreeSummary.Text(scene, tree, census));
                return ExitCodes.Ok;
            });
        });
        return cmd;
    }
}
