using System.Runtime.CompilerServices;
using VoxProf.Core.Rays;
using VoxProf.Core.Trees;

namespace VoxProf.Core.Traversal;

/// <summary>
/// The prepass result for one image: per K×K block, a start distance for its pixel rays, and the coarse rays' work
/// each pixel is charged a share of. The coarse rays run level by level, from blocks of <see cref="TopBlock"/> pixels
/// down to K×K, each one starting where the ray of the block enclosing it stopped (docs/strategies.md): the long
/// approach through empty space is marched once per 32×32 pixels instead of once per K×K, and a pixel is charged its
/// share of every coarse ray that served it.
/// </summary>
public sealed class PrepassMap
{
    /// <summary>
    /// Side of the coarsest blocks. Marching blocks of 32, 16, 8 and then 4 pixels took a fifth to a third of the
    /// coarse-ray iterations per pixel that blocks of 4 alone took on the demo cameras; larger top blocks saved under 2%
    /// more (docs/performance.md).
    /// </summary>
    public const int TopBlock = 32;

    private readonly PrepassLevel[] _levels;
    private readonly PrepassLevel _finest;
    private readonly uint[] _blockIterations, _blockLookups;
    private readonly int _width, _height;

    private PrepassMap(int block, int width, int height, PrepassLevel[] levels)
    {
        Block = block;
        _width = width;
        _height = height;
        _levels = levels;
        _finest = levels[^1];
        _blockIterations = BlockTotals(levels, l => l.Iterations);
        _blockLookups = BlockTotals(levels, l => l.Lookups);
    }

    /// <summary>K: the side of the blocks whose pixel rays share a start distance.</summary>
    public int Block { get; }

    /// <summary>The levels of coarse rays, from blocks of <see cref="TopBlock"/> (or K, if larger) down to K.</summary>
    public IReadOnlyList<PrepassLevel> Levels => _levels;

    /// <summary>Distance at which every pixel ray of the K×K block containing (x, y) may start (+∞: it meets nothing).</summary>
    public double Start(int x, int y) => _finest.Starts[_finest.BlockOf(x, y)];

    /// <summary>
    /// The coarse-ray iterations charged to the K×K block containing pixel (x, y): its own coarse ray's, and its share
    /// of each enclosing block's (<see cref="BlockTotals"/>).
    /// </summary>
    public uint BlockIterations(int x, int y) => _blockIterations[_finest.BlockOf(x, y)];

    /// <summary>The coarse-ray look-ups charged to the K×K block containing pixel (x, y), as iterations are.</summary>
    public uint BlockNodeFetches(int x, int y) => _blockLookups[_finest.BlockOf(x, y)];

    /// <summary>Iterations of all the coarse rays.</summary>
    public long TotalIterations => _levels.Sum(l => l.Iterations.Sum(v => (long)v));

    /// <summary>Look-ups of all the coarse rays in the coarse occupancy grids.</summary>
    public long TotalLookups => _levels.Sum(l => l.Lookups.Sum(v => (long)v));

    /// <summary>
    /// This pixel's share of a total of its K×K block: an even split whose remainder goes one each to the first pixels
    /// of the block in row-major order, so the shares add up exactly to the total (the blocks at the image's right and
    /// bottom edges are cut short and split among the pixels they have).
    /// </summary>
    public uint Share(uint total, int x, int y) => _finest.Share(total, x, y);

    /// <summary>
    /// Writes each pixel's prepass counts for the image tile [x0, x1) × [y0, y1) into the tile's counts
    /// (<see cref="TileCounts"/>): its share of its block's <see cref="BlockIterations"/> and
    /// <see cref="BlockNodeFetches"/>, a block at a time; or the one pixel [x0, x0 + 1) × [y0, y0 + 1).
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal void FillShares(Span<uint> tile, int x0, int y0, int x1, int y1)
    {
        // A lone pixel (trace --pixel) need not start a block: its own share, as the block loop below gives it.
        if (x1 - x0 == 1 && y1 - y0 == 1 && x1 <= _width && y1 <= _height)
        {
            tile[TileCounts.Index((int)Counter.PrepassIterations, 0)] = Share(BlockIterations(x0, y0), x0, y0);
            tile[TileCounts.Index((int)Counter.PrepassNodeFetches, 0)] = Share(BlockNodeFetches(x0, y0), x0, y0);
            return;
        }
        if (((x0 | y0) & (Block - 1)) != 0 || x1 > _width || y1 > _height || x1 - x0 > Tracer.TileSize || y1 - y0 > Tracer.TileSize)
            throw new ArgumentException($"({x0}, {y0})-({x1}, {y1}) is not a tile of the map's {_width}x{_height} image");
        Span<uint> iterations = tile.Slice(TileCounts.Index((int)Counter.PrepassIterations, 0), TileCounts.Slots);
        Span<uint> lookups = tile.Slice(TileCounts.Index((int)Counter.PrepassNodeFetches, 0), TileCounts.Slots);
        for (int by = y0; by < y1; by += Block)
        {
            for (int bx = x0; bx < x1; bx += Block)
            {
                int b = _finest.BlockOf(bx, by);
                int w = Math.Min(_width - bx, Block), h = Math.Min(_height - by, Block);
                uint n = (uint)(w * h);
                uint iterationsEach = _blockIterations[b] / n, iterationsLeft = _blockIterations[b] % n;
                uint lookupsEach = _blockLookups[b] / n, lookupsLeft = _blockLookups[b] % n;
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
    /// The work charged to each K×K block: its own coarse ray's, plus, for each enclosing block, an even share of that
    /// block's coarse ray, split over the K×K blocks it encloses with the remainder one each to the first of them in
    /// row-major order. The totals add up exactly to every coarse ray's work, and a pixel is then charged its share of
    /// its block's total, as with a single level.
    /// </summary>
    private static uint[] BlockTotals(PrepassLevel[] levels, Func<PrepassLevel, uint[]> work)
    {
        PrepassLevel finest = levels[^1];
        uint[] totals = (uint[])work(finest).Clone();
        foreach (PrepassLevel level in levels[..^1])
        {
            uint[] own = work(level);
            int per = level.Block / finest.Block;
            for (int ey = 0; ey < level.BlocksY; ey++)
            {
                for (int ex = 0; ex < level.BlocksX; ex++)
                {
                    // The enclosing block's K×K blocks, cut short at the image's edges, in row-major order.
                    int across = Math.Min(finest.BlocksX - ex * per, per), down = Math.Min(finest.BlocksY - ey * per, per);
                    uint n = (uint)(across * down), total = own[ey * level.BlocksX + ex];
                    uint each = total / n, left = total % n, index = 0;
                    for (int j = 0; j < down; j++)
                    {
                        int row = (ey * per + j) * finest.BlocksX + ex * per;
                        for (int i = 0; i < across; i++, index++)
                            totals[row + i] += each + (index < left ? 1u : 0u);
                    }
                }
            }
        }
        return totals;
    }

    /// <summary>
    /// Traces the coarse rays of <paramref name="camera"/>'s image for K×K blocks (K = <paramref name="block"/>)
    /// through the tree's <see cref="BrickTree.Coarse"/> grids, built here on the tree's first prepass.
    /// </summary>
    public static PrepassMap Compute(BrickTree tree, Camera camera, int block, ParallelOptions options) =>
        Compute(tree.Coarse, camera, block, options);

    /// <summary>The same with other grids than the tree's own (tests build them under other budgets).</summary>
    internal static PrepassMap Compute(CoarseOccupancy grids, Camera camera, int block, ParallelOptions options)
    {
        if (block is not (2 or 4 or 8))
            throw new ArgumentOutOfRangeException(nameof(block), "the prepass block must be 2, 4 or 8");
        var levels = new List<PrepassLevel>();
        for (int size = Math.Max(block, TopBlock); size >= block; size /= 2)
            levels.Add(new PrepassLevel(size, camera.Width, camera.Height));
        PrepassLevel top = levels[0];
        // One work item per top block: its own coarse ray, then those of the blocks inside it, level by level (each
        // needs only its enclosing block's). Top blocks are independent, so any thread order gives the same map, and
        // no thread waits for a whole level to finish.
        Parallel.For(0, top.BlocksX * top.BlocksY, options, t =>
        {
            int tx = t % top.BlocksX, ty = t / top.BlocksX;
            March(grids, camera, top, null, t);
            for (int l = 1; l < levels.Count; l++)
            {
                PrepassLevel level = levels[l];
                int per = top.Block / level.Block;
                int xEnd = Math.Min(level.BlocksX, (tx + 1) * per), yEnd = Math.Min(level.BlocksY, (ty + 1) * per);
                for (int by = ty * per; by < yEnd; by++)
                    for (int bx = tx * per; bx < xEnd; bx++)
                        March(grids, camera, level, levels[l - 1], by * level.BlocksX + bx);
            }
        });
        return new PrepassMap(block, camera.Width, camera.Height, [.. levels]);
    }

    /// <summary>
    /// The coarse ray of block <paramref name="index"/> of <paramref name="level"/>. Every pixel ray of the block is
    /// empty before the enclosing block's start T (its pixels include them all); a point of such a ray at parameter t ≥ T
    /// lies at distance at least T·|p|·cos θ along this block's axis, θ the cone's half-angle, so the coarse ray starts
    /// there (less allowances for |p| and rounding), and the block's start is the later of T and its own. Its search for
    /// an empty grid level begins where the enclosing ray's next search would have.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void March(CoarseOccupancy grids, Camera camera, PrepassLevel level, PrepassLevel? enclosing, int index)
    {
        int block = level.Block;
        int x0 = index % level.BlocksX * block, y0 = index / level.BlocksX * block;
        int x1 = Math.Min(camera.Width, x0 + block), y1 = Math.Min(camera.Height, y0 + block);
        int parent = enclosing?.BlockOf(x0, y0) ?? 0;
        double before = enclosing is null ? 0 : enclosing.Starts[parent];
        int startLevel = enclosing is null ? 0 : enclosing.StartLevels[parent];
        if (double.IsPositiveInfinity(before))
        {
            // The enclosing cone never meets the volume, nor does any pixel ray of this block.
            level.Starts[index] = double.PositiveInfinity;
            return;
        }
        (double ax, double ay, double az) = camera.PlanePoint((x0 + x1) * 0.5, (y0 + y1) * 0.5);
        double length = Math.Sqrt(ax * ax + ay * ay + az * az);
        ax /= length; ay /= length; az /= length;
        double slope = Cone(camera, ax, ay, az, x0, y0, x1, y1);
        var axis = new RaySetup(camera.Eye.X, camera.Eye.Y, camera.Eye.Z, ax, ay, az);
        double from = before * (1 - FromAllowance) / Math.Sqrt(1 + slope * slope);
        double s = ConePrepass.March(grids, axis, slope, from, ref startLevel, out level.Iterations[index], out level.Lookups[index]);
        level.StartLevels[index] = (byte)startLevel;
        // March measures distance along the unit axis; a pixel ray's parameter is distance over its own length,
        // which float normalisation leaves a few 1e-8 away from 1: the longest ray of the block reaches s first.
        level.Starts[index] = Math.Max(before, s / LongestDirection);
    }

    /// <summary>
    /// Allowance on where a coarse ray starts after its enclosing block's: a pixel direction's length is 1 to a few
    /// float ulps (2⁻²⁴ each) and cos θ = 1 / √(1 + k²) is exact to a few double ulps; 2⁻¹⁸ covers both many times.
    /// </summary>
    private const double FromAllowance = 1.0 / (1 << 18);

    /// <summary>
    /// Allowance for the length of a pixel direction: a normalised float direction is unit to a few float ulps
    /// (2⁻²⁴ each), so no pixel's is longer than 1 + 2⁻²⁰.
    /// </summary>
    internal const double LengthAllowance = 1.0 / (1 << 20);

    /// <summary>A length no pixel direction exceeds: every block's pixel rays start at its coarse distance over this.</summary>
    internal const double LongestDirection = 1 + LengthAllowance;

    /// <summary>
    /// tan of the widest angle between the unit axis a and the block's pixel rays, with an allowance for float
    /// rounding. Only the block's four corners are evaluated, at
    /// the exact points of the image plane the corner pixels stand for (<see cref="Camera.PlanePoint"/>; evaluating
    /// every pixel's float direction cost about a quarter of the prepass): the block's exact points form a rectangle
    /// on the image plane, and the points within a given angle of a form a convex cone, so no interior point lies
    /// farther off the axis than the farthest corner. A float direction is within
    /// <see cref="Camera.DirectionAngleError"/> of its exact point, so the widest corner angle plus that bounds every
    /// pixel's; the cone is widened by twice as much (docs/strategies.md). In double, the tangent |a×p| / (a·p) keeps
    /// its digits at any angle and does not depend on the length of p, where an angle from the arc cosine of a dot
    /// product near 1 loses most of them. +∞ when some pixel ray may be 90° or more off the axis.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal static double Cone(Camera camera, double ax, double ay, double az, int x0, int y0, int x1, int y1)
    {
        // The largest tan² over the corners: one square root at the end instead of one per corner.
        double widest = 0;
        for (int corner = 0; corner < 4; corner++)
        {
            (double px, double py, double pz) = camera.PlanePoint(
                ((corner & 1) == 0 ? x0 : x1 - 1) + 0.5, ((corner & 2) == 0 ? y0 : y1 - 1) + 0.5);
            double cx = ay * pz - az * py, cy = az * px - ax * pz, cz = ax * py - ay * px;
            double dot = ax * px + ay * py + az * pz;
            widest = Math.Max(widest, dot > 0 ? (cx * cx + cy * cy + cz * cz) / (dot * dot) : double.PositiveInfinity);
        }
        double slope = Math.Sqrt(widest);
        // tan(α + ε) = (tan α + tan ε) / (1 − tan α · tan ε), below 90° while the denominator is positive: the same
        // widening as through the arc tangent and back, without two transcendental calls per coarse ray.
        double widen = camera.DirectionAngleWidening;
        double denominator = 1 - slope * widen;
        return denominator > 0 ? (slope + widen) / denominator : double.PositiveInfinity;
    }
}
