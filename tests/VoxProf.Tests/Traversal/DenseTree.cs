using VoxProf.Core.Scenes;
using VoxProf.Core.Trees;

namespace VoxProf.Tests.Traversal;

/// <summary>
/// A second, deliberately naive tree builder for kernel tests: recursive over a material function, breadth-first layout.
/// Independent of the production builder, so kernel tests do not trust the code they are meant to catch.
/// </summary>
internal static class DenseTree
{
    private sealed class Temp
    {
        public Mask512 Child, Solid;
        public readonly List<Temp> Children = [];
        public readonly List<byte> Materials = [];
    }

    public static BrickTree Build(int ex, int ey, int ez, Func<int, int, int, byte> material, int branching)
    {
        int depth = BrickTree.DepthFor(branching, Math.Max(ex, Math.Max(ey, ez)));
        int log2 = System.Numerics.BitOperations.Log2((uint)branching);
        int rootSize = 1 << (log2 * depth);
        byte Sample(int x, int y, int z) => x < ex && y < ey && z < ez ? material(x, y, z) : (byte)0;

        // Returns -1 for mixed (node in 'node'), else the uniform material (0 = empty).
        int Classify(int ox, int oy, int oz, int size, out Temp? node)
        {
            node = null;
            if (size == 1)
                return Sample(ox, oy, oz);
            int cs = size / branching;
            var t = new Temp();
            int first = -2;
            bool uniform = true;
            for (int cz = 0; cz < branching; cz++)
                for (int cy = 0; cy < branching; cy++)
                    for (int cx = 0; cx < branching; cx++)
                    {
                        int bit = cx | (cy << log2) | (cz << (2 * log2));
                        int v = Classify(ox + cx * cs, oy + cy * cs, oz + cz * cs, cs, out Temp? child);
                        if (first == -2) first = v;
                        if (v != first || v == -1) uniform = false;
                        if (v == -1) { t.Child.Set(bit); t.Children.Add(child!); }
                        else if (v > 0) { t.Solid.Set(bit); t.Materials.Add((byte)v); }
                    }
            if (uniform && size != rootSize)
                return first;
            node = t;
            return -1;
        }

        Classify(0, 0, 0, rootSize, out Temp? root);
        var nodes = new List<Node8>();
        var materials = new List<byte>();
        var queue = new Queue<Temp>();
        queue.Enqueue(root!);
        nodes.Add(default);
        int next = 1;
        int index = 0;
        while (queue.Count > 0)
        {
            Temp t = queue.Dequeue();
            var n = new Node8 { ChildMask = t.Child, SolidMask = t.Solid, FirstChild = next, FirstMaterial = materials.Count };
            materials.AddRange(t.Materials);
            foreach (Temp c in t.Children)
            {
                queue.Enqueue(c);
                nodes.Add(default);
                next++;
            }
            nodes[index++] = n;
        }
        var stats = new TreeStats(branching, depth, rootSize, [], [], [], 0, 0, TimeSpan.Zero);
        if (branching == 8)
            return new BrickTree(depth, ex, ey, ez, nodes.ToArray(), materials.ToArray(), stats);
        // 2³ and 4³ cells fit the first word
        Node[] narrow = nodes.Select(n => new Node { ChildMask = n.ChildMask[0], SolidMask = n.SolidMask[0], FirstChild = n.FirstChild, FirstMaterial = n.FirstMaterial }).ToArray();
        return new BrickTree(branching, depth, ex, ey, ez, narrow, materials.ToArray(), stats);
    }

    public static Scene SceneOf(int ex, int ey, int ez, params CameraSpec[] cameras) =>
        new(ex, ey, ez, [], cameras);
}
