using System.Runtime.InteropServices;

namespace VoxProf.Core.Trees;

/// <summary>
/// One node of a tree with 8×8×8 cells: the same record as <see cref="Node"/> with 512-bit masks, 136 bytes. A cell is
/// occupied when its bit is set in exactly one mask; children and solid cells' materials are stored contiguously from
/// <see cref="FirstChild"/> and <see cref="FirstMaterial"/> and found by rank. Kept as its own type so the 2³ and 4³
/// records stay 24 bytes.
/// </summary>
[StructLayout(LayoutKind.Sequential)]
public struct Node8
{
    public Mask512 ChildMask;
    public Mask512 SolidMask;
    public int FirstChild;
    public int FirstMaterial;

    public readonly Mask512 Occupancy => Mask512.Or(ChildMask, SolidMask);
}
