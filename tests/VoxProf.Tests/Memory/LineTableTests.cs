using VoxProf.Core.Memory;

namespace VoxProf.Tests.Memory;

public sealed class LineTableTests
{
    /// <summary>
    /// Lines that land in one slot (multiples of the table's size), line 0, rereads and a table filled to its limit: the
    /// members are those of a plain list in first-added order, and a new line past the limit is refused, changing nothing.
    /// </summary>
    [Theory]
    [InlineData(21, 4)]
    [InlineData(22, 64)]
    [InlineData(23, 256)]
    public void The_table_holds_what_a_list_does_in_first_added_order_up_to_half_its_slots(int seed, int slotCount)
    {
        var rng = new Random(seed);
        for (int round = 0; round < 40; round++)
        {
            Span<int> slots = new int[slotCount];
            Span<int> members = new int[slotCount];
            var table = new LineTable(slots, members);
            var reference = new List<int>();
            int universe = 1 + rng.Next(slotCount);
            for (int i = 0; i < 4 * slotCount; i++)
            {
                int line = rng.Next(universe) * (round % 2 == 0 ? 1 : slotCount);
                bool known = reference.Contains(line);
                bool room = reference.Count < slotCount / 2;
                table.Add(line).Should().Be(known || room, $"round {round}, add {i} of {line}");
                if (!known && room)
                    reference.Add(line);
                table.Count.Should().Be(reference.Count);
            }
            members[..table.Count].ToArray().Should().Equal(reference, $"round {round}");
        }
    }
}
