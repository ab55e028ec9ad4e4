using FluentAssertions;
using VoxProf.Core.Memory;
using Xunit;

namespace VoxProf.Tests.Memory;

public sealed class LruCacheTests
{
    private static string Outcomes(LruCache cache, params int[] lines) =>
        string.Concat(lines.Select(l => cache.Access(l) ? 'h' : 'm'));

    // Patterson & Hennessy, "Computer Organization and Design", section 5.4, example "Misses and Associativity in
    // Caches": three caches of four one-word blocks, block addresses 0, 8, 0, 6, 8. The direct-mapped answer (five
    // misses) was checked against a course page that reproduces the example (wenchen.cs.und.edu/course/370/16/5.html);
    // the other two answers are worked by hand here from the textbook definition of an LRU set-associative cache
    // (block b goes to set b mod sets; a miss in a full set evicts the block used longest ago):
    // - direct mapped, 4 sets × 1: 0→set 0 miss; 8→set 0 miss, evicts 0; 0 miss, evicts 8; 6→set 2 miss; 8 miss, evicts 0.
    // - two-way, 2 sets × 2: 0 miss; 8 miss (set 0 = {8, 0}); 0 hit (set 0 = {0, 8}); 6→set 0 miss, evicts 8 (least
    //   recent); 8 miss, evicts 0 (6 is more recent). 4 misses.
    // - fully associative, 1 set × 4: 0 miss, 8 miss, 0 hit, 6 miss, 8 hit. 3 misses.
    [Theory]
    [InlineData(4, 1, "mmmmm")]
    [InlineData(2, 2, "mmhmm")]
    [InlineData(1, 4, "mmhmh")]
    public void The_textbook_example_of_misses_and_associativity_comes_out_as_worked(int sets, int ways, string expected)
    {
        Outcomes(new LruCache(sets, ways), 0, 8, 0, 6, 8).Should().Be(expected);
    }

    // Patterson & Hennessy (3rd edition), exercises 7.1 and 7.2 of section 7.2: word addresses 1, 4, 8, 5, 20, 17, 19,
    // 56, 9, 11, 4, 43, 5, 6, 9, 17 through 16 one-word blocks, worked by hand from the same definition:
    // - direct mapped (block = address mod 16): 1, 4, 8, 5, 20 (evicts 4), 17 (evicts 1), 19, 56 (evicts 8), 9, 11,
    //   4 (evicts 20), 43 (evicts 11) all miss; 5 hits; 6 misses; 9 hits; 17 hits. 13 misses, 3 hits.
    // - fully associative with LRU: only 12 distinct addresses, fewer than 16 blocks, so nothing is evicted and every
    //   repeat hits: the second 4, 5, 9 and 17. 12 misses, 4 hits.
    private static readonly int[] Exercise = [1, 4, 8, 5, 20, 17, 19, 56, 9, 11, 4, 43, 5, 6, 9, 17];

    [Fact]
    public void The_textbook_exercise_through_a_direct_mapped_cache_hits_three_times()
    {
        Outcomes(new LruCache(16, 1), Exercise).Should().Be("mmmmmmmmmmmmhmhh");
    }

    [Fact]
    public void The_textbook_exercise_through_a_fully_associative_cache_hits_every_repeat()
    {
        Outcomes(new LruCache(1, 16), Exercise).Should().Be("mmmmmmmmmmhmhmhh");
    }

    /// <summary>The obvious LRU: one list per set, most recent first.</summary>
    private sealed class ListLru(int sets, int ways)
    {
        private readonly List<int>[] _sets = Enumerable.Range(0, sets).Select(_ => new List<int>()).ToArray();

        public bool Access(int line)
        {
            List<int> set = _sets[line % _sets.Length];
            bool hit = set.Remove(line);
            set.Insert(0, line);
            if (set.Count > ways)
                set.RemoveAt(set.Count - 1);
            return hit;
        }
    }

    [Theory]
    [InlineData(1, 1)]
    [InlineData(1, 4)]
    [InlineData(1, 16)]
    [InlineData(4, 2)]
    [InlineData(64, 4)]
    [InlineData(8, 8)]
    [InlineData(48, 4)] // not a power of two: the set index is a remainder, not a mask
    [InlineData(3, 2)]
    public void Every_access_agrees_with_a_brute_force_LRU_on_seeded_random_sequences(int sets, int ways)
    {
        for (int seed = 0; seed < 20; seed++)
        {
            var rng = new Random(seed);
            var cache = new LruCache(sets, ways);
            var reference = new ListLru(sets, ways);
            // Few distinct lines, so both hits and evictions are common; sometimes a long run of distinct ones.
            int universe = rng.Next(2, 3 * sets * ways + 2);
            for (int i = 0; i < 2000; i++)
            {
                int line = rng.Next(10) == 0 ? rng.Next(1_000_000) : rng.Next(universe);
                cache.Access(line).Should().Be(reference.Access(line), $"seed {seed}, access {i} of line {line}");
            }
        }
    }

    [Fact]
    public void Clearing_empties_every_set()
    {
        var cache = new LruCache(2, 2);
        Outcomes(cache, 1, 2, 1, 2).Should().Be("mmhh");
        cache.Clear();
        Outcomes(cache, 1, 2).Should().Be("mm");
    }
}
