using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes.Paths;

namespace VoxProf.Core.Scenes;

/// <summary>A parsed scene: its extent in voxels, its layers in order, and its named cameras.</summary>
public sealed class Scene
{
    public Scene(int extentX, int extentY, int extentZ, IReadOnlyList<Layer> layers, IReadOnlyList<CameraSpec> cameras,
        string name = "scene", string? sourcePath = null, string? contentHash = null)
    {
        ExtentX = extentX;
        ExtentY = extentY;
        ExtentZ = extentZ;
        Layers = layers;
        Cameras = cameras;
        Name = name;
        SourcePath = sourcePath;
        ContentHash = contentHash;
    }

    /// <summary>Largest extent accepted on any axis.</summary>
    public const int MaxExtent = 65536;

    public int ExtentX { get; }
    public int ExtentY { get; }
    public int ExtentZ { get; }
    public IReadOnlyList<Layer> Layers { get; }
    public IReadOnlyList<CameraSpec> Cameras { get; }

    /// <summary>The scene's camera paths, each a sequence of views (docs/scene-format.md, "Camera paths").</summary>
    public IReadOnlyList<CameraPath> Paths { get; init; } = [];

    /// <summary>Names of cameras and paths in the order the scene file lists them; empty for cameras, then paths.</summary>
    public IReadOnlyList<string> CameraOrder { get; init; } = [];

    /// <summary>Scene name (the file name without extension when loaded from a file).</summary>
    public string Name { get; }

    public string? SourcePath { get; }

    /// <summary>The scene file's optional free-text <c>description</c>.</summary>
    public string? Description { get; init; }

    /// <summary>Lower-case hex SHA-256 of the scene file's bytes (and of raw volume files it names), if loaded from disk.</summary>
    public string? ContentHash { get; }

    public Box3i Bounds => new(0, 0, 0, ExtentX, ExtentY, ExtentZ);

    /// <summary>Evaluates the layers directly at one voxel: the slow, obvious definition the tree must agree with.</summary>
    public byte EvaluateMaterial(int x, int y, int z)
    {
        if (!Bounds.Contains(x, y, z))
            return 0;
        byte m = 0;
        foreach (var layer in Layers)
        {
            if (layer.Bounds.Contains(x, y, z) && layer.Contains(x, y, z))
                m = layer.Material;
        }
        return m;
    }
}
