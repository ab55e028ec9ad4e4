using FluentAssertions;
using VoxProf.Core.Memory;
using Xunit;

namespace VoxProf.Tests.Memory;

public sealed class LineSetTests
{
    [Fact]
    public void The_set_holds_what_a_hash_set_does_in_first_added_order_through_growth_and_clearing()
    {
        var rng = new Random(5);
        var set = new LineSet();
        for (int round = 0; round < 30; round++)
        {
            set.Clear();
            var reference = new List<int>();
            int n = rng.Next(0, round % 3 == 0 ? 5000 : 200);
            int universe = rng.Next(1, 4000);
            for (int i = 0; i < n; i++)
            {
                int line = rng.Next(universe) * (round % 2 == 0 ? 1 : 64);
                set.Add(line);
                if (!reference.Contains(line))
                    reference.Add(line);
            }
            set.Members.ToArray().Should().Equal(reference, $"round {round}");
            set.Count.Should().Be(reference.Count);
        }
    }
}
