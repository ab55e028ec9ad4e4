namespace VoxProf.Core.Geometry;

/// <summary>A half-open box of voxels: [Min, Max) on every axis.</summary>
public readonly record struct Box3i(int MinX, int MinY, int MinZ, int MaxX, int MaxY, int MaxZ)
{
    public static Box3i Empty => new(0, 0, 0, 0, 0, 0);

    public int SizeX => MaxX - MinX;
    public int SizeY => MaxY - MinY;
    public int SizeZ => MaxZ - MinZ;

    public bool IsEmpty => MaxX <= MinX || MaxY <= MinY || MaxZ <= MinZ;

    /// <summary>Voxel count; 64-bit because an 65,536-wide extent overflows 32 bits on its own.</summary>
    public long Volume => IsEmpty ? 0 : (long)SizeX * SizeY * SizeZ;

    public bool Contains(int x, int y, int z) =>
        x >= MinX && x < MaxX && y >= MinY && y < MaxY && z >= MinZ && z < MaxZ;

    public bool ContainsBox(in Box3i other) =>
        other.MinX >= MinX && other.MaxX <= MaxX &&
        other.MinY >= MinY && other.MaxY <= MaxY &&
        other.MinZ >= MinZ && other.MaxZ <= MaxZ;

    public bool Intersects(in Box3i other) =>
        other.MinX < MaxX && other.MaxX > MinX &&
        other.MinY < MaxY && other.MaxY > MinY &&
        other.MinZ < MaxZ && other.MaxZ > MinZ;

    public Box3i Intersect(in Box3i other)
    {
        var r = new Box3i(
            Math.Max(MinX, other.MinX), Math.Max(MinY, other.MinY), Math.Max(MinZ, other.MinZ),
            Math.Min(MaxX, other.MaxX), Math.Min(MaxY, other.MaxY), Math.Min(MaxZ, other.MaxZ));
        return r.IsEmpty ? Empty : r;
    }

    public static Box3i Cube(int x, int y, int z, int size) => new(x, y, z, x + size, y + size, z + size);

    public override string ToString() => $"[{MinX},{MinY},{MinZ})..[{MaxX},{MaxY},{MaxZ})";
}
