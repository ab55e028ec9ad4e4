using VoxProf.Core.Geometry;

namespace VoxProf.Tests.Geometry;

public class TriangleAxesTests
{
    private static TriangleAxes Axes(double[] t, int rowAxis = -1) => rowAxis < 0
        ? TriangleAxes.Create(t[0], t[1], t[2], t[3], t[4], t[5], t[6], t[7], t[8])
        : TriangleAxes.Create(t[0], t[1], t[2], t[3], t[4], t[5], t[6], t[7], t[8], rowAxis);

    private static TriangleAxes.Separation AgainstUnitCube(double[] t) => Axes(t).Separate(0, 0, 0, 1, 1, 1);

    // Akenine-Möller 2001, axis class 1, the box's face normals, worked by hand against the unit cube [0,1]³:
    // the triangle (1.5,0,0) (2,1,0) (1.5,0,1) has x in [1.5, 2] and the cube x in [0, 1]: disjoint on the x axis,
    // which is tested first.
    [Fact]
    public void A_triangle_beside_the_box_is_separated_by_a_box_face_normal()
    {
        AgainstUnitCube([1.5, 0, 0, 2, 1, 0, 1.5, 0, 1]).Should().Be(TriangleAxes.Separation.BoxFace);
    }

    // Class 2, the triangle's normal, by hand: (3.2,0,0) (0,3.2,0) (0,0,3.2) has a bounding box [0, 3.2]³ that overlaps
    // the cube on every face axis, normal (1,1,1) scaled; the triangle projects to 3.2 on (1,1,1), the cube to
    // [0, 3] (corner sums 0..3): 3.2 > 3, disjoint.
    [Fact]
    public void A_triangle_past_the_box_corner_is_separated_by_its_normal()
    {
        AgainstUnitCube([3.2, 0, 0, 0, 3.2, 0, 0, 0, 3.2]).Should().Be(TriangleAxes.Separation.TriangleNormal);
    }

    // Class 3, an edge × box-axis cross product, by hand: A (2.5,0,0.5), B (0,2.5,0.5), C (3,3,2.25) lie in the
    // plane x + y − 2z = 1.5. Face axes: the bounding box [0,3]×[0,3]×[0.5,2.25] overlaps [0,1]³. Normal (1,1,−2):
    // the triangle projects to 1.5 at every corner, the cube to [−2, 2], overlapping. Edge AB = (−2.5, 2.5, 0) crossed
    // with ẑ gives (2.5, 2.5, 0): the triangle projects to [6.25, 15], the cube to [0, 5]: disjoint.
    [Fact]
    public void A_triangle_beside_a_box_edge_is_separated_by_an_edge_cross_product()
    {
        AgainstUnitCube([2.5, 0, 0.5, 0, 2.5, 0.5, 3, 3, 2.25]).Should().Be(TriangleAxes.Separation.EdgeCross);
    }

    [Fact]
    public void A_triangle_through_the_box_overlaps_it()
    {
        AgainstUnitCube([-1, 0.5, -1, 2, 0.5, -1, 0.5, 0.5, 2]).Should().Be(TriangleAxes.Separation.None);
    }

    // The closed-cube rule: a triangle lying in the plane x = 5 touches the cubes of voxels 4 and 5 and no others.
    [Theory]
    [InlineData(0)]
    [InlineData(1)]
    [InlineData(2)]
    public void A_triangle_on_a_voxel_face_overlaps_the_voxels_on_both_sides(int rowAxis)
    {
        TriangleAxes t = Axes([5, 0.2, 0.2, 5, 0.8, 0.3, 5, 0.4, 0.9], rowAxis);
        for (int x = 2; x <= 7; x++)
        {
            int[] w = [x, 0, 0];
            bool overlaps = t.OverlapsVoxel(w[rowAxis], w[(rowAxis + 1) % 3], w[(rowAxis + 2) % 3]);
            overlaps.Should().Be(x is 4 or 5, $"voxel x = {x}");
        }
    }

    // Independent exact method: clip the triangle by the six closed half-spaces of the box with Sutherland and
    // Hodgman's reentrant polygon clipping ("Reentrant Polygon Clipping", CACM 17(1), 1974); a non-empty polygon
    // means overlap. Seeded random triangles around the unit cube, in every row-axis frame.
    [Fact]
    public void Random_triangles_agree_with_Sutherland_Hodgman_clipping()
    {
        var rng = new Random(2001);
        int overlaps = 0;
        for (int n = 0; n < 20000; n++)
        {
            double spread = n % 4 == 0 ? 6 : 1.5;
            var t = new double[9];
            for (int i = 0; i < 9; i++)
                t[i] = 0.5 + (rng.NextDouble() * 2 - 1) * spread;
            bool expected = ClipsToNonEmpty(t, [0, 0, 0], [1, 1, 1]);
            overlaps += expected ? 1 : 0;
            for (int k = 0; k < 3; k++)
                Axes(t, k).OverlapsVoxel(0, 0, 0).Should().Be(expected, $"case {n}, row axis {k}: {string.Join(", ", t)}");
            (Axes(t).Separate(0, 0, 0, 1, 1, 1) == TriangleAxes.Separation.None).Should().Be(expected, $"case {n}");
        }
        overlaps.Should().BeInRange(3000, 17000, "the sample must hold both answers in number");
    }

    // A voxel's run along the row axis is exactly the voxels OverlapsVoxel accepts, in every frame.
    [Fact]
    public void Row_spans_hold_exactly_the_overlapping_voxels()
    {
        var rng = new Random(77);
        for (int n = 0; n < 400; n++)
        {
            var t = new double[9];
            double scale = n % 3 == 0 ? 12 : 3;
            for (int i = 0; i < 9; i++)
                t[i] = n % 5 == 0 ? Math.Round(rng.NextDouble() * scale * 2) / 2 : rng.NextDouble() * scale;
            for (int k = 0; k < 3; k++)
            {
                TriangleAxes axes = Axes(t, k);
                for (int w = -2; w < scale + 2; w++)
                {
                    for (int v = -2; v < scale + 2; v++)
                    {
                        int lo = -3, hi = (int)scale + 3;
                        bool any = axes.RowSpan(v, w, ref lo, ref hi);
                        for (int u = -3; u <= scale + 3; u++)
                            axes.OverlapsVoxel(u, v, w).Should().Be(any && u >= lo && u <= hi, $"case {n} frame {k} voxel ({u},{v},{w})");
                    }
                }
            }
        }
    }

    // The padded region test never says "apart" when a voxel of the region overlaps.
    [Fact]
    public void The_padded_box_test_is_conservative_for_every_voxel_in_the_box()
    {
        var rng = new Random(5);
        for (int n = 0; n < 3000; n++)
        {
            var t = new double[9];
            for (int i = 0; i < 9; i++)
                t[i] = n % 2 == 0 ? rng.Next(0, 9) : rng.NextDouble() * 8;
            TriangleAxes axes = Axes(t);
            int x0 = rng.Next(0, 7), y0 = rng.Next(0, 7), z0 = rng.Next(0, 7);
            int x1 = x0 + rng.Next(1, 3), y1 = y0 + rng.Next(1, 3), z1 = z0 + rng.Next(1, 3);
            if (axes.TouchesBox(x0, y0, z0, x1, y1, z1, 1e-3))
                continue;
            int k = axes.RowAxis;
            for (int z = z0; z < z1; z++)
                for (int y = y0; y < y1; y++)
                    for (int x = x0; x < x1; x++)
                    {
                        int[] p = [x, y, z];
                        axes.OverlapsVoxel(p[k], p[(k + 1) % 3], p[(k + 2) % 3]).Should().BeFalse($"case {n}");
                    }
        }
    }

    private static bool ClipsToNonEmpty(double[] t, double[] lo, double[] hi)
    {
        var polygon = new List<double[]> { t[0..3], t[3..6], t[6..9] };
        for (int axis = 0; axis < 3 && polygon.Count > 0; axis++)
        {
            polygon = Clip(polygon, axis, lo[axis], keepAbove: true);
            polygon = Clip(polygon, axis, hi[axis], keepAbove: false);
        }
        return polygon.Count > 0;
    }

    private static List<double[]> Clip(List<double[]> polygon, int axis, double bound, bool keepAbove)
    {
        var output = new List<double[]>();
        bool Inside(double[] p) => keepAbove ? p[axis] >= bound : p[axis] <= bound;
        for (int i = 0; i < polygon.Count; i++)
        {
            double[] s = polygon[(i + polygon.Count - 1) % polygon.Count], e = polygon[i];
            if (Inside(e))
            {
                if (!Inside(s))
                    output.Add(Intersect(s, e, axis, bound));
                output.Add(e);
            }
            else if (Inside(s))
            {
                output.Add(Intersect(s, e, axis, bound));
            }
        }
        return output;
    }

    private static double[] Intersect(double[] s, double[] e, int axis, double bound)
    {
        double f = (bound - s[axis]) / (e[axis] - s[axis]);
        var p = new double[3];
        for (int a = 0; a < 3; a++)
            p[a] = s[a] + f * (e[a] - s[a]);
        p[axis] = bound;
        return p;
    }
}
