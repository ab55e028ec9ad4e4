using System.Numerics;
using VoxProf.Core.Rays;

namespace VoxProf.Core.Traversal;

/// <summary>
/// The prepass result for one image: per K×K block, a start distance and the coarse ray's work (iterations and node
/// records read), which each pixel of the block is charged a share of.
/// </summary>
public sealed class PrepassMap
{
    private readonly double[] _start;
    private readonly uint[] _iterations;
    private readonly uint[] _nodeFetches;

    private PrepassMap(int block, int blocksX, int blocksY, double[] start, uint[] iterations, uint[] nodeFetches)
    {
        Block = block;
        BlocksX = blocksX;
        BlocksY = blocksY;
        _start = start;
        _iterations = iterations;
        _nodeFetches = nodeFetches;
    }

    public int Block { get; }
    public int BlocksX { get; }
    public int BlocksY { get; }

    /// <summary>Distance at which every pixel ray of the block containing (x, y) may start (+∞: it meets nothing).</summary>
    public double Start(int x, int y) => _start[y / Block * BlocksX + x / Block];

    /// <summary>Iterations of the coarse ray of the block containing (x, y).</summary>
    public uint BlockIterations(int x, int y) => _iterations[y / Block * BlocksX + x / Block];

    /// <summary>Node records the coarse ray of the block containing (x, y) read in its neighbourhood look-ups.</summary>
    public uint BlockNodeFetches(int x, int y) => _nodeFetches[y / Block * BlocksX + x / Block];

    /// <summary>This pixel's share of its block's coarse-ray iterations (see <see cref="Share(uint, int, int, int, int)"/>).</summary>
    public uint IterationShare(int x, int y, int width, int height) => Share(BlockIterations(x, y), x, y, width, height);

    /// <summary>This pixel's share of the node records its block's coarse ray read, split as iterations are.</summary>
    public uint NodeFetchShare(int x, int y, int width, int height) => Share(BlockNodeFetches(x, y), x, y, width, height);

    /// <summary>
    /// This pixel's share of a block total: an even split whose remainder goes to the first pixels of the block in
    /// row-major order, so the shares add up exactly to the total.
    /// </summary>
    public uint Share(uint total, int x, int y, int width, int height)
    {
        int x0 = x / Block * Block, y0 = y / Block * Block;
        int w = Math.Min(width, x0 + Block) - x0, h = Math.Min(height, y0 + Block) - y0;
        uint n = (uint)(w * h);
        uint index = (uint)((y - y0) * w + (x - x0));
        return total / n + (index < total % n ? 1u : 0u);
    }

    public static PrepassMap Compute(in TreeView view, Camera camera, int block, ParallelOptions options)
    {
        int blocksX = (camera.Width + block - 1) / block, blocksY = (camera.Height + block - 1) / block;
        var start = new double[blocksX * blocksY];
        var iterations = new uint[blocksX * blocksY];
        var nodeFetches = new uint[blocksX * blocksY];
        TreeView v = view;
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
            double s = ConePrepass.March(v, axis, slope, out iterations[i], out nodeFetches[i]);
            // March measures distance along the unit axis; a pixel ray's parameter is distance over its own length,
            // which float normalisation leaves a few 1e-8 away from 1: the longest ray of the block reaches s first.
            start[i] = s / longest;
        });
        return new PrepassMap(block, blocksX, blocksY, start, iterations, nodeFetches);
    }

    /// <summary>
    /// tan of the widest angle between the unit axis a and the block's pixel rays, taken over every pixel ray exactly as
    /// the pixel traces it (the float direction), and the greatest length among those directions. In double, the
    /// tangent |a×p| / (a·p) keeps its digits at any angle and does not depend on the length of p, where an angle from
    /// the arc cosine of a dot product near 1 loses most of them. +∞ when some pixel ray is 90° or more off the axis.
    /// </summary>
    private static void Cone(Camera camera, double ax, double ay, double az, int x0, int y0, int x1, int y1,
        out double slope, out double longest)
    {
        slope = 0;
        longest = 0;
        for (int y = y0; y < y1; y++)
        {
            for (int x = x0; x < x1; x++)
            {
                Vector3 p = camera.Direction(x, y);
                double px = p.X, py = p.Y, pz = p.Z;
                double cx = ay * pz - az * py, cy = az * px - ax * pz, cz = ax * py - ay * px;
                double dot = ax * px + ay * py + az * pz;
                double tan = dot > 0 ? Math.Sqrt(cx * cx + cy * cy + cz * cz) / dot : double.PositiveInfinity;
                slope = Math.Max(slope, tan);
                longest = Math.Max(longest, Math.Sqrt(px * px + py * py + pz * pz));
            }
        }
    }
}
