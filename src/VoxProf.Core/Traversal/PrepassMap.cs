using System.Numerics;
using VoxProf.Core.Rays;

namespace VoxProf.Core.Traversal;

/// <summary>The prepass result for one image: a start distance and the coarse ray's iterations per K×K block.</summary>
public sealed class PrepassMap
{
    private readonly double[] _start;
    private readonly uint[] _iterations;

    private PrepassMap(int block, int blocksX, int blocksY, double[] start, uint[] iterations)
    {
        Block = block;
        BlocksX = blocksX;
        BlocksY = blocksY;
        _start = start;
        _iterations = iterations;
    }

    public int Block { get; }
    public int BlocksX { get; }
    public int BlocksY { get; }

    /// <summary>Distance at which every pixel ray of the block containing (x, y) may start (+∞: it meets nothing).</summary>
    public double Start(int x, int y) => _start[y / Block * BlocksX + x / Block];

    /// <summary>
    /// This pixel's share of its block's coarse-ray iterations: an even split whose remainder goes to the first pixels
    /// of the block in row-major order, so the shares add up exactly to the coarse ray's count.
    /// </summary>
    public uint Share(int x, int y, int width, int height)
    {
        int bx = x / Block, by = y / Block;
        int x0 = bx * Block, y0 = by * Block;
        int w = Math.Min(width, x0 + Block) - x0, h = Math.Min(height, y0 + Block) - y0;
        uint total = _iterations[by * BlocksX + bx];
        uint n = (uint)(w * h);
        uint index = (uint)((y - y0) * w + (x - x0));
        return total / n + (index < total % n ? 1u : 0u);
    }

    public static PrepassMap Compute(in TreeView view, Camera camera, int block, ParallelOptions options)
    {
        int blocksX = (camera.Width + block - 1) / block, blocksY = (camera.Height + block - 1) / block;
        var start = new double[blocksX * blocksY];
        var iterations = new uint[blocksX * blocksY];
        TreeView v = view;
        Parallel.For(0, blocksX * blocksY, options, i =>
        {
            int bx = i % blocksX, by = i / blocksX;
            int x0 = bx * block, y0 = by * block;
            int x1 = Math.Min(camera.Width, x0 + block), y1 = Math.Min(camera.Height, y0 + block);
            Vector3 axis = camera.Direction((x0 + x1) * 0.5f, (y0 + y1) * 0.5f);
            double slope = ConeSlope(camera, axis, x0, y0, x1 - 1, y1 - 1);
            var ray = new RaySetup(camera.Eye, axis);
            start[i] = ConePrepass.March(v, ray, slope, out iterations[i]);
        });
        return new PrepassMap(block, blocksX, blocksY, start, iterations);
    }

    /// <summary>
    /// tan of the widest angle between the coarse ray and any pixel ray of the block. Pixel directions lie in the image
    /// plane's rectangle, and the directions within an angle of the axis form a convex cone, so the corners bound it.
    /// </summary>
    private static double ConeSlope(Camera camera, Vector3 axis, int x0, int y0, int x1, int y1)
    {
        double cos = 1.0;
        cos = Math.Min(cos, Dot(axis, camera.Direction(x0, y0)));
        cos = Math.Min(cos, Dot(axis, camera.Direction(x1, y0)));
        cos = Math.Min(cos, Dot(axis, camera.Direction(x0, y1)));
        cos = Math.Min(cos, Dot(axis, camera.Direction(x1, y1)));
        // A margin covers the single-precision rounding of interior pixel directions.
        double angle = Math.Acos(Math.Clamp(cos, -1.0, 1.0)) + 1e-5;
        return Math.Tan(angle);
    }

    private static double Dot(Vector3 a, Vector3 b) => (double)a.X * b.X + (double)a.Y * b.Y + (double)a.Z * b.Z;
}
