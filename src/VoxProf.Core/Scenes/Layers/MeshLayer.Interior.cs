using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes.Meshes;

namespace VoxProf.Core.Scenes.Layers;

public sealed partial class MeshLayer
{
    /// <summary>Whether the centre of voxel (x, y, z) is inside the closed mesh, by a ray towards +x.</summary>
    internal bool InteriorAt(int x, int y, int z)
    {
        Scratch scratch = Scratch.ForThread();
        int s = _bins.Shift;
        int count = 0;
        _bins.GatherRow(x >> s, y >> s, z >> s, ref scratch.Triangles, ref count);
        ReadOnlySpan<int> candidates = Unique(scratch.Triangles, count);
        double cx = x + 0.5, cy = y + 0.5, cz = z + 0.5;
        int crossings = 0, winding = 0;
        foreach (int t in candidates)
        {
            if (RayCrossing.TryCreate(_v, _tri[3 * t], _tri[3 * t + 1], _tri[3 * t + 2], out RayCrossing c)
                && c.Crosses(cy, cz, out double at) && at > cx)
            {
                crossings++;
                winding += c.Sign;
            }
        }
        return Rule == InsideRule.Winding ? winding != 0 : (crossings & 1) != 0;
    }

    /// <summary>Only the interior part of <see cref="Fill"/> (voxels whose centre is inside), for checks of volume.</summary>
    internal void FillInteriorOnly(in Box3i region, Span<bool> inside)
    {
        inside[..checked((int)region.Volume)].Clear();
        Box3i r = region.Intersect(Bounds);
        if (!r.IsEmpty && Rule != InsideRule.None)
            FillInterior(region, r, inside[..checked((int)region.Volume)], Scratch.ForThread());
    }

    /// <summary>
    /// Adds the interior voxels of <paramref name="clip"/>: rows along x grouped by row of bins; each group gathers the
    /// triangles binned at or beyond the block along +x once, then every row sorts its crossings and sweeps.
    /// </summary>
    private void FillInterior(in Box3i region, in Box3i clip, Span<bool> inside, Scratch scratch)
    {
        int s = _bins.Shift;
        int sx = region.SizeX, sxy = sx * region.SizeY;
        for (int bz = clip.MinZ >> s; bz <= (clip.MaxZ - 1) >> s; bz++)
        {
            for (int by = clip.MinY >> s; by <= (clip.MaxY - 1) >> s; by++)
            {
                int count = 0;
                _bins.GatherRow(clip.MinX >> s, by, bz, ref scratch.Triangles, ref count);
                ReadOnlySpan<int> candidates = Unique(scratch.Triangles, count);
                int n = 0;
                scratch.EnsureCrossings(candidates.Length);
                foreach (int t in candidates)
                {
                    if (RayCrossing.TryCreate(_v, _tri[3 * t], _tri[3 * t + 1], _tri[3 * t + 2], out RayCrossing c))
                        scratch.Crossings[n++] = c;
                }
                int z0 = Math.Max(clip.MinZ, bz << s), z1 = Math.Min(clip.MaxZ, (bz + 1) << s);
                int y0 = Math.Max(clip.MinY, by << s), y1 = Math.Min(clip.MaxY, (by + 1) << s);
                for (int z = z0; z < z1; z++)
                {
                    for (int y = y0; y < y1; y++)
                    {
                        int row = (z - region.MinZ) * sxy + (y - region.MinY) * sx - region.MinX;
                        SweepRow(scratch, n, y + 0.5, z + 0.5, clip.MinX, clip.MaxX, inside, row);
                    }
                }
            }
        }
    }

    private void SweepRow(Scratch scratch, int candidates, double cy, double cz, int x0, int x1, Span<bool> inside, int row)
    {
        int hits = 0;
        for (int i = 0; i < candidates; i++)
        {
            ref readonly RayCrossing c = ref scratch.Crossings[i];
            if (c.Crosses(cy, cz, out double at) && at > x0 + 0.5)
            {
                scratch.At[hits] = at;
                scratch.Signs[hits] = c.Sign;
                hits++;
            }
        }
        if (hits == 0)
            return;
        Span<double> at0 = scratch.At.AsSpan(0, hits);
        Span<int> signs = scratch.Signs.AsSpan(0, hits);
        at0.Sort(signs);
        // Crossings beyond the voxel centre decide it: walk x up, dropping crossings the centre has passed.
        int winding = 0;
        foreach (int sign in signs)
            winding += sign;
        int next = 0;
        for (int x = x0; x < x1; x++)
        {
            double cx = x + 0.5;
            while (next < hits && at0[next] <= cx)
                winding -= signs[next++];
            if (next == hits)
                break;
            bool isInside = Rule == InsideRule.Winding ? winding != 0 : ((hits - next) & 1) != 0;
            if (isInside)
                inside[row + x] = true;
        }
    }

    /// <summary>One thread's buffers for gathering triangles and crossings.</summary>
    private sealed class Scratch
    {
        [ThreadStatic]
        private static Scratch? _current;

        public int[] Triangles = new int[256];
        public RayCrossing[] Crossings = new RayCrossing[64];
        public double[] At = new double[64];
        public int[] Signs = new int[64];

        public static Scratch ForThread() => _current ??= new Scratch();

        public void EnsureCrossings(int n)
        {
            if (Crossings.Length >= n)
                return;
            int size = Math.Max(n, 2 * Crossings.Length);
            Crossings = new RayCrossing[size];
            At = new double[size];
            Signs = new int[size];
        }
    }
}
