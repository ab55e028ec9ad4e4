using System.Numerics;
using System.Runtime.CompilerServices;

namespace VoxProf.Core.Trees;

public sealed partial class CoarseOccupancy
{
    /// <summary>
    /// The level one below the finest dense grid (its parent level), kept only where it is partly occupied. Each
    /// parent cell is empty, full (stored solid, inside a solid ancestor, or a node whose N³ cells are all occupied) or
    /// partial (a node with some cells empty): a copy of the parent grid's undilated bits says occupied, a second
    /// bitset says partial, and each partial cell has one word, the occupancy mask of its node, found by rank (the
    /// count of partial cells before each 64-bit word of the bitset). Ground and solid interiors are full and cost no
    /// word. On the demo the dense grids stop at cells of 4 voxels; this level brings the coarse ray to single voxels
    /// near surfaces, where it stopped 4–8 voxels short. Only for N³ ≤ 64 (N = 2 or 4).
    /// </summary>
    private sealed class SparseLevel
    {
        private readonly ulong[] _occupied, _partial;
        private readonly uint[] _rank;
        private readonly ulong[] _words;
        private readonly ulong[] _axisMasks;
        private readonly int _sizeX, _sizeY, _sizeZ, _wordsPerRow, _log2N, _last;

        private SparseLevel(Level parent, ulong[] occupied, ulong[] partial, uint[] rank, ulong[] words, int log2N)
        {
            _occupied = occupied;
            _partial = partial;
            _rank = rank;
            _words = words;
            _sizeX = parent.SizeX;
            _sizeY = parent.SizeY;
            _sizeZ = parent.SizeZ;
            _wordsPerRow = parent.WordsPerRow;
            _log2N = log2N;
            _last = (1 << log2N) - 1;
            _axisMasks = AxisMasks(log2N);
        }

        /// <summary>Partial cells, each with a word.</summary>
        public int Words => _words.Length;

        public long Bytes => (2L * _occupied.Length + _words.Length + _axisMasks.Length) * sizeof(ulong) + (long)_rank.Length * sizeof(uint);

        /// <summary>
        /// Builds the level below <paramref name="parent"/> (tree level <paramref name="parentLevel"/>, marked and not
        /// yet dilated), or null when N³ &gt; 64 or it would take more than <paramref name="wordBudget"/> words.
        /// </summary>
        public static SparseLevel? Build(BrickTree tree, Level parent, int parentLevel, long wordBudget)
        {
            if (tree.Log2Branching * 3 > 6)
                return null;
            var found = new List<(long Cell, ulong Word)>();
            if (!Collect(tree, parent, found, wordBudget, 0, 0, parentLevel, 0, 0, 0))
                return null;
            ulong[] occupied = (ulong[])parent.Bits.Clone();
            var partial = new ulong[occupied.Length];
            foreach (var (cell, _) in found)
                partial[cell >> 6] |= 1UL << (int)(cell & 63);
            var rank = new uint[partial.Length];
            uint count = 0;
            for (int i = 0; i < partial.Length; i++)
            {
                rank[i] = count;
                count += (uint)BitOperations.PopCount(partial[i]);
            }
            var words = new ulong[count];
            foreach (var (cell, word) in found)
                words[rank[cell >> 6] + BitOperations.PopCount(partial[cell >> 6] & ((1UL << (int)(cell & 63)) - 1))] = word;
            return new SparseLevel(parent, occupied, partial, rank, words, tree.Log2Branching);
        }

        /// <summary>
        /// Finds every partial cell at the parent level, walking down from node <paramref name="index"/>: its bit index
        /// in the parent grid and its node's occupancy mask. False when there are more than <paramref name="budget"/>.
        /// </summary>
        private static bool Collect(BrickTree tree, Level parent, List<(long Cell, ulong Word)> found, long budget,
            int index, int level, int parentLevel, long ox, long oy, long oz)
        {
            Node node = tree.Nodes[index];
            int shift = tree.CellShift(level), log2N = tree.Log2Branching, last = tree.Branching - 1;
            ulong full = FullWord(log2N);
            for (ulong children = node.ChildMask; children != 0; children &= children - 1)
            {
                int bit = BitOperations.TrailingZeroCount(children);
                long x = ox + ((long)(bit & last) << shift), y = oy + ((long)((bit >> log2N) & last) << shift);
                long z = oz + ((long)(bit >> (2 * log2N)) << shift);
                int child = node.FirstChild + BrickTree.Rank(node.ChildMask, bit);
                if (level < parentLevel)
                {
                    if (!Collect(tree, parent, found, budget, child, level + 1, parentLevel, x, y, z))
                        return false;
                    continue;
                }
                // Grid cell c + 1 holds extent cell c; cells wholly outside the extent were not marked and stay empty.
                long gx = (x >> shift) + 1, gy = (y >> shift) + 1, gz = (z >> shift) + 1;
                ulong word = tree.Nodes[child].Occupancy;
                if (gx >= parent.SizeX - 1 || gy >= parent.SizeY - 1 || gz >= parent.SizeZ - 1 || word == full)
                    continue;
                if (found.Count >= budget)
                    return false;
                found.Add(((parent.Row((int)gy, (int)gz) << 6) + gx, word));
            }
            return true;
        }

        /// <summary>
        /// Whether some cell of the 3×3×3 block around cell (cx, cy, cz) of this level may be occupied. The block lies
        /// in at most two parent cells along each axis; each occupied one is tested with the bits of its word that fall
        /// in the block.
        /// </summary>
        [MethodImpl(MethodImplOptions.AggressiveOptimization)]
        public bool NeighbourhoodOccupied(long cx, long cy, long cz)
        {
            // Arithmetic shifts round towards -∞, as cell division must for the ring's negative cells.
            long px0 = (cx - 1) >> _log2N, px1 = (cx + 1) >> _log2N;
            long py0 = (cy - 1) >> _log2N, py1 = (cy + 1) >> _log2N;
            long pz0 = (cz - 1) >> _log2N, pz1 = (cz + 1) >> _log2N;
            for (long pz = pz0; pz <= pz1; pz++)
            {
                ulong gz = (ulong)(pz + 1);
                if (gz >= (ulong)_sizeZ)
                    continue;
                ulong zMask = Axis(2, cz - (pz << _log2N));
                for (long py = py0; py <= py1; py++)
                {
                    ulong gy = (ulong)(py + 1);
                    if (gy >= (ulong)_sizeY)
                        continue;
                    ulong yzMask = zMask & Axis(1, cy - (py << _log2N));
                    for (long px = px0; px <= px1; px++)
                    {
                        ulong gx = (ulong)(px + 1);
                        if (gx >= (ulong)_sizeX)
                            continue;
                        long w = (long)((gz * (ulong)_sizeY + gy) * (ulong)_wordsPerRow + (gx >> 6));
                        int b = (int)(gx & 63);
                        if (((_occupied[w] >> b) & 1) == 0)
                            continue;
                        ulong partial = _partial[w];
                        // A full cell holds the block's part in it: the block always has a cell in each parent it meets.
                        if (((partial >> b) & 1) == 0)
                            return true;
                        ulong cells = _words[_rank[w] + BitOperations.PopCount(partial & ((1UL << b) - 1))];
                        if ((cells & yzMask & Axis(0, cx - (px << _log2N))) != 0)
                            return true;
                    }
                }
            }
            return false;
        }

        /// <summary>The cells of a parent whose coordinate along <paramref name="axis"/> lies within one of
        /// <paramref name="local"/> (the block's middle, in the parent's cell units, possibly outside 0..N-1).</summary>
        private ulong Axis(int axis, long local)
        {
            int lo = (int)Math.Max(0, local - 1), hi = (int)Math.Min(_last, local + 1);
            return _axisMasks[(axis << (2 * _log2N)) + (lo << _log2N) + hi];
        }

        /// <summary>Per axis and range lo..hi of cell coordinates, the bits of the cells in that range (bit x + N·y + N²·z).</summary>
        private static ulong[] AxisMasks(int log2N)
        {
            int n = 1 << log2N;
            var masks = new ulong[3 * n * n];
            for (int axis = 0; axis < 3; axis++)
                for (int lo = 0; lo < n; lo++)
                    for (int hi = lo; hi < n; hi++)
                    {
                        ulong mask = 0;
                        for (int bit = 0; bit < n * n * n; bit++)
                        {
                            int c = (bit >> (axis * log2N)) & (n - 1);
                            if (c >= lo && c <= hi)
                                mask |= 1UL << bit;
                        }
                        masks[(axis << (2 * log2N)) + (lo << log2N) + hi] = mask;
                    }
            return masks;
        }

        private static ulong FullWord(int log2N) => 3 * log2N == 6 ? ulong.MaxValue : (1UL << (1 << (3 * log2N))) - 1;
    }
}
