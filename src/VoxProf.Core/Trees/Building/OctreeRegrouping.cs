namespace VoxProf.Core.Trees.Building;

/// <summary>
/// Turns an octree into the tree of 8×8×8 nodes over the same voxels: an 8³ node's cells are its cube's octree cells
/// three levels down. The octree is canonical (every region stored as empty, as solid with one material, or as a node
/// when mixed), so each 8³ cell comes out canonical too. Nodes are laid out breadth first, each node's children
/// contiguous in cell order, so the arrays depend on the voxels alone.
/// </summary>
internal static class OctreeRegrouping
{
    private enum Kind : byte { Empty, Solid, Node, Above }

    /// <summary>
    /// A region of the octree: empty, solid with a material, octree node <see cref="Value"/>, or (Above) a cube
    /// <see cref="Value"/> octree levels above the octree's root, which lies in its low corner.
    /// </summary>
    private readonly record struct Region(Kind Kind, int Value);

    public static (int Depth, Node8[] Nodes, byte[] Materials) Regroup(BrickTree octree)
    {
        if (octree.Branching != 2)
            throw new ArgumentException("regrouping starts from an octree", nameof(octree));
        int depth = BrickTree.DepthFor(8, Math.Max(1, Math.Max(octree.ExtentX, Math.Max(octree.ExtentY, octree.ExtentZ))));
        // The 8³ root's cube may be larger than the octree's: 2^(3·depth) against 2^(octree depth), at most two
        // octree levels more, so the octree's root is reached within the 8³ root's own cells.
        int above = 3 * depth - octree.Depth;
        var pending = new List<Region> { above == 0 ? Root(octree) : new Region(Kind.Above, above) };
        var nodes = new List<Node8>();
        var materials = new List<byte>();
        Span<Region> cells = stackalloc Region[512];
        Span<Region> coarse = stackalloc Region[64];
        Span<Region> coarser = stackalloc Region[8];
        for (int i = 0; i < pending.Count; i++)
        {
            Split(octree, pending[i], cells, coarse, coarser);
            var node = new Node8 { FirstChild = pending.Count, FirstMaterial = materials.Count };
            for (int bit = 0; bit < 512; bit++)
            {
                Region cell = cells[bit];
                if (cell.Kind == Kind.Solid)
                {
                    node.SolidMask.Set(bit);
                    materials.Add((byte)cell.Value);
                }
                else if (cell.Kind != Kind.Empty)
                {
                    node.ChildMask.Set(bit);
                    pending.Add(cell);
                }
            }
            // As the octree builder stores them: an index with no cells behind it is 0.
            if (node.ChildMask.IsEmpty)
                node.FirstChild = 0;
            if (node.SolidMask.IsEmpty)
                node.FirstMaterial = 0;
            nodes.Add(node);
            if (nodes.Count > Array.MaxLength || materials.Count > Array.MaxLength - 512)
                throw new InvalidOperationException("the tree has more nodes or materials than one array can hold");
        }
        // The copy writes every record, so the array needs no clearing first.
        Node8[] records = LargeArrays.Uninitialized<Node8>(nodes.Count);
        nodes.CopyTo(records);
        return (depth, records, [.. materials]);
    }

    /// <summary>The 512 regions of a cube's cells three octree levels down, cell x + 8y + 64z.</summary>
    private static void Split(BrickTree octree, Region cube, Span<Region> cells, Span<Region> coarse, Span<Region> coarser)
    {
        for (int o = 0; o < 8; o++)
            coarser[o] = Child(octree, cube, o);
        for (int c = 0; c < 64; c++)
        {
            // Cell c of the 4×4×4 split: its coordinates' high bits pick the octant of the 2×2×2 split.
            int x = c & 3, y = (c >> 2) & 3, z = c >> 4;
            coarse[c] = Child(octree, coarser[(x >> 1) | ((y >> 1) << 1) | ((z >> 1) << 2)], (x & 1) | ((y & 1) << 1) | ((z & 1) << 2));
        }
        for (int c = 0; c < 512; c++)
        {
            int x = c & 7, y = (c >> 3) & 7, z = c >> 6;
            cells[c] = Child(octree, coarse[(x >> 1) | ((y >> 1) << 2) | ((z >> 1) << 4)], (x & 1) | ((y & 1) << 1) | ((z & 1) << 2));
        }
    }

    /// <summary>The region of octant <paramref name="octant"/> (x + 2y + 4z) of <paramref name="region"/>.</summary>
    private static Region Child(BrickTree octree, Region region, int octant) => region.Kind switch
    {
        Kind.Node when octree.IsSolidCell(region.Value, octant) => new Region(Kind.Solid, octree.MaterialOf(region.Value, octant)),
        Kind.Node when octree.HasChild(region.Value, octant) => new Region(Kind.Node, octree.ChildOf(region.Value, octant)),
        Kind.Node => default,
        Kind.Above when octant != 0 => default,
        Kind.Above => region.Value == 1 ? Root(octree) : new Region(Kind.Above, region.Value - 1),
        _ => region,
    };

    /// <summary>
    /// The octree's root as a region: the builder stores a root filled by one material as a node of eight solid
    /// cells (it has no parent to hold it), which as a cell of a larger node is simply solid.
    /// </summary>
    private static Region Root(BrickTree octree)
    {
        if (octree.CellCounts(0) == (0, 0))
            return default;
        byte first = octree.IsSolidCell(0, 0) ? octree.MaterialOf(0, 0) : (byte)0;
        for (int o = 0; o < 8; o++)
        {
            if (first == 0 || !octree.IsSolidCell(0, o) || octree.MaterialOf(0, o) != first)
                return new Region(Kind.Node, 0);
        }
        return new Region(Kind.Solid, first);
    }
}
