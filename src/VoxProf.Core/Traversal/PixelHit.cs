namespace VoxProf.Core.Traversal;

/// <summary>The face of the hit voxel through which the ray entered it.</summary>
public enum HitFace : byte
{
    /// <summary>No face: a miss, or the ray started inside the hit voxel (t = 0).</summary>
    None = 0,
    NegX = 1,
    PosX = 2,
    NegY = 3,
    PosY = 4,
    NegZ = 5,
    PosZ = 6,
}

/// <summary>What one pixel's ray hit. <see cref="Hit"/> false means a miss and the other fields are zero.</summary>
/// <remarks>
/// The double comes first so that the record packs into 24 bytes instead of 32: a trace writes one per pixel, and the
/// writes of a tile's rows are cache misses (docs/performance.md, "Fewer scattered writes per pixel").
/// </remarks>
public struct PixelHit
{
    /// <summary>
    /// Distance along the unit-length ray to the entry into the hit voxel, in voxels: the double the traversal computed
    /// (the plane time of the last crossing, or the start distance).
    /// </summary>
    public double T;
    public int X;
    public int Y;
    public int Z;
    public byte Material;
    public HitFace Face;
    public bool Hit;

    public readonly bool SameVoxel(in PixelHit other) =>
        Hit == other.Hit && (!Hit || (X == other.X && Y == other.Y && Z == other.Z));

    public static string FaceName(HitFace f) => f switch
    {
        HitFace.NegX => "-x",
        HitFace.PosX => "+x",
        HitFace.NegY => "-y",
        HitFace.PosY => "+y",
        HitFace.NegZ => "-z",
        HitFace.PosZ => "+z",
        _ => "inside",
    };
}
