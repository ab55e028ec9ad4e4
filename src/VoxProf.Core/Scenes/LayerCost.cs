using System.Globalization;
using VoxProf.Core.Geometry;

namespace VoxProf.Core.Scenes;

/// <summary>
/// What building one layer into a tree is expected to cost, reckoned from its parameters before any voxel is
/// evaluated, so a scene that would run for hours or exhaust memory is refused at once (docs/scene-format.md,
/// "Limits"). Figures are upper-bound estimates, not predictions: they need only be right within a small factor.
/// </summary>
/// <param name="Work">Voxel evaluations: the builder evaluates every voxel of each 16³ block a surface crosses, and
/// noise octaves are counted in the same unit (one octave of 2D noise ≈ 2 voxel tests, of 3D noise ≈ 9), so the
/// figure tracks time. About 5 ns of one core each on the machine in docs/performance.md.</param>
/// <param name="Surface">Voxels on the layer's boundary inside the extent: the tree's size follows it.</param>
/// <param name="DataBytes">Memory the layer allocates when the tree is built (a terrain's heights), beyond what
/// loading it already took.</param>
/// <param name="Basis">How the figure was reckoned, for the refusal message ("a surface of about 1.1e10 voxels").</param>
public readonly record struct LayerCost(double Work, double Surface, double DataBytes, string Basis)
{
    /// <summary>Side of the blocks the builder evaluates voxel by voxel where a surface crosses them.</summary>
    public const int DenseSide = Trees.Building.BuildPlan.MinDenseSide;

    public static LayerCost None { get; } = new(0, 0, 0, "nothing to build");

    /// <summary>A surface the builder crosses in dense blocks: each of its voxels costs a block side of evaluations.</summary>
    public static LayerCost OfSurface(double surface, string what = "a surface") =>
        new(surface * DenseSide, surface, 0, $"{what} of about {Figure(surface)} voxels");

    /// <summary>
    /// Area of the faces of <paramref name="box"/> that lie strictly inside <paramref name="extent"/>: a face on the
    /// extent's edge separates nothing the tree stores.
    /// </summary>
    public static double InnerFaceArea(in Box3i box, in Box3i extent)
    {
        if (box.IsEmpty)
            return 0;
        double x = box.SizeX, y = box.SizeY, z = box.SizeZ;
        double area = 0;
        area += (box.MinX > extent.MinX ? 1 : 0) * y * z + (box.MaxX < extent.MaxX ? 1 : 0) * y * z;
        area += (box.MinY > extent.MinY ? 1 : 0) * x * z + (box.MaxY < extent.MaxY ? 1 : 0) * x * z;
        area += (box.MinZ > extent.MinZ ? 1 : 0) * x * y + (box.MaxZ < extent.MaxZ ? 1 : 0) * x * y;
        return area;
    }

    /// <summary>"1.1e10" style: two significant digits, for messages.</summary>
    public static string Figure(double value) =>
        value < 1e6 ? Math.Round(value).ToString("N0", CultureInfo.InvariantCulture) : value.ToString("0.0e0", CultureInfo.InvariantCulture);
}
