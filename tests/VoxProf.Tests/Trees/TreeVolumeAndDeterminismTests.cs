using System.Runtime.InteropServices;
using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes;
using VoxProf.Core.Trees;
using VoxProf.Core.Trees.Building;

namespace VoxProf.Tests.Trees;

public class TreeVolumeAndDeterminismTests
{
    [Theory]
    [InlineData(64, 4)]
    [InlineData(64, 2)]
    [InlineData(200, 4)]
    public void Voxelized_ball_holds_about_four_thirds_pi_r_cubed_solid_voxels(int radius, int branching)
    {
        int side = 2 * radius + 10;
        var extent = new Box3i(0, 0, 0, side, side, side);
        // An off-lattice centre, so no symmetry hides a counting error.
        double c = radius + 5.3;
        var scene = TestScenes.Of(side, side, side, new SphereLayer(LayerOp.Add, 1, c, c - 0.4, c + 0.2, radius, extent));

        BrickTree tree = TreeBuilder.Build(scene, branching);

        // The solid voxels are the points of a shifted unit lattice inside the ball (centre rule), so their count is
        // Gauss's ball problem (lattice points in a sphere): 4/3·π·r³ + E(r). Any point counted wrongly lies within
        // √3/2 of the sphere, which bounds |E(r)| by that shell's volume, about 4πr²·√3/2 (elementary; 4% of the
        // ball at r = 64). The actual error grows far slower, like r^(21/16) for centred balls (Heath-Brown, 1999,
        // "Lattice points in the sphere"; exponent from memory): hundreds of voxels against a 1% tolerance of 11,000.
        double volume = 4.0 / 3.0 * Math.PI * radius * radius * radius;
        tree.Stats.SolidVoxels.Should().BeCloseTo((long)volume, (ulong)(0.01 * volume));
    }

    public static TheoryData<int> Branchings => new() { 2, 4, 8 };

    [Theory]
    [MemberData(nameof(Branchings))]
    public void Builds_with_one_two_and_three_threads_give_identical_arrays(int branching)
    {
        var extent = new Box3i(0, 0, 0, 700, 180, 600);
        var scene = TestScenes.Of(700, 180, 600,
            new HillsLayer(1, 60, 20, 150, extent),
            new SphereLayer(LayerOp.Add, 2, 300.5, 90, 280, 70, extent),
            new SphereLayer(LayerOp.Carve, 0, 500, 60, 100, 50, extent),
            new NoiseLayer(LayerOp.Add, 3, new Box3i(100, 40, 400, 170, 120, 480), extent, 11, 0.4));
        // An 8³ tree is regrouped from the octree, whose build is the parallel one.
        new BuildPlan(scene, branching == 8 ? 2 : branching).TaskLevel.Should().BeGreaterThan(0, "the scene must split into several subtrees");

        BrickTree one = TreeBuilder.Build(scene, branching, threads: 1);
        BrickTree two = TreeBuilder.Build(scene, branching, threads: 2);
        BrickTree three = TreeBuilder.Build(scene, branching, threads: 3);

        one.NodeCount.Should().BeGreaterThan(branching == 8 ? 100 : 1000);
        foreach (BrickTree other in new[] { two, three })
        {
            MemoryMarshal.AsBytes(other.Nodes.AsSpan()).SequenceEqual(MemoryMarshal.AsBytes(one.Nodes.AsSpan()))
                .Should().BeTrue("node arrays must be byte-identical");
            MemoryMarshal.AsBytes(other.Nodes8.AsSpan()).SequenceEqual(MemoryMarshal.AsBytes(one.Nodes8.AsSpan()))
                .Should().BeTrue("8³ node arrays must be byte-identical");
            other.Materials.AsSpan().SequenceEqual(one.Materials).Should().BeTrue("material arrays must be byte-identical");
        }
        TreeStructureTests.AssertWellFormed(one, "parallel build");
    }
}
