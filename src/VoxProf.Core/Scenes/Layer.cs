using VoxProf.Core.Geometry;

namespace VoxProf.Core.Scenes;

/// <summary>Whether a layer adds solid voxels or carves them away.</summary>
public enum LayerOp
{
    Add,
    Carve,
}

/// <summary>How much of a region a layer's shape covers.</summary>
public enum Coverage
{
    /// <summary>No voxel of the region is inside the shape.</summary>
    None,
    /// <summary>Some voxels may be inside, some outside (the conservative answer).</summary>
    Partial,
    /// <summary>Every voxel of the region is inside the shape.</summary>
    Full,
}

/// <summary>
/// One step of a scene: a shape that adds (with a material) or carves voxels. Layers apply in order;
/// a voxel's final state is set by the last layer whose shape contains it.
/// A voxel is inside a shape when its centre (x + 0.5, y + 0.5, z + 0.5) is, unless a layer says otherwise.
/// </summary>
public abstract class Layer
{
    protected Layer(LayerOp op, byte material, Box3i bounds)
    {
        Op = op;
        Material = op == LayerOp.Carve ? (byte)0 : material;
        Bounds = bounds;
    }

    public LayerOp Op { get; }

    /// <summary>Material written by an add layer (1..255); 0 for a carve layer.</summary>
    public byte Material { get; }

    /// <summary>Every voxel inside the shape lies in this box (already clipped to the scene extent).</summary>
    public Box3i Bounds { get; }

    /// <summary>The optional <c>label</c> the scene file gives this layer, for listings.</summary>
    public string? Label { get; internal set; }

    /// <summary>The input file the layer was read from (<c>file</c> as written in the scene), for listings.</summary>
    public string? File { get; internal set; }

    /// <summary>Time spent reading and preparing the layer when the scene was loaded (files, bins, heights).</summary>
    public TimeSpan LoadTime { get; internal set; }

    /// <summary>A few words about what the layer holds (triangles, pixels, samples) for listings; null when nothing to add.</summary>
    public virtual string? Details => null;

    /// <summary>Short kind name as written in the scene file, for messages.</summary>
    public abstract string Kind { get; }

    /// <summary>
    /// Conservative classification: <see cref="Coverage.Full"/> only if every voxel of the region is inside,
    /// <see cref="Coverage.None"/> only if none is; <see cref="Coverage.Partial"/> is always a correct answer.
    /// Must be thread-safe and deterministic.
    /// </summary>
    public abstract Coverage Classify(in Box3i region);

    /// <summary>Exact inside test for one voxel. Must agree with <see cref="Fill"/>.</summary>
    public abstract bool Contains(int x, int y, int z);

    /// <summary>
    /// What building this layer into a tree inside <paramref name="extent"/> is expected to cost (see
    /// <see cref="LayerCost"/>). The default counts the faces of the layer's bounds as its surface; layers override it
    /// with their own shape.
    /// </summary>
    public virtual LayerCost Cost(in Box3i extent) => LayerCost.OfSurface(LayerCost.InnerFaceArea(Bounds, extent), "a bounding surface");

    /// <summary>
    /// Writes the inside test of every voxel of <paramref name="region"/> into <paramref name="inside"/>,
    /// x fastest, then y, then z. Layers override this where a whole block is cheaper than voxel by voxel
    /// (a heightfield evaluates each column once).
    /// </summary>
    public virtual void Fill(in Box3i region, Span<bool> inside)
    {
        int i = 0;
        for (int z = region.MinZ; z < region.MaxZ; z++)
            for (int y = region.MinY; y < region.MaxY; y++)
                for (int x = region.MinX; x < region.MaxX; x++)
                    inside[i++] = Contains(x, y, z);
    }
}
