using System.Collections.Concurrent;
using VoxProf.Core.Trees;

namespace VoxProf.Core.Traversal;

/// <summary>
/// For each direction octant and each cell of an N×N×N node, the set of cells a ray starting in that cell can ever
/// reach: with every component's sign fixed, a ray only moves towards higher (or only lower) indices on each axis, so
/// the reachable cells are the cells on or beyond the start cell on every axis. Built once per branching factor.
/// Octant bit a is set when the reciprocal of axis a is negative (see <see cref="Rays.RaySetup.Octant"/>).
/// </summary>
public static class DirectionalMasks
{
    private static readonly ConcurrentDictionary<int, ulong[]> Tables = new();

    private static readonly Lazy<Mask512[]> WideTable = new(BuildWide);

    public static ulong[] For(int branching) => Tables.GetOrAdd(branching, Build);

    /// <summary>The 8³ table: 8 octants × 512 cells, each a 512-bit mask (256 KiB), built on first use.</summary>
    public static Mask512[] Wide => WideTable.Value;

    /// <summary>
    /// Builds the 8³ table. Cell q is reachable from c when it is on or beyond c on every axis; the reachable set is the
    /// product of three one-axis ranges, so each 64-bit word (one z slice) is either empty or the x × y rectangle.
    /// </summary>
    public static Mask512[] BuildWide()
    {
        var table = new Mask512[8 * 512];
        for (int octant = 0; octant < 8; octant++)
        {
            for (int c = 0; c < 512; c++)
            {
                int cx = c & 7, cy = (c >> 3) & 7, cz = c >> 6;
                ulong slice = 0;
                for (int q = 0; q < 64; q++)
                {
                    int qx = q & 7, qy = q >> 3;
                    bool okX = (octant & 1) == 0 ? qx >= cx : qx <= cx;
                    bool okY = (octant & 2) == 0 ? qy >= cy : qy <= cy;
                    if (okX && okY)
                        slice |= 1UL << q;
                }
                ref Mask512 mask = ref table[(octant << 9) + c];
                for (int z = 0; z < 8; z++)
                {
                    bool okZ = (octant & 4) == 0 ? z >= cz : z <= cz;
                    mask[z] = okZ ? slice : 0;
                }
            }
        }
        return table;
    }

    public static ulong[] Build(int branching)
    {
        if (branching is not (2 or 4))
            throw new ArgumentOutOfRangeException(nameof(branching), "one 64-bit mask holds at most 4×4×4 cells; 8×8×8 is the Wide table");
        int n = branching;
        int cells = n * n * n;
        var table = new ulong[8 * cells];
        for (int octant = 0; octant < 8; octant++)
        {
            for (int c = 0; c < cells; c++)
            {
                int cx = c % n, cy = c / n % n, cz = c / (n * n);
                ulong mask = 0;
                for (int q = 0; q < cells; q++)
                {
                    int qx = q % n, qy = q / n % n, qz = q / (n * n);
                    bool okX = (octant & 1) == 0 ? qx >= cx : qx <= cx;
                    bool okY = (octant & 2) == 0 ? qy >= cy : qy <= cy;
                    bool okZ = (octant & 4) == 0 ? qz >= cz : qz <= cz;
                    if (okX && okY && okZ)
                        mask |= 1UL << q;
                }
                table[octant * cells + c] = mask;
            }
        }
        return table;
    }
}
