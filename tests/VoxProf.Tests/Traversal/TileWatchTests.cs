using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;

namespace VoxProf.Tests.Traversal;

/// <summary>The tracer's record of tiles in flight, read from another thread to tell a hung strategy from a slow one.</summary>
public sealed class TileWatchTests
{
    // A 40×20 image: tiles 0..2 on the first row of 16-pixel tiles, 3..5 on the second (the last column and row cut short).
    private static readonly int[] Tiles = [0, 1, 2, 3, 4, 5];

    [Fact]
    public void A_tile_running_past_the_limit_is_reported_with_its_first_and_last_pixel_the_first_in_tile_order_of_several()
    {
        var watch = new TileWatch(TimeSpan.FromMilliseconds(1));
        long[] started = watch.Begin(BuiltInStrategies.Dda, Tiles, 40, 20);
        TileWatch.Mark(started, 5, running: true);
        TileWatch.Mark(started, 2, running: true);
        Thread.Sleep(20);

        TileStall? stall = watch.Check();

        stall.Should().NotBeNull();
        stall!.Strategy.Should().BeSameAs(BuiltInStrategies.Dda);
        (stall.X0, stall.Y0, stall.X1, stall.Y1).Should().Be((32, 0, 39, 15), "tile 2 is the third of the first row, cut at the image's right edge");
        stall.Elapsed.Should().BeGreaterThan(TimeSpan.FromMilliseconds(1));
        stall.Describe().Should().MatchRegex(@"^strategy 'dda' has traced the pixels \(32, 0\) to \(39, 15\) for \d+(\.\d)? s without finishing$");
    }

    [Fact]
    public void Finished_tiles_tiles_younger_than_the_limit_and_a_pass_that_ended_are_not_reported()
    {
        var watch = new TileWatch(TimeSpan.FromHours(1));
        long[] started = watch.Begin(BuiltInStrategies.Dda, Tiles, 40, 20);
        TileWatch.Mark(started, 1, running: true);
        watch.Check().Should().BeNull("an hour has not passed");

        var quick = new TileWatch(TimeSpan.FromMilliseconds(1));
        long[] marks = quick.Begin(BuiltInStrategies.Dda, Tiles, 40, 20);
        TileWatch.Mark(marks, 4, running: true);
        TileWatch.Mark(marks, 4, running: false);
        Thread.Sleep(20);
        quick.Check().Should().BeNull("the tile finished");

        TileWatch.Mark(marks, 3, running: true);
        quick.End();
        Thread.Sleep(20);
        quick.Check().Should().BeNull("the strategy's pass ended");
    }

    [Fact]
    public void A_limit_must_be_positive()
    {
        FluentActions.Invoking(() => new TileWatch(TimeSpan.Zero)).Should().Throw<ArgumentOutOfRangeException>();
    }
}
