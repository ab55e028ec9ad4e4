using FluentAssertions;
using VoxProf.Core.Traversal;
using Xunit;

namespace VoxProf.Tests.Traversal;

public sealed class TimedSplitTests
{
    [Fact]
    public void The_wall_time_is_shared_in_proportion_to_the_tiles_time_in_each()
    {
        (TimeSpan tracing, TimeSpan model) = TimedSplit.Split(TimeSpan.FromSeconds(2), tracing: 300, model: 100);
        tracing.Should().Be(TimeSpan.FromSeconds(1.5));
        model.Should().Be(TimeSpan.FromSeconds(0.5));
    }

    [Fact]
    public void The_two_shares_add_up_to_the_wall_time_exactly()
    {
        TimeSpan wall = TimeSpan.FromTicks(1_000_003);
        (TimeSpan tracing, TimeSpan model) = TimedSplit.Split(wall, tracing: 7, model: 3);
        (tracing + model).Should().Be(wall);
        model.Ticks.Should().Be(300_001);
    }

    [Fact]
    public void Without_the_model_all_of_it_is_tracing()
    {
        TimedSplit.Split(TimeSpan.FromSeconds(1), 0, 0).Should().Be((TimeSpan.FromSeconds(1), TimeSpan.Zero));
        TimedSplit.Split(TimeSpan.FromSeconds(1), 5, 0).Should().Be((TimeSpan.FromSeconds(1), TimeSpan.Zero));
    }
}
