using System.Runtime.InteropServices;

namespace VoxProf.Core.Trees;

/// <summary>
/// One interior node: the hot record every traversal step reads. A cell of the node is occupied when its bit is set in
/// exactly one of the two masks: <see cref="ChildMask"/> (a child node is stored) or <see cref="SolidMask"/> (the whole
/// cell is solid with one material). Children are stored contiguously from <see cref="FirstChild"/> and found by the
/// popcount rank of their bit; solid cells' materials likewise from <see cref="FirstMaterial"/>.
/// Cell index: x + N·y + N²·z within the node. With N = 2 only the low 8 bits are used; N = 8 would need 512-bit masks
/// (eight of these words), which is why every mask access goes through <see cref="BrickTree"/> helpers.
/// </summary>
[StructLayout(LayoutKind.Sequential)]
public struct Node
{
    public ulong ChildMask;
    public ulong SolidMask;
    public int FirstChild;
    public int FirstMaterial;

    public readonly ulong Occupancy => ChildMask | SolidMask;
}
