using System.Text;
using VoxProf.Core.Scenes;
using VoxProf.Core.Scenes.Layers;
using VoxProf.Core.Scenes.Meshes;

namespace VoxProf.Tests.Scenes;

public class SampleFilesTests
{
    private static readonly string Samples = Path.Combine(AppContext.BaseDirectory, "samples");

    [Fact]
    public void The_demos_bridge_and_spoil_heaps_are_what_the_generator_writes()
    {
        byte[] obj = Encoding.ASCII.GetBytes(SampleGeometry.BridgeObj()), png = SampleGeometry.HeapsPng();
        if (Environment.GetEnvironmentVariable("VOXPROF_WRITE_SAMPLES") == "1")
        {
            string repo = AppContext.BaseDirectory;
            while (!File.Exists(Path.Combine(repo, "VoxProf.sln")))
                repo = Path.GetDirectoryName(repo)!;
            File.WriteAllBytes(Path.Combine(repo, "samples", SampleGeometry.BridgeFile), obj);
            File.WriteAllBytes(Path.Combine(repo, "samples", SampleGeometry.HeapsFile), png);
        }
        File.ReadAllBytes(Path.Combine(Samples, SampleGeometry.BridgeFile)).Should().Equal(obj);
        File.ReadAllBytes(Path.Combine(Samples, SampleGeometry.HeapsFile)).Should().Equal(png);
    }

    [Fact]
    public void The_bridge_is_one_closed_outward_solid()
    {
        var bridge = SampleGeometry.Bridge();
        MeshTopology.Analyse(bridge.Indices).Should().Be((InsideRule.Winding, 0L));
        // The arch-pierced block (30 × 18 × 6 m less the half disc and the gaps beside the piers' feet) plus parapets.
        double expected = 6 * (30 * 16 - Math.PI * 9.5 * 9.5 / 2 * Math.Sin(Math.PI / 32) / (Math.PI / 32)) + 6 * 2 * 11 + 2 * 0.5 * 1.2 * 30;
        bridge.SignedVolume().Should().BeApproximately(expected, 1e-6);
    }

    [Fact]
    public void The_demos_file_layers_load_and_classify_conservatively()
    {
        Scene scene = SceneLoader.Load(Path.Combine(Samples, "stonebrook-quarry.vpscene.json"));
        var bridge = scene.Layers.OfType<MeshLayer>().Single();
        (bridge.File, bridge.Rule, bridge.TriangleCount).Should().Be((SampleGeometry.BridgeFile, InsideRule.Winding, SampleGeometry.Bridge().TriangleCount));
        var heaps = scene.Layers.OfType<HeightmapLayer>().Single();
        (heaps.Width, heaps.Depth, heaps.CellSize).Should().Be((128, 80, 2));
        int seed = 40;
        foreach (Layer layer in (Layer[])[bridge, heaps])
        {
            LayerChecks.ClassifyIsConservative(layer, layer.Bounds, seed++, regions: 150, maxSize: 16);
            LayerChecks.FillAgreesWithContains(layer, layer.Bounds, seed++, regions: 20, maxSize: 20);
        }
        // The arch's crown leaves the haul road open beneath it; the deck above is solid.
        scene.EvaluateMaterial(990, 150, 1250).Should().Be(0);
        scene.EvaluateMaterial(990, 180, 1250).Should().Be(bridge.Material);
    }
}
