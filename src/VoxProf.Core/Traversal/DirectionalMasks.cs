using System.Collections.Concurrent;

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

    public static ulong[] For(int branching) => Tables.GetOrAdd(branching, Build);

    public static ulong[] Build(int branching)
    {
        if (branching is not (2 or 4))
            throw new ArgumentOutOfRangeException(nameof(branching), "one 64-bit mask holds at most 4×4×4 cells");
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
