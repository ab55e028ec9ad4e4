using System.Numerics;

namespace VoxProf.Core.Traversal;

/// <summary>
/// One level of the prepass: a coarse ray per B×B block of the image, its start distance for the block's pixel rays,
/// and its work (iterations and grid look-ups), charged to the K×K blocks it served (<see cref="PrepassMap"/>).
/// </summary>
public sealed class PrepassLevel
{
    private readonly int _log2Block, _width, _height;

    internal PrepassLevel(int block, int width, int height)
    {
        Block = block;
        _log2Block = BitOperations.Log2((uint)block);
        _width = width;
        _height = height;
        BlocksX = (width + block - 1) / block;
        BlocksY = (height + block - 1) / block;
        Starts = new double[BlocksX * BlocksY];
        Iterations = new uint[BlocksX * BlocksY];
        Lookups = new uint[BlocksX * BlocksY];
        StartLevels = new byte[BlocksX * BlocksY];
    }

    /// <summary>Block side B in pixels (a power of two).</summary>
    public int Block { get; }
    public int BlocksX { get; }
    public int BlocksY { get; }

    internal double[] Starts { get; }
    internal uint[] Iterations { get; }
    internal uint[] Lookups { get; }

    /// <summary>Per block, the grid level its coarse ray's next search would have started from.</summary>
    internal byte[] StartLevels { get; }

    // Per-pixel calls run for every pixel of a traced image: the block is a power of two, so shifts and masks replace
    // divisions (a handful of integer divisions per pixel cost more than the pixel's own walk saved).
    internal int BlockOf(int x, int y) => (y >> _log2Block) * BlocksX + (x >> _log2Block);

    /// <summary>Iterations of the coarse ray of the block containing pixel (x, y).</summary>
    public uint IterationsAt(int x, int y) => Iterations[BlockOf(x, y)];

    /// <summary>Look-ups in the coarse occupancy grids of the coarse ray of the block containing pixel (x, y).</summary>
    public uint LookupsAt(int x, int y) => Lookups[BlockOf(x, y)];

    /// <summary>
    /// Pixel (x, y)'s share of a total of its block: an even split whose remainder goes one each to the first pixels of
    /// the block in row-major order, so the shares add up exactly to the total (blocks at the image's right and bottom
    /// edges are cut short and split among the pixels they have).
    /// </summary>
    public uint Share(uint total, int x, int y)
    {
        int k = Block - 1;
        int x0 = x & ~k, y0 = y & ~k;
        int w = Math.Min(_width - x0, Block), h = Math.Min(_height - y0, Block);
        uint n = (uint)(w * h);
        uint index = (uint)((y - y0) * w + (x - x0));
        return total / n + (index < total % n ? 1u : 0u);
    }
}
