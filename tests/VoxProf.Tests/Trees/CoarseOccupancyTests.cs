using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes;
using VoxProf.Core.Scenes.Layers;
using VoxProf.Core.Trees;
using VoxProf.Tests.Traversal;

namespace VoxProf.Tests.Trees;

/// <summary>
/// The prepass's coarse occupancy grids against brute force: at every gridded level, a cell's bit is set exactly when
/// some voxel of the 3×3×3 block of cells around it is solid, inside the extent and out of it.
/// </summary>
public class CoarseOccupancyTests
{
    public static TheoryData<int, int> Cases() => new() { { 2, 1 }, { 2, 2 }, { 4, 3 }, { 4, 4 }, { 4, 5 }, { 8, 6 } };

    [Theory]
    [MemberData(nameof(Cases))]
    public void Every_bit_says_whether_the_3x3x3_block_around_its_cell_holds_a_solid_voxel(int branching, int seed)
    {
        var (tree, solid) = RandomTree(branching, seed);
        CoarseOccupancy grids = CoarseOccupancy.Build(tree);
        grids.FinestLevel.Should().Be(tree.Depth - 1, "a small volume keeps a grid down to its voxels");
        grids.HasSparseLevel.Should().BeFalse("every level fits the budget as a dense grid");
        CheckEveryLevel(tree, grids, solid);
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public void The_sparse_level_below_the_finest_dense_grid_answers_as_a_dense_grid_would(int branching, int seed)
    {
        var (tree, solid) = RandomTree(branching, seed);
        // 10,000 bits keep dense grids down to cells of 4 voxels on this extent (N = 2 and 4); the level below is sparse.
        CoarseOccupancy grids = CoarseOccupancy.Build(tree, bitBudget: 10_000, sparseWordBudget: 1 << 20);
        // A node of N = 8 has 512 cells, more than one word holds: no sparse level, the dense grids stop at cells of 8.
        grids.HasSparseLevel.Should().Be(branching <= 4);
        grids.CellShift(grids.FinestLevel - (grids.HasSparseLevel ? 1 : 0)).Should().Be(branching <= 4 ? 2 : 3);
        grids.FinestLevel.Should().BeLessThanOrEqualTo(tree.Depth - 1);
        CheckEveryLevel(tree, grids, solid);
    }

    [Fact]
    public void A_sparse_level_over_its_word_budget_is_left_out()
    {
        var (tree, _) = RandomTree(4, 3);
        CoarseOccupancy grids = CoarseOccupancy.Build(tree, bitBudget: 10_000, sparseWordBudget: 1);
        grids.HasSparseLevel.Should().BeFalse();
        grids.CellShift(grids.FinestLevel).Should().Be(2);
    }

    private static (BrickTree Tree, bool[,,] Solid) RandomTree(int branching, int seed)
    {
        // Odd extents, so cells straddle the extent's far faces at every level.
        const int ex = 37, ey = 29, ez = 41;
        Func<int, int, int, byte> material = KernelAgreementTests.RandomBlobs(seed, 36, 6);
        BrickTree tree = DenseTree.Build(ex, ey, ez, material, branching);
        var solid = new bool[ex, ey, ez];
        for (int z = 0; z < ez; z++)
            for (int y = 0; y < ey; y++)
                for (int x = 0; x < ex; x++)
                    solid[x, y, z] = material(x, y, z) != 0;
        return (tree, solid);
    }

    /// <summary>Every level's answer for every cell of the extent and three rings around it, against a brute-force scan.</summary>
    private static void CheckEveryLevel(BrickTree tree, CoarseOccupancy grids, bool[,,] solid)
    {
        int ex = solid.GetLength(0), ey = solid.GetLength(1), ez = solid.GetLength(2);
        int set = 0, checkedCells = 0;
        for (int level = 0; level <= grids.FinestLevel; level++)
        {
            int shift = tree.CellShift(level);
            int size = 1 << shift;
            int nx = (ex + size - 1) / size, ny = (ey + size - 1) / size, nz = (ez + size - 1) / size;
            bool[,,] cells = CellOccupancy(solid, size, nx, ny, nz);
            for (int cz = -3; cz < nz + 3; cz++)
                for (int cy = -3; cy < ny + 3; cy++)
                    for (int cx = -3; cx < nx + 3; cx++)
                    {
                        bool expected = AnyAround(cells, cx, cy, cz);
                        grids.NeighbourhoodOccupied(level, cx, cy, cz).Should().Be(expected, $"level {level}, cell ({cx},{cy},{cz})");
                        set += expected ? 1 : 0;
                        checkedCells++;
                    }
        }
        set.Should().BeGreaterThan(0).And.BeLessThan(checkedCells, "the scene has both solid and empty neighbourhoods");
    }

    [Fact]
    public void A_large_extent_keeps_grids_only_down_to_the_level_that_fits_the_budget_and_they_stay_exact_there()
    {
        // 4096×128×4096 voxels: the voxel level would take over 2^31 bits, cells of 4 voxels about 2^25, within the budget.
        var extent = new Box3i(0, 0, 0, 4096, 128, 4096);
        var box = new Box3i(1000, 100, 2000, 1003, 101, 2009);
        var scene = new Scene(4096, 128, 4096, [new BoxLayer(LayerOp.Add, 1, box, extent)], []);
        BrickTree tree = TreeBuilder.Build(scene, 4, threads: 1);
        CoarseOccupancy grids = tree.Coarse;
        // Dense grids down to cells of 4 voxels, then the voxels as a sparse level.
        grids.FinestLevel.Should().Be(tree.Depth - 1);
        grids.HasSparseLevel.Should().BeTrue();
        int dense = grids.FinestLevel - 1;
        grids.CellShift(dense).Should().Be(2);
        grids.Bytes.Should().BeLessThanOrEqualTo(CoarseOccupancy.BitBudget / 8 * 4,
            "each dense level fits the budget, the coarser ones add at most a sixty-third, and the sparse level keeps a copy of the finest grid, a rank per word and a few words");
        // Cells of 4 voxels: the box covers cells x 250, y 25, z 500..502; its 3×3×3 neighbourhood reaches one cell more.
        grids.NeighbourhoodOccupied(dense, 249, 24, 499).Should().BeTrue();
        grids.NeighbourhoodOccupied(dense, 251, 26, 503).Should().BeTrue();
        grids.NeighbourhoodOccupied(dense, 248, 25, 500).Should().BeFalse();
        grids.NeighbourhoodOccupied(dense, 250, 27, 500).Should().BeFalse();
        grids.NeighbourhoodOccupied(dense, 250, 25, 504).Should().BeFalse();
        // Voxels 1000..1002 × 100 × 2000..2008: the neighbourhood reaches one voxel more.
        int voxels = grids.FinestLevel;
        grids.NeighbourhoodOccupied(voxels, 999, 99, 1999).Should().BeTrue();
        grids.NeighbourhoodOccupied(voxels, 1003, 101, 2009).Should().BeTrue();
        grids.NeighbourhoodOccupied(voxels, 998, 100, 2000).Should().BeFalse();
        grids.NeighbourhoodOccupied(voxels, 1004, 100, 2000).Should().BeFalse();
        grids.NeighbourhoodOccupied(voxels, 1000, 102, 2000).Should().BeFalse();
        grids.NeighbourhoodOccupied(voxels, 1000, 100, 2010).Should().BeFalse();
        tree.Coarse.Should().BeSameAs(grids, "the tree builds its grids once");
    }

    private static bool[,,] CellOccupancy(bool[,,] solid, int size, int nx, int ny, int nz)
    {
        var cells = new bool[nx, ny, nz];
        for (int z = 0; z < solid.GetLength(2); z++)
            for (int y = 0; y < solid.GetLength(1); y++)
                for (int x = 0; x < solid.GetLength(0); x++)
                    if (solid[x, y, z])
                        cells[x / size, y / size, z / size] = true;
        return cells;
    }

    private static bool AnyAround(bool[,,] cells, int cx, int cy, int cz)
    {
        for (int z = cz - 1; z <= cz + 1; z++)
            for (int y = cy - 1; y <= cy + 1; y++)
                for (int x = cx - 1; x <= cx + 1; x++)
                    if (x >= 0 && y >= 0 && z >= 0 && x < cells.GetLength(0) && y < cells.GetLength(1) && z < cells.GetLength(2) && cells[x, y, z])
                        return true;
        return false;
    }
}
