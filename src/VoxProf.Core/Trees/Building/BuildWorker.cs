using System.Runtime.CompilerServices;
using VoxProf.Core.Geometry;

namespace VoxProf.Core.Trees.Building;

/// <summary>
/// One thread's builder. Walks a region top-down through the layers, evaluates mixed blocks densely, and appends
/// nodes bottom-up so that a node's children are written together once they are all known.
/// Not thread-safe: each thread owns one worker and its scratch.
/// </summary>
internal sealed partial class BuildWorker
{
    private enum Mode
    {
        /// <summary>Build a whole subtree down to the voxels.</summary>
        Subtree,
        /// <summary>Walk the levels above the task level and record every mixed task-level region.</summary>
        Enumerate,
        /// <summary>Walk the same levels again, taking each task-level region from the built subtrees.</summary>
        Assemble,
    }

    private const int MaxCells = 64;

    private readonly BuildPlan _plan;
    private readonly GrowBuffer<Node> _nodes = new();
    private readonly GrowBuffer<byte> _materials = new();

    // Per-level scratch: a node collects its children and materials here until all its cells are known.
    private readonly Node[] _childScratch;
    private readonly byte[] _materialScratch;

    // Per-level lists of the layers that touch a cell (indices into the plan's layers, in scene order).
    private readonly int[][] _layerScratch;

    private Mode _mode = Mode.Subtree;
    private List<SubtreeTask>? _tasks;
    private CellResult[]? _taskRoots;
    private int _taskCursor;

    public BuildWorker(BuildPlan plan)
    {
        _plan = plan;
        _childScratch = new Node[plan.Depth * MaxCells];
        _materialScratch = new byte[plan.Depth * MaxCells];
        _layerScratch = new int[plan.Depth + 1][];
        for (int i = 0; i < _layerScratch.Length; i++)
            _layerScratch[i] = new int[plan.Layers.Length];
        int denseVolume = plan.DenseSide * plan.DenseSide * plan.DenseSide;
        _voxels = new byte[denseVolume];
        _inside = new bool[denseVolume];
    }

    public GrowBuffer<Node> Nodes => _nodes;
    public GrowBuffer<byte> Materials => _materials;

    /// <summary>Classifies the root region under every layer; <paramref name="layers"/> gets the ones that touch it.</summary>
    public CellKind ClassifyRoot(out byte baseMaterial, out int[] layers)
    {
        int[] all = new int[_plan.Layers.Length];
        for (int i = 0; i < all.Length; i++)
            all[i] = i;
        var root = Box3i.Cube(0, 0, 0, _plan.RootSize);
        Span<int> touching = _layerScratch[0];
        CellKind kind = Classify(root, 0, all, touching, out baseMaterial, out int count);
        layers = touching[..count].ToArray();
        return kind;
    }

    public SubtreeOutput BuildSubtree(SubtreeTask task)
    {
        _mode = Mode.Subtree;
        _nodes.Reset(0);
        _materials.Reset(0);
        CellResult root = BuildNode(task.Level, task.X, task.Y, task.Z, task.BaseMaterial, task.Layers);
        return new SubtreeOutput(root, _nodes.ToArray(), _materials.ToArray());
    }

    /// <summary>Lists the mixed regions at the task level under a mixed root, in the order Assemble visits them.</summary>
    public List<SubtreeTask> EnumerateTasks(byte baseMaterial, int[] rootLayers)
    {
        _mode = Mode.Enumerate;
        _tasks = [];
        _nodes.Reset(0);
        _materials.Reset(0);
        BuildNode(0, 0, 0, 0, baseMaterial, rootLayers);
        var tasks = _tasks;
        _tasks = null;
        return tasks;
    }

    /// <summary>
    /// Builds the levels above the task level, taking the task-level regions from <paramref name="taskRoots"/>
    /// (already relocated to their final indices). Nodes and materials go to this worker's buffers, numbered from
    /// the given bases.
    /// </summary>
    public CellResult AssembleTop(byte baseMaterial, int[] rootLayers, CellResult[] taskRoots, int nodeBase, int materialBase)
    {
        _mode = Mode.Assemble;
        _taskRoots = taskRoots;
        _taskCursor = 0;
        _nodes.Reset(nodeBase);
        _materials.Reset(materialBase);
        CellResult root = BuildNode(0, 0, 0, 0, baseMaterial, rootLayers);
        if (_taskCursor != taskRoots.Length)
            throw new InvalidOperationException("the top levels visited a different set of regions than enumerated");
        _taskRoots = null;
        return root;
    }

    private CellResult BuildNode(int level, int x0, int y0, int z0, byte baseMaterial, ReadOnlySpan<int> layers)
    {
        if (_mode == Mode.Subtree && _plan.SideAt(level) <= _plan.DenseSide)
            return BuildDense(level, x0, y0, z0, baseMaterial, layers);

        int shift = _plan.CellShift(level);
        int cellSide = 1 << shift;
        int log2N = _plan.Log2N;
        int low = _plan.N - 1;
        Span<int> cellLayers = _layerScratch[level + 1];
        var acc = new CellAccumulator(level * MaxCells);
        for (int bit = 0; bit < _plan.CellsPerNode; bit++)
        {
            int x = x0 + ((bit & low) << shift);
            int y = y0 + (((bit >> log2N) & low) << shift);
            int z = z0 + ((bit >> (2 * log2N)) << shift);
            var cell = Box3i.Cube(x, y, z, cellSide);
            CellKind kind = Classify(cell, baseMaterial, layers, cellLayers, out byte cellBase, out int count);
            CellResult r = kind switch
            {
                CellKind.Empty => CellResult.Empty,
                CellKind.Solid => CellResult.Uniform(cellBase),
                _ => Descend(level + 1, x, y, z, cellBase, cellLayers[..count]),
            };
            Add(ref acc, bit, r);
        }
        return Finish(ref acc);
    }

    private CellResult Descend(int level, int x, int y, int z, byte baseMaterial, ReadOnlySpan<int> layers)
    {
        if (_mode == Mode.Subtree || level < _plan.TaskLevel)
            return BuildNode(level, x, y, z, baseMaterial, layers);
        if (_mode == Mode.Enumerate)
        {
            _tasks!.Add(new SubtreeTask(level, x, y, z, baseMaterial, layers.ToArray()));
            // A placeholder: it keeps the parent from collapsing; Enumerate's nodes are thrown away.
            return CellResult.Of(default);
        }
        return _taskRoots![_taskCursor++];
    }

    /// <summary>Cells of one node gathered so far; its slices of the scratch arrays start at Scratch.</summary>
    private struct CellAccumulator(int scratch)
    {
        public readonly int Scratch = scratch;
        public ulong ChildMask;
        public ulong SolidMask;
        public int Children;
        public int Solids;
    }

    private void Add(ref CellAccumulator acc, int bit, in CellResult r)
    {
        if (r.Kind == CellKind.Solid)
        {
            acc.SolidMask |= 1UL << bit;
            _materialScratch[acc.Scratch + acc.Solids++] = r.Material;
        }
        else if (r.Kind == CellKind.Node)
        {
            acc.ChildMask |= 1UL << bit;
            _childScratch[acc.Scratch + acc.Children++] = r.Node;
        }
    }

    private void AddSolid(ref CellAccumulator acc, int bit, byte material)
    {
        acc.SolidMask |= 1UL << bit;
        _materialScratch[acc.Scratch + acc.Solids++] = material;
    }

    /// <summary>Collapses a node that is all empty or all one material; otherwise writes its children and materials.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private CellResult Finish(ref CellAccumulator acc)
    {
        if ((acc.ChildMask | acc.SolidMask) == 0)
            return CellResult.Empty;
        ReadOnlySpan<byte> materials = _materialScratch.AsSpan(acc.Scratch, acc.Solids);
        // Every cell solid implies the node lies inside the extent: a cell reaching outside is never solid.
        if (acc.ChildMask == 0 && acc.SolidMask == _plan.FullMask && materials.IndexOfAnyExcept(materials[0]) < 0)
            return CellResult.Uniform(materials[0]);
        int firstChild = acc.Children == 0 ? 0 : _nodes.Append(_childScratch.AsSpan(acc.Scratch, acc.Children));
        int firstMaterial = acc.Solids == 0 ? 0 : _materials.Append(materials);
        return CellResult.Of(new Node
        {
            ChildMask = acc.ChildMask,
            SolidMask = acc.SolidMask,
            FirstChild = firstChild,
            FirstMaterial = firstMaterial,
        });
    }
}
