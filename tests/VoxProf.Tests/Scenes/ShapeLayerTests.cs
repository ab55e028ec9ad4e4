using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes;
using VoxProf.Core.Scenes.Layers;

namespace VoxProf.Tests.Scenes;

public class ShapeLayerTests
{
    private static readonly Box3i Extent = new(0, 0, 0, 96, 80, 96);

    [Fact]
    public void Box_classify_is_conservative_and_fill_agrees_with_contains()
    {
        var layer = new BoxLayer(LayerOp.Add, 3, new Box3i(10, 5, 20, 70, 60, 50), Extent);
        var tally = LayerChecks.ClassifyIsConservative(layer, Extent, seed: 1);
        LayerChecks.FillAgreesWithContains(layer, Extent, seed: 2);
        tally.Full.Should().BeGreaterThan(0);
        tally.None.Should().BeGreaterThan(0);
    }

    [Fact]
    public void Box_reaching_past_the_extent_is_clipped_to_it()
    {
        var layer = new BoxLayer(LayerOp.Add, 3, new Box3i(-10, -10, -10, 200, 20, 200), Extent);
        layer.Bounds.Should().Be(new Box3i(0, 0, 0, 96, 20, 96));
        layer.Contains(-1, 5, 5).Should().BeFalse();
        layer.Classify(new Box3i(-8, 0, 0, 8, 8, 8)).Should().Be(Coverage.Partial);
    }

    [Fact]
    public void Carve_layers_carry_material_zero()
    {
        new BoxLayer(LayerOp.Carve, 9, new Box3i(0, 0, 0, 4, 4, 4), Extent).Material.Should().Be(0);
    }

    [Theory]
    [InlineData(48.0, 40.0, 48.0, 30.0)]
    [InlineData(47.5, 40.25, 10.0, 17.3)]
    [InlineData(90.0, 70.0, 90.0, 25.0)]
    public void Sphere_classify_is_conservative_and_fill_agrees_with_contains(double cx, double cy, double cz, double r)
    {
        var layer = new SphereLayer(LayerOp.Add, 2, cx, cy, cz, r, Extent);
        var tally = LayerChecks.ClassifyIsConservative(layer, Extent, seed: 3, regions: 600);
        LayerChecks.FillAgreesWithContains(layer, Extent, seed: 4);
        tally.None.Should().BeGreaterThan(0);
        tally.Full.Should().BeGreaterThan(0);
    }

    [Fact]
    public void Sphere_bounds_hold_every_voxel_inside()
    {
        var layer = new SphereLayer(LayerOp.Add, 2, 40.3, 30.7, 41.1, 12.6, Extent);
        long inBounds = LayerChecks.CountInside(layer, layer.Bounds);
        long total = LayerChecks.CountInside(layer, Extent);
        inBounds.Should().Be(total).And.BeGreaterThan(0);
    }

    [Theory]
    [InlineData(64)]
    [InlineData(200)]
    public void A_voxelized_ball_holds_close_to_four_thirds_pi_r_cubed_voxels(int r)
    {
        // The volume of a ball is 4/3·π·r³. Counting voxel centres inside it is Gauss's lattice-point problem for
        // the ball: the error is O(r²) at most (the order of the surface area) and far smaller in practice. 1% of
        // the volume is 0.042·r³, about 2.7·r² voxels at r = 64 and 8.4·r² at r = 200: a safe margin.
        int size = 2 * r + 8;
        var extent = new Box3i(0, 0, 0, size, size, size);
        double c = size / 2.0;
        var layer = new SphereLayer(LayerOp.Add, 1, c, c, c, r, extent);
        long count = LayerChecks.CountInside(layer, layer.Bounds);
        double volume = 4.0 / 3.0 * Math.PI * r * r * r;
        Math.Abs(count - volume).Should().BeLessThan(0.01 * volume);
    }

    [Theory]
    [InlineData(Axis.X)]
    [InlineData(Axis.Y)]
    [InlineData(Axis.Z)]
    public void Cylinder_classify_is_conservative_and_fill_agrees_with_contains(Axis axis)
    {
        var layer = new CylinderLayer(LayerOp.Add, 4, axis, 20.5, 15.0, 30.25, 14.2, 40.6, Extent);
        var tally = LayerChecks.ClassifyIsConservative(layer, Extent, seed: 5, regions: 600);
        LayerChecks.FillAgreesWithContains(layer, Extent, seed: 6);
        tally.None.Should().BeGreaterThan(0);
        tally.Full.Should().BeGreaterThan(0);
    }

    [Fact]
    public void Cylinder_includes_voxels_whose_centres_lie_between_base_and_top()
    {
        // Axis y from y = 10 to y = 14: centres 10.5 .. 13.5 are inside, 9.5 and 14.5 are not.
        var layer = new CylinderLayer(LayerOp.Add, 4, Axis.Y, 50, 10, 50, 3, 4, Extent);
        layer.Contains(50, 9, 50).Should().BeFalse();
        layer.Contains(50, 10, 50).Should().BeTrue();
        layer.Contains(50, 13, 50).Should().BeTrue();
        layer.Contains(50, 14, 50).Should().BeFalse();
        layer.Contains(52, 12, 50).Should().BeTrue();   // centre 2.5 from the axis
        layer.Contains(53, 12, 50).Should().BeFalse();  // centre 3.5 from the axis
    }
}
