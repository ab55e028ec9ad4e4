using System.Diagnostics;
using System.Numerics;
using System.Runtime.CompilerServices;
using VoxProf.Core.Rays;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;

namespace VoxProf.Benchmarks;

/// <summary>
/// The C reference's own loop (../shared/perf/refbrick.c, its default kernel `trace2`) written again in C#, statement for
/// statement: raw pointers, no counters but the iteration total, plane times accumulated as the reference accumulates
/// them, descents by floor and clamp. It is not a VoxProf strategy (it neither counts what docs/counters.md defines nor
/// follows the crossing order exactly: it does one iteration more than `dda` on the raw terrain, as the reference does);
/// it measures how fast the .NET JIT runs the very loop the C compiler was given, so the side-by-side ratios split
/// into what the JIT costs (this loop ÷ C) and what VoxProf's kernels cost on top (VoxProf ÷ this loop).
/// Only 4³ trees, like the reference.
/// </summary>
public static unsafe class ReferenceLoop
{
    /// <summary>One trace of the image on this thread: process CPU seconds, iteration total and hit count.</summary>
    public static (double Cpu, long Iterations, int Hits) Run(BrickTree tree, Camera camera, bool mask)
    {
        if (tree.Branching != 4)
            throw new ArgumentException("the reference's loop reads 4³ trees only", nameof(tree));
        var world = new World(tree);
        var hits = new bool[camera.Width * camera.Height];
        long iterations = 0;
        TimeSpan before = Process.GetCurrentProcess().TotalProcessorTime;
        fixed (Node* nodes = tree.Nodes)
        fixed (ulong* reach = DirectionalMasks.For(4))
        {
            for (int y = 0; y < camera.Height; y++)
            {
                for (int x = 0; x < camera.Width; x++)
                {
                    Vector3 d = camera.Direction(x, y);
                    hits[y * camera.Width + x] = mask
                        ? Trace<Culling>(world, nodes, reach, camera.Eye, d, ref iterations)
                        : Trace<NoCulling>(world, nodes, reach, camera.Eye, d, ref iterations);
                }
            }
        }
        double cpu = (Process.GetCurrentProcess().TotalProcessorTime - before).TotalSeconds;
        return (cpu, iterations, hits.Count(h => h));
    }

    private readonly struct World(BrickTree tree)
    {
        public readonly int Ex = tree.ExtentX, Ey = tree.ExtentY, Ez = tree.ExtentZ, RootShift = tree.CellShift(0);
    }

    // The reference's MASK constant as a compile-time switch, so each mode gets its own loop as in the C build.
    private interface ICulling { static abstract bool On { get; } }
    private struct Culling : ICulling { public static bool On => true; }
    private struct NoCulling : ICulling { public static bool On => false; }

    private struct Frame
    {
        public Node* N;
        public double Tx, Ty, Tz;
        public int Cx, Cy, Cz;
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal static int Vox(double o, double d, double t, int lo, int hi)
    {
        double p = Math.Floor(o + t * d);
        if (p < lo) return lo;
        if (p >= hi) return hi - 1;
        return (int)p;
    }

    private static bool Trace<TCulling>(in World w, Node* nodes, ulong* reachTable, Vector3 eye, Vector3 dir, ref long itc)
        where TCulling : struct, ICulling
    {
        double ox = eye.X, oy = eye.Y, oz = eye.Z, dx = dir.X, dy = dir.Y, dz = dir.Z;
        double ix = 1.0 / dx, iy = 1.0 / dy, iz = 1.0 / dz;
        bool px = dx == 0, py = dy == 0, pz = dz == 0;
        int sx = ix < 0 ? -1 : 1, sy = iy < 0 ? -1 : 1, sz = iz < 0 ? -1 : 1;
        int ux = sx > 0 ? 1 : 0, uy = sy > 0 ? 1 : 0, uz = sz > 0 ? 1 : 0;
        int oct = (ix < 0 ? 1 : 0) | (iy < 0 ? 2 : 0) | (iz < 0 ? 4 : 0);
        double near = double.NegativeInfinity, far = double.PositiveInfinity;
        if (!Clip(px, ox, ix, w.Ex, ref near, ref far) || !Clip(py, oy, iy, w.Ey, ref near, ref far) || !Clip(pz, oz, iz, w.Ez, ref near, ref far))
            return false;
        if (near < 0) near = 0;
        if (!(near <= far)) return false;
        double t = near, tExit = far;
        Node* n = nodes;
        ulong ch = n->ChildMask, so = n->SolidMask;
        int shift = w.RootShift, gx = 0, gy = 0, gz = 0;
        int cx = Vox(ox, dx, t, 0, w.Ex) >> shift, cy = Vox(oy, dy, t, 0, w.Ey) >> shift, cz = Vox(oz, dz, t, 0, w.Ez) >> shift;
        double cs = 1 << shift;
        double ddx = px ? double.PositiveInfinity : cs * Math.Abs(ix);
        double ddy = py ? double.PositiveInfinity : cs * Math.Abs(iy);
        double ddz = pz ? double.PositiveInfinity : cs * Math.Abs(iz);
        double tx = px ? double.PositiveInfinity : ((double)(gx + ((cx + ux) << shift)) - ox) * ix;
        double ty = py ? double.PositiveInfinity : ((double)(gy + ((cy + uy) << shift)) - oy) * iy;
        double tz = pz ? double.PositiveInfinity : ((double)(gz + ((cz + uz) << shift)) - oz) * iz;
        ulong* reach = reachTable + (oct << 6);
        Frame* st = stackalloc Frame[24];
        int sp = 0;
        long it = 0;
        bool hit = false;
        // The reference jumps into its ascent when the root's mask leaves nothing; with an empty path that is a miss.
        if (TCulling.On && ((ch | so) & reach[cx | cy << 2 | cz << 4]) == 0)
            return false;
        while (true)
        {
            it++;
            int bit = cx | cy << 2 | cz << 4;
            ulong b = 1ul << bit;
            if (((ch | so) & b) != 0)
            {
                if ((so & b) != 0)
                {
                    hit = true;
                    break;
                }
                // Descend: save this level, enter the child at t by floor and clamp.
                Frame* f = &st[sp++];
                f->N = n; f->Tx = tx; f->Ty = ty; f->Tz = tz; f->Cx = cx; f->Cy = cy; f->Cz = cz;
                n = nodes + n->FirstChild + BitOperations.PopCount(ch & (b - 1));
                ch = n->ChildMask; so = n->SolidMask;
                int span = 1 << shift;
                gx += cx << shift; gy += cy << shift; gz += cz << shift;
                shift -= 2;
                cx = (Vox(ox, dx, t, gx, gx + span) - gx) >> shift;
                cy = (Vox(oy, dy, t, gy, gy + span) - gy) >> shift;
                cz = (Vox(oz, dz, t, gz, gz + span) - gz) >> shift;
                ddx *= 0.25; ddy *= 0.25; ddz *= 0.25;
                tx = px ? double.PositiveInfinity : ((double)(gx + ((cx + ux) << shift)) - ox) * ix;
                ty = py ? double.PositiveInfinity : ((double)(gy + ((cy + uy) << shift)) - oy) * iy;
                tz = pz ? double.PositiveInfinity : ((double)(gz + ((cz + uz) << shift)) - oz) * iz;
                if (!TCulling.On || ((ch | so) & reach[cx | cy << 2 | cz << 4]) != 0)
                    continue;
                goto ascend;
            }
            if (tx <= ty && tx <= tz)
            {
                if (tx > tExit) break;
                t = tx; tx += ddx; cx += sx;
                if ((uint)cx > 3) goto ascend;
            }
            else if (ty <= tz)
            {
                if (ty > tExit) break;
                t = ty; ty += ddy; cy += sy;
                if ((uint)cy > 3) goto ascend;
            }
            else
            {
                if (tz > tExit) break;
                t = tz; tz += ddz; cz += sz;
                if ((uint)cz > 3) goto ascend;
            }
            if (!TCulling.On || ((ch | so) & reach[cx | cy << 2 | cz << 4]) != 0)
                continue;
        ascend:
            // Ascend until a parent has a next cell to visit.
            while (true)
            {
                if (sp == 0) goto miss;
                Frame* f = &st[--sp];
                n = f->N; ch = n->ChildMask; so = n->SolidMask;
                tx = f->Tx; ty = f->Ty; tz = f->Tz; cx = f->Cx; cy = f->Cy; cz = f->Cz;
                shift += 2;
                ddx *= 4.0; ddy *= 4.0; ddz *= 4.0;
                gx -= cx << shift; gy -= cy << shift; gz -= cz << shift;
                if (tx <= ty && tx <= tz)
                {
                    if (tx > tExit) goto miss;
                    t = Math.Max(tx, t); tx += ddx; cx += sx;
                    if ((uint)cx > 3) continue;
                }
                else if (ty <= tz)
                {
                    if (ty > tExit) goto miss;
                    t = Math.Max(ty, t); ty += ddy; cy += sy;
                    if ((uint)cy > 3) continue;
                }
                else
                {
                    if (tz > tExit) goto miss;
                    t = Math.Max(tz, t); tz += ddz; cz += sz;
                    if ((uint)cz > 3) continue;
                }
                if (!TCulling.On || ((ch | so) & reach[cx | cy << 2 | cz << 4]) != 0)
                    break;
            }
        }
    miss:
        itc += it;
        return hit;
    }

    /// <summary>The reference's clip of one axis to [0, extent), with its rule for a parallel axis.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal static bool Clip(bool parallel, double o, double inv, int extent, ref double near, ref double far)
    {
        if (parallel)
            return o >= 0 && o < extent;
        double ta = ((inv < 0 ? extent : 0) - o) * inv, tb = ((inv < 0 ? 0 : extent) - o) * inv;
        if (ta > near) near = ta;
        if (tb < far) far = tb;
        return true;
    }
}
