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

    /// <summary>
    /// Unions add mostly lines already there, through the direct look among a few members; a set that outgrows those
    /// moves to the table, and either way of adding may follow the other.
    /// </summary>
    [Theory]
    [InlineData(11)]
    [InlineData(12)]
    [InlineData(13)]
    public void Adding_repeated_lines_keeps_the_same_members_in_the_same_order_below_and_past_the_few_it_looks_through(int seed)
    {
        var rng = new Random(seed);
        var set = new LineSet();
        int[] sizes = [1, 8, LineSet.SmallLimit - 1, LineSet.SmallLimit, LineSet.SmallLimit + 1, 40, 700];
        for (int round = 0; round < 60; round++)
        {
            set.Clear();
            var reference = new List<int>();
            int universe = sizes[round % sizes.Length];
            int n = rng.Next(0, 12 * universe + 2);
            int mix = round % 3; // 0: repeated only, 1: hashed then repeated, 2: alternating at random
            for (int i = 0; i < n; i++)
            {
                // Line numbers that differ by a multiple of the table's size land in one slot, and 0 is a line too.
                int line = rng.Next(universe) * 1024;
                bool repeated = mix switch { 0 => true, 1 => i >= n / 2, _ => rng.Next(2) == 0 };
                if (repeated)
                    set.AddRepeated(line);
                else
                    set.Add(line);
                if (!reference.Contains(line))
                    reference.Add(line);
                set.Count.Should().Be(reference.Count, $"round {round}, add {i}");
            }
            set.Members.ToArray().Should().Equal(reference, $"round {round}");
        }
    }
}
