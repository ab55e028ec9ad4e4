using System.Numerics;
using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes;
using VoxProf.Core.Scenes.Layers;

namespace VoxProf.Benchmarks;

/// <summary>A code-built stand-in with the demo's ingredients, for timing without a scene file.</summary>
public static class DemoLikeScene
{
    public static Scene Create()
    {
        var extent = new Box3i(0, 0, 0, 2048, 512, 2048);
        var layers = new List<Layer>
        {
            new TerrainLayer(LayerOp.Add, 1, new TerrainSettings(7, 5, 1.0 / 600, 140, 160), extent, extent),
            new SphereLayer(LayerOp.Carve, 0, 900, 200, 1100, 120, extent),
            new BoxLayer(LayerOp.Add, 3, new Box3i(1000, 150, 1000, 1040, 230, 1030), extent),
            new BoxLayer(LayerOp.Add, 3, new Box3i(1080, 150, 980, 1110, 210, 1020), extent),
        };
        var cameras = new List<CameraSpec>
        {
            new("street", new Vector3(1020, 260, 900), new Vector3(1300, 200, 1400), Vector3.UnitY, 60),
            new("overview", new Vector3(200, 480, 200), new Vector3(1024, 150, 1024), Vector3.UnitY, 60),
        };
        return new Scene(2048, 512, 2048, layers, cameras, "demo-like");
    }
}
