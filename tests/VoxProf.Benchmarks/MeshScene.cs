using System.Globalization;
using VoxProf.Tests.Scenes.Meshes;

namespace VoxProf.Benchmarks;

/// <summary>
/// `dotnet run -c Release --project tests/VoxProf.Benchmarks -- mesh-scene DIR [TRIANGLES]`: writes a tube around a
/// (2, 3) torus knot of about TRIANGLES triangles (default one million) as binary STL into DIR, with a scene that
/// voxelises its surface into a 2048³ extent. Time it with the `build` mode in a fresh process, so the peak memory is
/// the load and the build alone.
/// </summary>
public static class MeshScene
{
    public static string Write(string directory, int triangles, TextWriter output)
    {
        Directory.CreateDirectory(directory);
        const int Around = 100;
        int along = Math.Max(3, triangles / (2 * Around));
        MeshShapes.Mesh knot = MeshShapes.TorusKnot(1024, 1024, 1024, 600, 300, 90, 2, 3, along, Around);
        string stl = Path.Combine(directory, "knot.stl");
        using (var file = File.Create(stl))
            MeshShapes.WriteBinaryStl(file, knot, "VoxProf benchmark: torus knot tube");
        // A small scene of the same kind: `build` loads and builds it first, so the code is compiled and the runtime's
        // own memory is in the baseline before the large mesh is read.
        using (var file = File.Create(Path.Combine(directory, "warmup.stl")))
            MeshShapes.WriteBinaryStl(file, MeshShapes.TorusKnot(64, 64, 64, 30, 15, 5, 2, 3, 50, 10));
        File.WriteAllText(Path.Combine(directory, "knot.warmup.vpscene.json"), """
            {"extent": [128, 128, 128], "layers": [{"kind": "mesh", "material": 1, "file": "warmup.stl"}],
             "cameras": [{"name": "front", "eye": [64, 64, 1], "target": [64, 64, 64]}]}
            """);
        string scene = Path.Combine(directory, "knot.vpscene.json");
        File.WriteAllText(scene, """
            {
              "description": "Benchmark: the surface of a torus-knot tube of about a million triangles in a 2048-voxel cube.",
              "extent": [2048, 2048, 2048],
              "layers": [{"kind": "mesh", "label": "knot", "material": 1, "file": "knot.stl", "fill": "surface"}],
              "cameras": [{"name": "front", "eye": [1024, 1024, 1], "target": [1024, 1024, 1024]}]
            }
            """);
        output.WriteLine(string.Create(CultureInfo.InvariantCulture,
            $"wrote {scene} and {stl}: {knot.TriangleCount} triangles, {new FileInfo(stl).Length / 1048576.0:F1} MiB"));
        return scene;
    }
}
