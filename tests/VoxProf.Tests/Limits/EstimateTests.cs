using VoxProf.Core.Geometry;
using VoxProf.Core.Limits;
using VoxProf.Core.Scenes;
using VoxProf.Core.Trees;
using VoxProf.Tests.Scenes;

namespace VoxProf.Tests.Limits;

/// <summary>
/// Resource bombs are refused at once with the layer and the estimate; ordinary scenes pass; the estimates stay
/// above what building really takes.
/// </summary>
public class EstimateTests
{
    private const string Camera = "{'name': 'a', 'eye': [1, 300, 1], 'target': [400, 10, 400]}";

    private static Scene Load(string layers, string extent)
    {
        using var scene = TempScene.With(layers, Camera, extent);
        return SceneLoader.Load(scene.Path);
    }

    private static LimitException Refuse(Scene scene) =>
        FluentActions.Invoking(() => BuildEstimate.Of(scene, 4).RequireWork(BuildEstimate.DefaultMaxWork))
            .Should().Throw<LimitException>().Which;

    [Fact]
    public void A_terrain_of_2_to_the_30_columns_with_16_octaves_is_refused_naming_the_layer_and_the_estimate()
    {
        var ex = Refuse(Load("{'kind': 'terrain', 'label': 'moor', 'material': 1, 'seed': 1, 'octaves': 16, 'frequency': 0.002, 'amplitude': 100, 'baseHeight': 100}", "[32768, 512, 32768]"));

        ex.Kind.Should().Be(LimitKind.Work);
        ex.Message.Should().Contain(": $.layers[0]: building the tree takes about 9.3e10 voxel evaluations for this terrain layer \"moor\" (1.1e9 columns × 16 octaves")
            .And.EndWith("over the work limit of 2.0e10");
    }

    [Fact]
    public void A_scatter_of_a_million_clumps_up_to_64_voxels_is_refused()
    {
        var ex = Refuse(Load("{'kind': 'scatter', 'material': 1, 'seed': 3, 'count': 1000000, 'size': [1, 64]}", "[65536, 65536, 65536]"));

        ex.Message.Should().Contain("this scatter layer (1.0e6 clumps with a surface of about 8.4e9 voxels)");
    }

    [Fact]
    public void Caves_over_a_65536_cubed_volume_are_refused()
    {
        var ex = Refuse(Load("{'kind': 'caves', 'material': 1, 'seed': 3, 'threshold': 0.1, 'frequency': 0.02}", "[65536, 65536, 65536]"));

        ex.Message.Should().Contain("this caves layer (a region of 2.8e14 voxels × 1 octave of 3D noise)");
    }

    [Fact]
    public void A_sphere_of_radius_30000_in_65536_cubed_is_refused()
    {
        var ex = Refuse(Load("{'kind': 'sphere', 'material': 1, 'center': [32768, 32768, 32768], 'radius': 30000}", "[65536, 65536, 65536]"));

        // 4π · 30000² ≈ 1.13e10 voxels of surface, each in dense blocks of 16.
        ex.Message.Should().Contain("about 1.8e11 voxel evaluations for this sphere layer (a sphere surface of about 1.1e10 voxels)");
    }

    [Fact]
    public void The_layer_that_costs_most_is_named_when_the_sum_is_over_the_limit()
    {
        var ex = Refuse(Load("{'kind': 'box', 'material': 1, 'min': [0, 0, 0], 'max': [10, 10, 10]}, {'kind': 'sphere', 'label': 'moon', 'material': 2, 'center': [32768, 32768, 32768], 'radius': 30000}", "[65536, 65536, 65536]"));

        ex.Message.Should().Contain(": $.layers[1]: building the tree takes about 1.8e11 voxel evaluations, 1.8e11 of them for this sphere layer \"moon\"");
    }

    [Theory]
    [InlineData("{'kind': 'box', 'material': 1, 'min': [0, 0, 0], 'max': [65536, 65536, 65536]}")]
    [InlineData("{'kind': 'sphere', 'material': 1, 'center': [32768, 32768, 32768], 'radius': 1e6}")]
    [InlineData("{'kind': 'caves', 'material': 1, 'seed': 3, 'threshold': -1, 'frequency': 0.02}")]
    public void A_layer_that_fills_or_leaves_the_whole_extent_costs_nothing_however_large(string layer)
    {
        BuildEstimate.Of(Load(layer, "[65536, 65536, 65536]"), 4).Work.Should().Be(0);
    }

    [Theory]
    [InlineData("stonebrook-quarry.vpscene.json")]
    [InlineData("hollow-shell.vpscene.json")]
    [InlineData("sheet-lattice.vpscene.json")]
    [InlineData("far-dust.vpscene.json")]
    [InlineData("ring-post.vpscene.json")]
    public void Sample_scenes_pass_the_default_limit_and_their_trees_stay_under_the_memory_estimate(string file)
    {
        Scene scene = SceneLoader.Load(Path.Combine(AppContext.BaseDirectory, "samples", file));
        var estimate = BuildEstimate.Of(scene, 4);

        estimate.Work.Should().BeLessThan(BuildEstimate.DefaultMaxWork / 10);
        BrickTree tree = TreeBuilder.Build(scene, 4);
        estimate.TreeBytes.Should().BeGreaterThan(tree.Stats.TotalBytes, "the estimate is an upper bound of the tree while it is built");
    }

    [Fact]
    public void The_grid_strategy_across_a_nearly_empty_65536_cubed_volume_is_refused()
    {
        Scene scene = Load("{'kind': 'box', 'material': 1, 'min': [0, 0, 0], 'max': [2, 2, 2]}", "[65536, 65536, 65536]");
        var camera = new CameraSpec("diagonal", new(1, 1, 1), new(65000, 60000, 65000), System.Numerics.Vector3.UnitY, 60);

        var ex = FluentActions.Invoking(() => TraceCost.RequireGridWork(scene, camera, 1280, 720, BuildEstimate.DefaultMaxWork))
            .Should().Throw<LimitException>().Which;

        ex.Message.Should().StartWith("strategy grid: tracing 1280×720 pixels through the 65536×65536×65536 extent from camera 'diagonal' takes up to 9.0e10 grid steps");
    }

    [Fact]
    public void The_grid_estimate_bounds_the_steps_a_straight_ray_takes_across_the_extent()
    {
        // One ray along +x from outside the extent crosses every one of its 100 cells (plus the entry cell).
        Scene scene = Load("", "[100, 8, 8]");
        var camera = new CameraSpec("along-x", new(-10, 4.2f, 4.3f), new(200, 4.2f, 4.3f), System.Numerics.Vector3.UnitY, 1);

        TraceCost.GridSteps(scene, camera, 1, 1).Should().BeApproximately(101, 0.5);
    }

    [Fact]
    public void A_16384_square_trace_that_cannot_fit_in_memory_is_refused_with_the_estimate_and_the_limit()
    {
        var parts = TraceCost.MemoryParts(16384, 16384, 5).ToList();
        var limit = new MemoryLimit(16L << 30, "MemAvailable in /proc/meminfo");

        var ex = FluentActions.Invoking(() => MemoryNeed.Require("tracing 16384×16384 with 5 strategies", parts, limit))
            .Should().Throw<LimitException>().Which;

        ex.Kind.Should().Be(LimitKind.Memory);
        // 16384² pixels × 5 strategies × (11 counters × 4 bytes + the hit record) bytes.
        long bytes = 16384L * 16384 * 5 * TraceCost.BytesPerPixel;
        ex.Message.Should().Be($"tracing 16384×16384 with 5 strategies needs about {MemoryLimit.Format(bytes)} of memory " +
            $"(results of 5 strategies at 16384×16384 ({TraceCost.BytesPerPixel} bytes per pixel each) {MemoryLimit.Format(bytes)}), " +
            "more than the 17.2 GB available (MemAvailable in /proc/meminfo)");
    }

    [Fact]
    public void The_memory_limit_is_read_from_the_machine_and_names_its_source()
    {
        MemoryLimit limit = MemoryLimit.Probe();

        limit.Bytes.Should().BePositive();
        limit.Source.Should().BeOneOf("MemAvailable in /proc/meminfo", "the runtime's memory limit (physical memory or the container's limit)");
    }

    [Fact]
    public void Inner_faces_exclude_the_faces_lying_on_the_extent_boundary()
    {
        var extent = new Box3i(0, 0, 0, 64, 64, 64);

        LayerCost.InnerFaceArea(new Box3i(0, 0, 0, 64, 4, 64), extent).Should().Be(64 * 64, "only the top face of a ground slab is inside");
        LayerCost.InnerFaceArea(new Box3i(8, 8, 8, 12, 12, 12), extent).Should().Be(6 * 16);
    }
}
