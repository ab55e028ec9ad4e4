using VoxProf.Core.Geometry;

namespace VoxProf.Tests.Geometry;

public class Box3iTests
{
    [Fact]
    public void Intersection_of_disjoint_boxes_is_empty()
    {
        var a = new Box3i(0, 0, 0, 4, 4, 4);
        var b = new Box3i(4, 0, 0, 8, 4, 4);
        a.Intersects(b).Should().BeFalse();
        a.Intersect(b).IsEmpty.Should().BeTrue();
    }

    [Fact]
    public void Volume_of_a_full_size_extent_does_not_overflow()
    {
        var b = new Box3i(0, 0, 0, 65536, 65536, 65536);
        b.Volume.Should().Be(1L << 48);
    }
}
