using VoxProf.Core.Scenes.Layers;

namespace VoxProf.Core.Scenes.Meshes;

/// <summary>
/// Whether a mesh is closed, judged on its welded vertex indices: every edge must be used by an even number of
/// triangles. When, in addition, each edge is used as often in one direction as in the other, the faces agree in
/// orientation and the winding number is meaningful; otherwise only parity is.
/// </summary>
public static class MeshTopology
{
    /// <summary>The inside rule a solid fill can use, and how many edges are open (used an odd number of times).</summary>
    public static (InsideRule Rule, long OpenEdges) Analyse(ReadOnlySpan<int> triangles)
    {
        // One key per directed edge: smaller index, larger index, then a bit for the direction.
        var keys = new ulong[triangles.Length];
        int n = 0;
        for (int t = 0; t < triangles.Length; t += 3)
        {
            for (int k = 0; k < 3; k++)
            {
                int a = triangles[t + k], b = triangles[t + (k + 1) % 3];
                if (a == b)
                    continue;
                ulong lo = (ulong)Math.Min(a, b), hi = (ulong)Math.Max(a, b);
                keys[n++] = lo << 33 | hi << 1 | (a < b ? 1UL : 0UL);
            }
        }
        Span<ulong> edges = keys.AsSpan(0, n);
        edges.Sort();
        long open = 0, unbalanced = 0;
        for (int i = 0; i < n;)
        {
            int j = i, forward = 0;
            while (j < n && edges[j] >> 1 == edges[i] >> 1)
                forward += (int)(edges[j++] & 1);
            int total = j - i;
            if ((total & 1) != 0)
                open++;
            else if (2 * forward != total)
                unbalanced++;
            i = j;
        }
        return (open > 0 ? InsideRule.None : unbalanced == 0 ? InsideRule.Winding : InsideRule.Parity, open);
    }
}
