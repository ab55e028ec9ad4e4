using System.Diagnostics;
using VoxProf.Core.Scenes;
using VoxProf.Core.Trees.Building;

namespace VoxProf.Core.Trees;

/// <summary>
/// Builds a <see cref="BrickTree"/> straight from a scene's layers, never holding the dense volume.
/// Regions are classified top-down through the layers; regions no layer touches and regions one layer fills whole
/// stop early; mixed blocks of 16 voxels a side are evaluated densely and built bottom-up. Subtrees at a fixed level
/// are built in parallel and laid out in a fixed order, so the arrays are byte-identical for any thread count.
/// </summary>
public static class TreeBuilder
{
    /// <param name="branching">Cells per node side: 2 (octree), 4 (4×4×4 bricks) or 8 (8×8×8 bricks).</param>
    /// <param name="threads">0 means every processor.</param>
    public static BrickTree Build(Scene scene, int branching, int threads = 0)
    {
        ArgumentNullException.ThrowIfNull(scene);
        ArgumentOutOfRangeException.ThrowIfNegative(threads);
        var clock = Stopwatch.StartNew();
        if (branching == 8)
        {
            // An 8³ cell is an octree cell three levels down, and the octree builder already stores each region as
            // empty, solid with one material or mixed: regrouping its levels in threes gives the 8³ tree.
            (int depth8, Node8[] wide, byte[] wideMaterials) = OctreeRegrouping.Regroup(Build(scene, 2, threads));
            var unmeasured = new BrickTree(depth8, scene.ExtentX, scene.ExtentY, scene.ExtentZ, wide, wideMaterials, null!);
            return new BrickTree(depth8, scene.ExtentX, scene.ExtentY, scene.ExtentZ, wide, wideMaterials,
                TreeMeasure.Measure(unmeasured, clock.Elapsed));
        }
        var plan = new BuildPlan(scene, branching);
        int degree = threads == 0 ? Environment.ProcessorCount : threads;

        var top = new BuildWorker(plan);
        CellKind kind = top.ClassifyRoot(out byte baseMaterial, out int[] rootLayers);
        (Node[] nodes, byte[] materials) = kind switch
        {
            CellKind.Empty => Layout(plan, CellResult.Empty, [], [], [], degree),
            CellKind.Solid => Layout(plan, CellResult.Uniform(baseMaterial), [], [], [], degree),
            _ => BuildMixed(plan, top, baseMaterial, rootLayers, degree),
        };

        var unmeasuredTree = new BrickTree(branching, plan.Depth, scene.ExtentX, scene.ExtentY, scene.ExtentZ, nodes, materials, null!);
        TreeStats stats = TreeMeasure.Measure(unmeasuredTree, clock.Elapsed);
        return new BrickTree(branching, plan.Depth, scene.ExtentX, scene.ExtentY, scene.ExtentZ, nodes, materials,
            stats with { BuildTime = clock.Elapsed });
    }

    private static (Node[], byte[]) BuildMixed(BuildPlan plan, BuildWorker top, byte baseMaterial, int[] rootLayers, int degree)
    {
        List<SubtreeTask> tasks = plan.TaskLevel == 0
            ? [new SubtreeTask(0, 0, 0, 0, baseMaterial, rootLayers)]
            : top.EnumerateTasks(baseMaterial, rootLayers);

        var outputs = new SubtreeOutput[tasks.Count];
        var options = new ParallelOptions { MaxDegreeOfParallelism = degree };
        Parallel.For(0, tasks.Count, options,
            () => new BuildWorker(plan),
            (i, _, worker) =>
            {
                outputs[i] = worker.BuildSubtree(tasks[i]);
                return worker;
            },
            _ => { });

        // Layout: [root][subtree 0][subtree 1]…[levels above the subtrees]; materials likewise without the root slot.
        var nodeOffsets = new int[outputs.Length];
        var materialOffsets = new int[outputs.Length];
        var roots = new CellResult[outputs.Length];
        long nodeTotal = 1;
        long materialTotal = 0;
        for (int i = 0; i < outputs.Length; i++)
        {
            nodeOffsets[i] = (int)nodeTotal;
            materialOffsets[i] = (int)materialTotal;
            roots[i] = Relocate(outputs[i].Root, nodeOffsets[i], materialOffsets[i]);
            nodeTotal += outputs[i].Nodes.Length;
            materialTotal += outputs[i].Materials.Length;
            if (nodeTotal > Array.MaxLength || materialTotal > Array.MaxLength)
                throw new InvalidOperationException("the tree has more nodes or materials than one array can hold");
        }

        if (plan.TaskLevel == 0)
            return Layout(plan, roots[0], outputs, nodeOffsets, materialOffsets, degree);
        CellResult root = top.AssembleTop(baseMaterial, rootLayers, roots, (int)nodeTotal, (int)materialTotal);
        return Layout(plan, root, outputs, nodeOffsets, materialOffsets, degree, top);
    }

    private static (Node[], byte[]) Layout(BuildPlan plan, CellResult root, SubtreeOutput[] outputs,
        int[] nodeOffsets, int[] materialOffsets, int degree, BuildWorker? top = null)
    {
        ReadOnlySpan<Node> topNodes = top is null ? [] : top.Nodes.Span;
        ReadOnlySpan<byte> topMaterials = top is null ? [] : top.Materials.Span;
        int taskNodes = outputs.Sum(o => o.Nodes.Length);
        int taskMaterials = outputs.Sum(o => o.Materials.Length);
        // A root solid with one material has no parent to hold that cell: store it as a node with every cell solid.
        int rootMaterials = root.Kind == CellKind.Solid ? plan.CellsPerNode : 0;

        Node[] nodes = LargeArrays.Zeroed<Node>(1 + taskNodes + topNodes.Length);
        var materials = new byte[taskMaterials + topMaterials.Length + rootMaterials];
        nodes[0] = root.Kind switch
        {
            CellKind.Node => root.Node,
            CellKind.Solid => new Node { SolidMask = plan.FullMask, FirstMaterial = materials.Length - rootMaterials },
            _ => default,
        };
        materials.AsSpan(materials.Length - rootMaterials).Fill(root.Material);

        Parallel.For(0, outputs.Length, new ParallelOptions { MaxDegreeOfParallelism = degree }, i =>
        {
            Node[] src = outputs[i].Nodes;
            Span<Node> dst = nodes.AsSpan(nodeOffsets[i], src.Length);
            for (int k = 0; k < src.Length; k++)
                dst[k] = Relocate(src[k], nodeOffsets[i], materialOffsets[i]);
            outputs[i].Materials.CopyTo(materials.AsSpan(materialOffsets[i]));
        });
        topNodes.CopyTo(nodes.AsSpan(1 + taskNodes));
        topMaterials.CopyTo(materials.AsSpan(taskMaterials));
        return (nodes, materials);
    }

    private static CellResult Relocate(CellResult r, int nodeOffset, int materialOffset) =>
        r.Kind == CellKind.Node ? CellResult.Of(Relocate(r.Node, nodeOffset, materialOffset)) : r;

    private static Node Relocate(Node n, int nodeOffset, int materialOffset) => n with
    {
        FirstChild = n.ChildMask == 0 ? 0 : n.FirstChild + nodeOffset,
        FirstMaterial = n.SolidMask == 0 ? 0 : n.FirstMaterial + materialOffset,
    };
}
