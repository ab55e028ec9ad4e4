namespace VoxProf.Core.Traversal;

/// <summary>
/// Compile-time switches of <see cref="StackWalkKernel"/>: the JIT specialises the kernel per struct mode, so the
/// unused branches vanish and slab, dda and dda-mask share one loop.
/// </summary>
public interface IWalkMode
{
    /// <summary>Step inside a node with DDA (true) or with a slab test of the current cell (false).</summary>
    static abstract bool StepsWithDda { get; }

    /// <summary>Cull with the directional occupancy masks.</summary>
    static abstract bool CullsWithMask { get; }
}

public struct SlabMode : IWalkMode
{
    public static bool StepsWithDda => false;
    public static bool CullsWithMask => false;
}

public struct DdaMode : IWalkMode
{
    public static bool StepsWithDda => true;
    public static bool CullsWithMask => false;
}

public struct MaskedDdaMode : IWalkMode
{
    public static bool StepsWithDda => true;
    public static bool CullsWithMask => true;
}

/// <summary>One saved level of the stack walk: the node's hot record, its origin, the cell the ray is in, its DDA times.</summary>
public struct WalkFrame
{
    public ulong ChildMask;
    public ulong SolidMask;
    public int FirstChild;
    public int FirstMaterial;
    public int Ox, Oy, Oz;
    public int Cx, Cy, Cz;
    public double TMaxX, TMaxY, TMaxZ;
}
