namespace VoxProf.Core.Trees.Building;

internal enum CellKind : byte
{
    Empty,
    Solid,
    Node,
}

/// <summary>What a region turned out to be once built: empty, solid with one material, or a stored node.</summary>
internal readonly struct CellResult
{
    private CellResult(CellKind kind, byte material, Node node)
    {
        Kind = kind;
        Material = material;
        Node = node;
    }

    public CellKind Kind { get; }
    public byte Material { get; }
    public Node Node { get; }

    public static CellResult Empty => default;

    /// <summary>Solid with <paramref name="material"/>; material 0 means empty.</summary>
    public static CellResult Uniform(byte material) =>
        material == 0 ? default : new CellResult(CellKind.Solid, material, default);

    public static CellResult Of(Node node) => new(CellKind.Node, 0, node);
}

/// <summary>A mixed region to build as an independent subtree: its node level, corner, and the layers that touch it.</summary>
internal sealed record SubtreeTask(int Level, int X, int Y, int Z, byte BaseMaterial, int[] Layers);

/// <summary>A built subtree: its root result and its nodes and materials, indexed from 0.</summary>
internal sealed record SubtreeOutput(CellResult Root, Node[] Nodes, byte[] Materials);
