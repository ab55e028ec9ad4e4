using System.Numerics;
using VoxProf.Core.Rays;
using VoxProf.Core.Trees;

namespace VoxProf.Core.Traversal;

/// <summary>
/// The prepass result for one image: per K×K block, a start distance and the coarse ray's work (iterations and grid
/// look-ups), which each pixel of the block is charged a share of.
/// </summary>
public sealed class PrepassMap
{
    private readonly double[] _start;
    private readonly uint[] _iterations;
    private readonly uint[] _lookups;
    private readonly int _log2Block, _width, _height;

    private PrepassMap(int block, int blocksX, int blocksY, int width, int height, double[] start, uint[] iterations, uint[] lookups)
    {
        Block = block;
        BlocksX = blocksX;
        BlocksY = blocksY;
        _log2Block = BitOperations.Log2((uint)block);
        _width = width;
        _height = height;
        _start = start;
        _iterations = iterations;
        _lookups = lookups;
    }

    public int Block { get; }
    public int BlocksX { get; }
    public int BlocksY { get; }

    // Per-pixel calls run for every pixel of a traced image: the block is a power of two, so shifts and masks replace
    // divisions (a handful of integer divisions per pixel cost more than the pixel's own walk saved).
    private int BlockOf(int x, int y) => (y >> _log2Block) * BlocksX + (x >> _log2Block);

    /// <summary>Distance at which every pixel ray of the block containing (x, y) may start (+∞: it meets nothing).</summary>
    public double Start(int x, int y) => _start[BlockOf(x, y)];

    /// <summary>Iterations of the coarse ray of the block containing (x, y).</summary>
    public uint BlockIterations(int x, int y) => _iterations[BlockOf(x, y)];

    /// <summary>Look-ups the coarse ray of the block containing (x, y) made in the coarse occupancy grids.</summary>
    public uint BlockNodeFetches(int x, int y) => _lookups[BlockOf(x, y)];

    /// <summary>
    /// This pixel's share of a block total: an even split whose remainder goes to the first pixels of the block in
    /// row-major order, so the shares add up exactly to the total. <paramref name="width"/> and
    /// <paramref name="height"/> are the image's, which the map was computed for.
    /// </summary>
    public uint Share(uint total, int x, int y, int width, int height)
    {
        if (width != _width || height != _height)
            throw new ArgumentException($"the map is of a {_width}x{_height} image, not {width}x{height}");
        int k = Block - 1;
        int x0 = x & ~k, y0 = y & ~k;
        int w = Math.Min(width - x0, Block), h = Math.Min(height - y0, Block);
        uint n = (uint)(w * h);
        uint index = (uint)((y & k) * w + (x & k));
        // Full blocks (all but the right and bottom edges) have n = K², a power of two.
        if (n == (uint)Block * (uint)Block)
        {
            int log2N = 2 * _log2Block;
            return (total >> log2N) + (index < (total & (n - 1)) ? 1u : 0u);
        }
        return total / n + (index < total % n ? 1u : 0u);
    }

    /// <summary>
    /// Writes each pixel's shares of its block's coarse-ray iterations and look-ups, split as <see cref="Share"/>
    /// splits them, for the image tile [x0, x1) × [y0, y1) into the tile's counts (<see cref="TileCounts"/>): a block
    /// at a time, where a pair of calls per pixel repeated the block's arithmetic and checks for each of its pixels. A
    /// tile starts on a multiple of its size, which every block size divides.
    /// </summary>
    internal void FillShares(Span<uint> tile, int x0, int y0, int x1, int y1)
    {
        if (((x0 | y0) & (Block - 1)) != 0 || x1 > _width || y1 > _height)
            throw new ArgumentException($"the tile at ({x0}, {y0}) does not start on a block of the map's {_width}x{_height} image");
        Span<uint> iterations = tile.Slice(TileCounts.Index((int)Counter.PrepassIterations, 0), TileCounts.Slots);
        Span<uint> lookups = tile.Slice(TileCounts.Index((int)Counter.PrepassNodeFetches, 0), TileCounts.Slots);
        for (int by = y0; by < y1; by += Block)
        {
            for (int bx = x0; bx < x1; bx += Block)
            {
                int b = BlockOf(bx, by);
                int w = Math.Min(_width - bx, Block), h = Math.Min(_height - by, Block);
                uint n = (uint)(w * h);
                uint iterationsEach = _iterations[b] / n, iterationsLeft = _iterations[b] % n;
                uint lookupsEach = _lookups[b] / n, lookupsLeft = _lookups[b] % n;
                for (int j = 0; j < h; j++)
                {
                    int slot = (by - y0 + j) * Tracer.TileSize + (bx - x0);
                    for (int i = 0; i < w; i++)
                    {
                        uint index = (uint)(j * w + i);
                        iterations[slot + i] = iterationsEach + (index < iterationsLeft ? 1u : 0u);
                        lookups[slot + i] = lookupsEach + (index < lookupsLeft ? 1u : 0u);
                    }
                }
            }
        }
    }

    /// <summary>
    /// Traces the coarse ray of every K×K block of <paramref name="camera"/>'s image (K = <paramref name="block"/>)
    /// through the tree's <see cref="BrickTree.Coarse"/> grids, built here on the tree's first prepass.
    /// </summary>
    public static PrepassMap Compute(BrickTree tree, Camera camera, int block, ParallelOptions options) =>
        Compute(tree.Coarse, camera, block, options);

    /// <summary>The same with other grids than the tree's own (tests build them under other budgets).</summary>
    internal static PrepassMap Compute(CoarseOccupancy grids, Camera camera, int block, ParallelOptions options)
    {
        if (block is not (2 or 4 or 8))
            throw new ArgumentOutOfRangeException(nameof(block), "the prepass block must be 2, 4 or 8");
        int blocksX = (camera.Width + block - 1) / block, blocksY = (camera.Height + block - 1) / block;
        var start = new double[blocksX * blocksY];
        var iterations = new uint[blocksX * blocksY];
        var lookups = new uint[blocksX * blocksY];
        Parallel.For(0, blocksX * blocksY, options, i =>
        {
            int bx = i % blocksX, by = i / blocksX;
            int x0 = bx * block, y0 = by * block;
            int x1 = Math.Min(camera.Width, x0 + block), y1 = Math.Min(camera.Height, y0 + block);
            Vector3 centre = camera.Direction((x0 + x1) * 0.5f, (y0 + y1) * 0.5f);
            double ax = centre.X, ay = centre.Y, az = centre.Z;
            double length = Math.Sqrt(ax * ax + ay * ay + az * az);
            ax /= length; ay /= length; az /= length;
            Cone(camera, ax, ay, az, x0, y0, x1, y1, out double slope, out double longest);
            var axis = new RaySetup(camera.Eye.X, camera.Eye.Y, camera.Eye.Z, ax, ay, az);
            double s = ConePrepass.March(grids, axis, slope, out iterations[i], out lookups[i]);
            // March measures distance along the unit axis; a pixel ray's parameter is distance over its own length,
            // which float normalisation leaves a few 1e-8 away from 1: the longest ray of the block reaches s first.
            start[i] = s / longest;
        });
        return new PrepassMap(block, blocksX, blocksY, camera.Width, camera.Height, start, iterations, lookups);
    }

    /// <summary>
    /// Allowance for the length of a pixel direction: a normalised float direction is unit to a few float ulps
    /// (2⁻²⁴ each), so every pixel's is below the longest corner's plus 2⁻²⁰.
    /// </summary>
    internal const double LengthAllowance = 1.0 / (1 << 20);

    /// <summary>
    /// tan of the widest angle between the unit axis a and the block's pixel rays, and the greatest length among those
    /// directions, each with an allowance for float rounding. Only the four corner pixels are evaluated (evaluating
    /// every pixel cost about a quarter of the prepass): before rounding, the block's directions are points of a
    /// rectangle on the image plane, and the points within a given angle of a form a convex cone, so no interior point
    /// lies farther off the axis than the farthest corner. A float direction is within
    /// <see cref="Camera.DirectionAngleError"/> of its exact point, so the widest corner angle plus twice that bounds
    /// every pixel's (docs/strategies.md). In double, the tangent |a×p| / (a·p) keeps its digits at any angle and does
    /// not depend on the length of p, where an angle from the arc cosine of a dot product near 1 loses most of them.
    /// +∞ when some pixel ray may be 90° or more off the axis.
    /// </summary>
    internal static void Cone(Camera camera, double ax, double ay, double az, int x0, int y0, int x1, int y1,
        out double slope, out double longest)
    {
        slope = 0;
        longest = 0;
        for (int corner = 0; corner < 4; corner++)
        {
            Vector3 p = camera.Direction((corner & 1) == 0 ? x0 : x1 - 1, (corner & 2) == 0 ? y0 : y1 - 1);
            double px = p.X, py = p.Y, pz = p.Z;
            double cx = ay * pz - az * py, cy = az * px - ax * pz, cz = ax * py - ay * px;
            double dot = ax * px + ay * py + az * pz;
            double tan = dot > 0 ? Math.Sqrt(cx * cx + cy * cy + cz * cz) / dot : double.PositiveInfinity;
            slope = Math.Max(slope, tan);
            longest = Math.Max(longest, Math.Sqrt(px * px + py * py + pz * pz));
        }
        double widest = Math.Atan(slope) + 2 * camera.DirectionAngleError;
        slope = widest < Math.PI / 2 ? Math.Tan(widest) : double.PositiveInfinity;
        longest += LengthAllowance;
    }
}
