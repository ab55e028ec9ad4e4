using System.Runtime.CompilerServices;
using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes;

namespace VoxProf.Core.Trees.Building;

internal sealed partial class BuildWorker
{
    /// <summary>
    /// Runs a cell through the layers that touched its parent. The state starts as the parent's base material;
    /// a layer covering the cell whole sets it and forgets everything before; a layer covering part of it makes the
    /// cell mixed, unless it could not change anything (carving empty space, adding the material already there).
    /// When mixed, <paramref name="cellBase"/> is the uniform material before the first such layer and
    /// <paramref name="touching"/> lists that layer and every later one touching the cell.
    /// </summary>
    /// <returns>Empty, Solid (uniform <paramref name="cellBase"/>), or Node (mixed: subdivide or evaluate).</returns>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private CellKind Classify(in Box3i region, byte baseMaterial, ReadOnlySpan<int> layers, Span<int> touching,
        out byte cellBase, out int count)
    {
        count = 0;
        cellBase = 0;
        Box3i clip = region.Intersect(_plan.Extent);
        if (clip.IsEmpty)
            return CellKind.Empty;

        byte state = baseMaterial;
        bool mixed = false;
        foreach (int index in layers)
        {
            Layer layer = _plan.Layers[index];
            if (!layer.Bounds.Intersects(clip))
                continue;
            Box3i sub = clip.Intersect(layer.Bounds);
            Coverage coverage = layer.Classify(sub);
            if (coverage == Coverage.None)
                continue;
            if (coverage == Coverage.Full && sub == clip)
            {
                state = layer.Material;
                mixed = false;
                count = 0;
                continue;
            }
            if (!mixed)
            {
                if (layer.Material == state)
                    continue;
                mixed = true;
                cellBase = state;
            }
            touching[count++] = index;
        }

        if (mixed)
            return CellKind.Node;
        cellBase = state;
        if (state == 0)
            return CellKind.Empty;
        // Voxels outside the extent are empty, so a cell reaching past it is mixed even under one material.
        return clip == region ? CellKind.Solid : CellKind.Node;
    }
}
