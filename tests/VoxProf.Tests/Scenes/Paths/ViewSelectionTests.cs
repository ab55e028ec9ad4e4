using VoxProf.Core;
using VoxProf.Core.Scenes;
using VoxProf.Core.Scenes.Paths;

namespace VoxProf.Tests.Scenes.Paths;

public sealed class ViewSelectionTests
{
    private const string Cameras =
        "{'name': 'gate', 'eye': [1, 2, 3], 'target': [10, 2, 10]}," +
        "{'name': 'walk', 'path': {'frames': 5, 'interpolation': 'linear', 'keys': [{'eye': [2, 8, 2], 'target': [30, 8, 30]}, {'eye': [42, 8, 2], 'target': [30, 8, 40]}]}}," +
        "{'name': 'tower', 'eye': [60, 30, 60], 'target': [10, 2, 10]}";

    private static Scene Load(string cameras = Cameras)
    {
        using var file = TempScene.With("{'kind': 'box', 'material': 1, 'min': [0, 0, 0], 'max': [64, 4, 64]}", cameras);
        return SceneLoader.Load(file.Path);
    }

    [Fact]
    public void All_lists_cameras_and_every_frame_in_file_order()
    {
        ViewSelection.Resolve(Load(), "all").Select(v => v.Name).Should()
            .Equal("gate", "walk#000", "walk#001", "walk#002", "walk#003", "walk#004", "tower");
    }

    [Fact]
    public void A_list_names_cameras_paths_and_single_frames_without_repeats()
    {
        ViewSelection.Resolve(Load(), "tower, WALK#003,walk,gate").Select(v => v.Name).Should()
            .Equal("tower", "walk#003", "walk#000", "walk#001", "walk#002", "walk#004", "gate");
    }

    [Fact]
    public void Linear_path_frames_step_evenly_from_key_to_key()
    {
        var frames = ViewSelection.Resolve(Load(), "walk");

        frames.Select(f => f.Eye.X).Should().Equal(2, 12, 22, 32, 42);
        frames[2].Target.Should().Be(new System.Numerics.Vector3(30, 8, 35));
    }

    [Fact]
    public void The_default_is_the_first_entry_even_when_it_is_a_path()
    {
        ViewSelection.Default(Load()).Select(v => v.Name).Should().Equal("gate");
        string pathFirst = "{'name': 'walk', 'path': {'frames': 3, 'keys': [{'eye': [2, 8, 2], 'target': [30, 8, 30]}, {'eye': [42, 8, 2], 'target': [30, 8, 40]}]}}," +
            "{'name': 'gate', 'eye': [1, 2, 3], 'target': [10, 2, 10]}";
        ViewSelection.Default(Load(pathFirst)).Select(v => v.Name).Should().Equal("walk#000", "walk#001", "walk#002");
    }

    [Fact]
    public void An_unknown_name_lists_the_choices()
    {
        var act = () => ViewSelection.Resolve(Load(), "gate,roof");

        act.Should().Throw<InputException>().Which.Message.Should()
            .StartWith("--camera: no camera or path 'roof' in ").And.EndWith("expected one of: gate, walk, tower, a frame such as NAME#000, or all");
    }

    [Theory]
    [InlineData(7, 1)]
    [InlineData(7, 3)]
    [InlineData(120, 8)]
    [InlineData(2, 5)]
    public void Shards_split_the_views_into_disjoint_shares_that_cover_them(int views, int count)
    {
        var shares = Enumerable.Range(1, count).Select(i => ViewSelection.Shard(views, i, count)).ToArray();

        shares.SelectMany(s => s).Order().Should().Equal(Enumerable.Range(0, views));
        shares.Max(s => s.Count).Should().BeLessThanOrEqualTo(shares.Min(s => s.Count) + 1);
    }

    [Theory]
    [InlineData("'frames': 1, 'keys': [{'eye': [2, 8, 2], 'target': [30, 8, 30]}, {'eye': [42, 8, 2], 'target': [30, 8, 40]}]", "$.cameras[0].path.frames: expected a number of frames from 2 to 100000")]
    [InlineData("'frames': 4, 'keys': [{'eye': [2, 8, 2], 'target': [30, 8, 30]}]", "$.cameras[0].path.keys: holds 1 key; expected at least two")]
    [InlineData("'frames': 4, 'interpolation': 'cubic', 'keys': [{'eye': [2, 8, 2], 'target': [30, 8, 30]}, {'eye': [4, 8, 2], 'target': [30, 8, 30]}]", "$.cameras[0].path.interpolation: expected one of: \"linear\", \"catmull-rom\"")]
    [InlineData("'frames': 4, 'keys': [{'eye': [2, 8, 2], 'target': [2, 8, 2]}, {'eye': [4, 8, 2], 'target': [30, 8, 30]}]", "$.cameras[0].path.keys[0].target")]
    [InlineData("'frames': 4, 'keys': [{'eye': [2, 8, 2], 'target': [30, 8, 30], 'up': [0, 1, 0]}, {'eye': [4, 8, 2], 'target': [30, 8, 30]}]", "$.cameras[0].path.keys[0].up: unknown key")]
    public void A_bad_path_is_refused_naming_the_field(string path, string expected)
    {
        var act = () => Load($"{{'name': 'walk', 'path': {{{path}}}}}");

        act.Should().Throw<SceneFormatException>().Which.Message.Should().Contain(expected);
    }

    [Fact]
    public void A_camera_named_like_a_frame_is_refused()
    {
        var act = () => Load(Cameras + ",{'name': 'walk#002', 'eye': [1, 2, 3], 'target': [10, 2, 10]}");

        act.Should().Throw<SceneFormatException>().Which.Message.Should().Contain("has the name of a path's frame");
    }
}
