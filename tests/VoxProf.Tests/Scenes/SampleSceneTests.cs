using System.Security.Cryptography;
using VoxProf.Core.Scenes;
using VoxProf.Core.Scenes.Layers;

namespace VoxProf.Tests.Scenes;

public class SampleSceneTests
{
    private static readonly string Samples = Path.Combine(AppContext.BaseDirectory, "samples");

    public static TheoryData<string> SampleFiles()
    {
        var data = new TheoryData<string>();
        foreach (string f in Directory.GetFiles(Samples, "*" + SceneLoader.Extension).Order(StringComparer.Ordinal))
            data.Add(Path.GetFileName(f));
        return data;
    }

    [Fact]
    public void The_demo_and_four_stress_scenes_are_shipped()
    {
        Directory.GetFiles(Samples, "*" + SceneLoader.Extension).Select(Path.GetFileName).Should().BeEquivalentTo(
            "stonebrook-quarry.vpscene.json", "sheet-lattice.vpscene.json", "far-dust.vpscene.json",
            "hollow-shell.vpscene.json", "ring-post.vpscene.json");
    }

    [Theory]
    [MemberData(nameof(SampleFiles))]
    public void Every_sample_loads_with_cameras_looking_from_empty_space(string file)
    {
        Scene scene = SceneLoader.Load(Path.Combine(Samples, file));
        scene.Name.Should().Be(file[..^SceneLoader.Extension.Length]);
        scene.Cameras.Count.Should().BeInRange(2, 5);
        scene.Cameras.Select(c => c.Name).Should().OnlyHaveUniqueItems();
        scene.ContentHash.Should().MatchRegex("^[0-9a-f]{64}$");
        foreach (CameraSpec camera in scene.Cameras)
        {
            scene.EvaluateMaterial((int)MathF.Floor(camera.Eye.X), (int)MathF.Floor(camera.Eye.Y), (int)MathF.Floor(camera.Eye.Z))
                .Should().Be(0, $"camera {camera.Name} must not start inside solid voxels");
        }
    }

    [Theory]
    [MemberData(nameof(SampleFiles))]
    public void Stress_scenes_stay_small_and_the_demo_is_the_large_one(string file)
    {
        Scene scene = SceneLoader.Load(Path.Combine(Samples, file));
        if (scene.Name == "stonebrook-quarry")
        {
            (scene.ExtentX, scene.ExtentY, scene.ExtentZ).Should().Be((2048, 512, 2048));
            scene.Cameras[0].Name.Should().Be("main-street");
            scene.Description.Should().StartWith("Stonebrook");
            scene.Layers.Select(l => l.Kind).Should().Contain(["terrain", "caves", "scatter", "box", "cylinder", "sphere", "heightmap", "mesh"]);
            scene.Cameras.Select(c => c.Name).Should().StartWith(["main-street", "hill-overview", "horizon-graze"])
                .And.EndWith(["stone-bridge", "spoil-heaps"]);
        }
        else
        {
            Math.Max(scene.ExtentX, Math.Max(scene.ExtentY, scene.ExtentZ)).Should().BeLessThanOrEqualTo(256);
        }
    }

    [Theory]
    [InlineData("hollow-shell.vpscene.json")]
    [InlineData("ring-post.vpscene.json")]
    [InlineData("sheet-lattice.vpscene.json")]
    [InlineData("far-dust.vpscene.json")]
    public void Every_layer_of_the_small_samples_classifies_conservatively(string file)
    {
        Scene scene = SceneLoader.Load(Path.Combine(Samples, file));
        int seed = 100;
        foreach (Layer layer in scene.Layers)
        {
            LayerChecks.ClassifyIsConservative(layer, scene.Bounds, seed++, regions: 150, maxSize: 16);
            LayerChecks.FillAgreesWithContains(layer, scene.Bounds, seed++, regions: 20, maxSize: 24);
        }
    }

    [Fact]
    public void Content_hash_is_sha256_of_the_scene_file_then_each_raw_layers_file()
    {
        string path = Path.Combine(Samples, "ring-post.vpscene.json");
        Scene scene = SceneLoader.Load(path);
        byte[] raw = File.ReadAllBytes(Path.Combine(Samples, "ring-post.raw"));
        int rawLayers = scene.Layers.Count(l => l is RawLayer);
        rawLayers.Should().Be(3);
        // FIPS 180-4 SHA-256 as implemented by the .NET base library, over the same bytes in the same order.
        byte[] all = [.. File.ReadAllBytes(path), .. Enumerable.Repeat(raw, rawLayers).SelectMany(b => b)];
        scene.ContentHash.Should().Be(Convert.ToHexStringLower(SHA256.HashData(all)));
    }

    [Fact]
    public void The_ring_post_raw_file_puts_its_material_where_bytes_are_non_zero()
    {
        Scene scene = SceneLoader.Load(Path.Combine(Samples, "ring-post.vpscene.json"));
        byte[] raw = File.ReadAllBytes(Path.Combine(Samples, "ring-post.raw"));
        // First raw layer sits at origin (8, 4, 8) with material 8; the file is 24³, x fastest.
        int checkedSolid = 0;
        for (int z = 0; z < 24; z++)
            for (int y = 0; y < 24; y++)
                for (int x = 0; x < 24; x++)
                {
                    int gx = x + 8, gy = y + 4, gz = z + 8;
                    if (raw[(z * 24 + y) * 24 + x] != 0 && gx < 30 && gy >= 4)
                    {
                        scene.EvaluateMaterial(gx, gy, gz).Should().Be(8);
                        checkedSolid++;
                    }
                }
        checkedSolid.Should().BeGreaterThan(1000);
    }
}
