namespace VoxProf.Core.Traversal;

/// <summary>
/// A node a kernel has read: its index in the tree's node array. Only <see cref="TreeView.Fetch{TCounters}"/> makes one
/// (default is the root), so it always names a record of the tree.
/// </summary>
public readonly struct NodeRef
{
    internal NodeRef(int index) => Index = index;

    /// <summary>Index of the record in the node array (<see cref="TreeView.Nodes"/> or <see cref="TreeView.Nodes8"/>).</summary>
    public int Index { get; }

    public override string ToString() => $"node {Index}";
}
