using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes;
using VoxProf.Core.Scenes.Layers;
using VoxProf.Core.Scenes.Meshes;
using VoxProf.Core.Trees;

namespace VoxProf.Tests.Scenes.Meshes;

public class MeshLayerTests
{
    internal static MeshLayer Layer(MeshShapes.Mesh mesh, MeshFill fill, Box3i extent, byte material = 1)
    {
        float[] v = [.. mesh.Positions.Select(p => (float)p)];
        InsideRule rule = fill == MeshFill.Solid ? MeshTopology.Analyse(mesh.Indices).Rule : InsideRule.None;
        return new MeshLayer(LayerOp.Add, material, v, [.. mesh.Indices], fill, rule, extent);
    }

    private static (long Interior, long Solid) Counts(MeshLayer layer)
    {
        Box3i b = layer.Bounds;
        long interior = 0, solid = 0;
        var inside = new bool[b.SizeX * b.SizeY];
        for (int z = b.MinZ; z < b.MaxZ; z++)
        {
            var slab = new Box3i(b.MinX, b.MinY, z, b.MaxX, b.MaxY, z + 1);
            layer.FillInteriorOnly(slab, inside);
            interior += inside.Count(x => x);
            layer.Fill(slab, inside);
            solid += inside.Count(x => x);
        }
        return (interior, solid);
    }

    // Bounds used by the volume checks ("the lattice-count bound"): the unit cubes centred on the voxel centres inside
    // a body K are disjoint, contain every point of K at least √3/2 (half a cube diagonal) inside its surface, and lie
    // within √3/2 of K, so vol(K shrunk by √3/2) ≤ interior count ≤ vol(K grown by √3/2). A solid voxel that is only a
    // surface voxel still has its cube touching K, so the solid count is at most vol(K grown by √3). For a ball and a
    // tube around a circle, shrinking and growing only change the radius.
    private const double HalfDiagonal = 0.8660254037844386;
    private const double Diagonal = 2 * HalfDiagonal;

    private static double BallVolume(double r) => 4.0 / 3.0 * Math.PI * r * r * r;

    // Torus volume by Pappus's centroid theorem: the tube's disc (area π r²) swept along the circle of its centroid
    // (length 2π R) gives 2π² R r².
    private static double TorusVolume(double major, double minor) => 2 * Math.PI * Math.PI * major * minor * minor;

    [Fact]
    public void A_solid_sphere_holds_its_volume_within_the_lattice_count_bound()
    {
        const double R = 20;
        MeshShapes.Mesh mesh = MeshShapes.Sphere(32.3, 31.7, 32.1, R, 96, 48);
        // The mesh lies between the ball of its inradius (the nearest face plane to the centre) and the ball of radius R.
        double inradius = Enumerable.Range(0, mesh.TriangleCount).Min(t => PlaneDistance(mesh, t, [32.3, 31.7, 32.1]));
        inradius.Should().BeInRange(R * 0.995, R);
        var (interior, solid) = Counts(Layer(mesh, MeshFill.Solid, new Box3i(0, 0, 0, 64, 64, 64)));
        interior.Should().BeInRange((long)BallVolume(inradius - HalfDiagonal), (long)Math.Ceiling(BallVolume(R + HalfDiagonal)));
        // A fine lattice count stays much closer to the volume than the bound requires (here within 1%).
        ((double)interior).Should().BeApproximately(BallVolume(R), BallVolume(R) * 0.01);
        solid.Should().BeInRange(interior + 1, (long)Math.Ceiling(BallVolume(R + Diagonal)));
    }

    [Fact]
    public void A_solid_torus_holds_its_Pappus_volume_within_the_lattice_count_bound()
    {
        const double Major = 24, Minor = 9;
        MeshShapes.Mesh mesh = MeshShapes.Torus(40.2, 20.4, 39.9, Major, Minor, 128, 64);
        // The polygonal torus strays from the exact one by at most the two chord sagittas, (R + r)(1 − cos π/128) around
        // and r(1 − cos π/64) across the tube, 0.010 + 0.011 voxel; 0.05 covers them and the split of each quad.
        const double Stray = 0.05;
        var (interior, solid) = Counts(Layer(mesh, MeshFill.Solid, new Box3i(0, 0, 0, 80, 40, 80)));
        interior.Should().BeInRange((long)TorusVolume(Major, Minor - Stray - HalfDiagonal),
            (long)Math.Ceiling(TorusVolume(Major, Minor + Stray + HalfDiagonal)));
        ((double)interior).Should().BeApproximately(TorusVolume(Major, Minor), TorusVolume(Major, Minor) * 0.01);
        solid.Should().BeInRange(interior + 1, (long)Math.Ceiling(TorusVolume(Major, Minor + Stray + Diagonal)));
    }

    // A box with faces between voxel centres holds exactly L³ centres; with the surface rule the solid voxels are
    // those whose closed cube meets the box: L + 1 per axis at a fractional offset, L + 2 when faces lie on voxel faces.
    [Theory]
    [InlineData(3.3, 5.6, 7.7, 10, 11)]
    [InlineData(4.0, 6.0, 2.0, 10, 12)]
    [InlineData(2.25, 2.25, 2.25, 7, 8)]
    public void A_solid_box_counts_exactly(double x, double y, double z, int side, int solidSide)
    {
        MeshShapes.Mesh mesh = MeshShapes.Box(x, y, z, x + side, y + side, z + side);
        var (interior, solid) = Counts(Layer(mesh, MeshFill.Solid, new Box3i(0, 0, 0, 32, 32, 32)));
        interior.Should().Be((long)side * side * side);
        solid.Should().Be((long)solidSide * solidSide * solidSide);
    }

    // Winding numbers add: an overlap of two outward parts is 2, inside; a part wound inwards counts −1 (still
    // inside by the non-zero rule) and cancels an outward part where they overlap. With one face flipped the
    // orientation is inconsistent, parity takes over, and an overlap (two crossings) is outside.
    [Fact]
    public void Overlapping_closed_parts_follow_the_winding_number_or_parity()
    {
        MeshShapes.Mesh a = MeshShapes.Box(2.5, 2.5, 2.5, 12.5, 12.5, 12.5), b = MeshShapes.Box(7.5, 7.5, 7.5, 17.5, 17.5, 17.5);
        int[] oneFaceFlipped = [.. b.Indices];
        (oneFaceFlipped[1], oneFaceFlipped[2]) = (oneFaceFlipped[2], oneFaceFlipped[1]);
        var extent = new Box3i(0, 0, 0, 20, 20, 20);
        MeshLayer outward = Layer(MeshShapes.Merge(a, b), MeshFill.Solid, extent);
        MeshLayer opposed = Layer(MeshShapes.Merge(a, b.Flipped()), MeshFill.Solid, extent);
        MeshLayer parity = Layer(MeshShapes.Merge(a, b with { Indices = oneFaceFlipped }), MeshFill.Solid, extent);
        outward.Rule.Should().Be(InsideRule.Winding);
        opposed.Rule.Should().Be(InsideRule.Winding);
        parity.Rule.Should().Be(InsideRule.Parity);
        // Voxel (10, 10, 10) has its centre inside both boxes, (5, 5, 5) only in the first, (15, 15, 15) only in the second.
        (outward.InteriorAt(10, 10, 10), opposed.InteriorAt(10, 10, 10), parity.InteriorAt(10, 10, 10)).Should().Be((true, false, false));
        (outward.InteriorAt(5, 5, 5), opposed.InteriorAt(5, 5, 5), parity.InteriorAt(5, 5, 5)).Should().Be((true, true, true));
        (outward.InteriorAt(15, 15, 15), opposed.InteriorAt(15, 15, 15), parity.InteriorAt(15, 15, 15)).Should().Be((true, true, true));
        (Counts(outward).Interior - Counts(parity).Interior).Should().Be(5 * 5 * 5);
    }

    [Fact]
    public void A_mesh_with_a_missing_face_is_open()
    {
        MeshShapes.Mesh box = MeshShapes.Box(1, 1, 1, 5, 5, 5);
        MeshTopology.Analyse(box.Indices).Should().Be((InsideRule.Winding, 0L));
        MeshTopology.Analyse(box.Indices[3..]).Should().Be((InsideRule.None, 3L), "removing one triangle leaves its three edges used once");
    }

    [Theory]
    [InlineData(MeshFill.Surface)]
    [InlineData(MeshFill.Solid)]
    public void Classify_is_conservative_and_fill_agrees_with_contains(MeshFill fill)
    {
        var extent = new Box3i(0, 0, 0, 64, 48, 64);
        foreach (MeshShapes.Mesh mesh in (MeshShapes.Mesh[])[MeshShapes.Sphere(30.2, 24.1, 33.3, 17, 40, 20),
            MeshShapes.Torus(32, 20.5, 32, 20, 6.5, 48, 24), MeshShapes.Box(8, 8, 8, 40, 20, 56)])
        {
            MeshLayer layer = Layer(mesh, fill, extent);
            LayerChecks.Tally tally = LayerChecks.ClassifyIsConservative(layer, extent, seed: 11, regions: 300, maxSize: 16);
            tally.None.Should().BeGreaterThan(0);
            tally.Partial.Should().BeGreaterThan(0);
            if (fill == MeshFill.Solid)
                tally.Full.Should().BeGreaterThan(0);
            LayerChecks.FillAgreesWithContains(layer, extent, seed: 12, regions: 40, maxSize: 24);
        }
    }

    // Rays cast towards +x must see crossings beyond the scene: a sphere cut by the extent's +x face keeps the same
    // inside voxels as the same sphere in a scene wide enough to hold it.
    [Fact]
    public void A_mesh_reaching_past_the_extent_keeps_its_inside()
    {
        MeshShapes.Mesh mesh = MeshShapes.Sphere(28.3, 16.2, 16.1, 12, 32, 16);
        MeshLayer cut = Layer(mesh, MeshFill.Solid, new Box3i(0, 0, 0, 32, 32, 32));
        MeshLayer whole = Layer(mesh, MeshFill.Solid, new Box3i(0, 0, 0, 64, 32, 32));
        int inside = 0;
        LayerChecks.ForEach(new Box3i(0, 0, 0, 32, 32, 32), (x, y, z) =>
        {
            bool c = cut.Contains(x, y, z);
            c.Should().Be(whole.Contains(x, y, z), $"voxel ({x},{y},{z})");
            inside += c ? 1 : 0;
        });
        inside.Should().BeGreaterThan(2000);
    }

    [Theory]
    [InlineData(2)]
    [InlineData(4)]
    public void The_tree_of_a_mesh_scene_matches_the_layers_voxel_by_voxel_for_any_thread_count(int branching)
    {
        var extent = new Box3i(0, 0, 0, 72, 40, 56);
        Layer[] layers =
        [
            Layer(MeshShapes.Torus(36, 18.3, 28, 18, 7, 40, 20), MeshFill.Solid, extent, 2),
            Layer(MeshShapes.Sphere(50.5, 20.2, 30.1, 12, 24, 12), MeshFill.Surface, extent, 3),
            new BoxLayer(LayerOp.Carve, 0, new Box3i(30, 0, 0, 40, 40, 56), extent),
        ];
        var scene = new Scene(72, 40, 56, layers, []);
        BrickTree one = TreeBuilder.Build(scene, branching, threads: 1);
        BrickTree two = TreeBuilder.Build(scene, branching, threads: 2);
        two.Nodes.Should().Equal(one.Nodes);
        two.Materials.Should().Equal(one.Materials);
        long solid = 0;
        LayerChecks.ForEach(scene.Bounds, (x, y, z) =>
        {
            byte m = scene.EvaluateMaterial(x, y, z);
            one.Material(x, y, z).Should().Be(m, $"voxel ({x},{y},{z})");
            solid += m != 0 ? 1 : 0;
        });
        one.Stats.SolidVoxels.Should().Be(solid).And.BeGreaterThan(5000);
    }

    private static double PlaneDistance(MeshShapes.Mesh m, int t, double[] c)
    {
        double[] a = m.P(m.Indices[3 * t]), b = m.P(m.Indices[3 * t + 1]), d = m.P(m.Indices[3 * t + 2]);
        double[] u = [b[0] - a[0], b[1] - a[1], b[2] - a[2]], v = [d[0] - a[0], d[1] - a[1], d[2] - a[2]];
        double[] n = [u[1] * v[2] - u[2] * v[1], u[2] * v[0] - u[0] * v[2], u[0] * v[1] - u[1] * v[0]];
        double len = Math.Sqrt(n[0] * n[0] + n[1] * n[1] + n[2] * n[2]);
        return Math.Abs(n[0] * (c[0] - a[0]) + n[1] * (c[1] - a[1]) + n[2] * (c[2] - a[2])) / len;
    }
}
