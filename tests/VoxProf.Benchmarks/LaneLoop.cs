using System.Diagnostics;
using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.Intrinsics;
using System.Runtime.Intrinsics.X86;
using VoxProf.Core.Rays;
using VoxProf.Core.Trees;

namespace VoxProf.Benchmarks;

/// <summary>
/// An experiment: <see cref="ReferenceLoop"/> (the C reference's loop, both modes) with eight rays in lockstep, one per
/// lane of AVX-512 vectors, the rays of a 4×2 pixel block. Each lockstep iteration runs, under masks, what each lane
/// needs this time: pop one level of its ascent, test its cell (counted as the reference counts an iteration), descend,
/// or step along the nearest plane's axis; in mask mode a lane whose new cell reaches nothing occupied ascends. Per-lane
/// stack frames live in rows by depth (one masked store or blended load per depth the lanes are at); node words and
/// mask table words are fetched with AVX2 gathers (.NET exposes no AVX-512 gather). The arithmetic is the scalar loop's,
/// in the same order, so iterations and hits are the reference's to the unit. It answers whether lanes in lockstep beat
/// one ray at a time on this processor (docs/performance.md, "Eight rays in lockstep"); it is not a VoxProf strategy and
/// counts only iterations.
/// </summary>
public static unsafe class LaneLoop
{
    private const int Lanes = 8;
    private const int MaxDepth = 24;

    public static bool IsSupported => Avx512F.IsSupported && Avx512DQ.IsSupported && Avx2.IsSupported;

    /// <summary>Whether the image splits into whole 4×2 blocks.</summary>
    public static bool Takes(int width, int height) => width % 4 == 0 && height % 2 == 0;

    public static (double Cpu, long Iterations, int Hits) Run(BrickTree tree, Camera camera, bool mask)
    {
        if (tree.Branching != 4 || !Takes(camera.Width, camera.Height))
            throw new ArgumentException("4³ trees, image widths a multiple of 4 and even heights only");
        var hits = new bool[camera.Width * camera.Height];
        long iterations = 0;
        TimeSpan before = Process.GetCurrentProcess().TotalProcessorTime;
        fixed (Node* nodes = tree.Nodes)
        fixed (ulong* reach = VoxProf.Core.Traversal.DirectionalMasks.For(4))
        {
            var world = new World(tree, nodes, mask ? (long*)reach : null);
            Span<bool> block = stackalloc bool[Lanes];
            for (int y = 0; y < camera.Height; y += 2)
            {
                for (int x = 0; x < camera.Width; x += 4)
                {
                    iterations += Trace8(world, camera, x, y, block);
                    for (int l = 0; l < Lanes; l++)
                        hits[(y + (l >> 2)) * camera.Width + x + (l & 3)] = block[l];
                }
            }
        }
        double cpu = (Process.GetCurrentProcess().TotalProcessorTime - before).TotalSeconds;
        return (cpu, iterations, hits.Count(h => h));
    }

    private readonly struct World(BrickTree tree, Node* nodes, long* reach)
    {
        public readonly int Ex = tree.ExtentX, Ey = tree.ExtentY, Ez = tree.ExtentZ, RootShift = tree.CellShift(0);
        public readonly Node* Nodes = nodes;
        /// <summary>The directional mask table (the reference's mask mode), or null for its dda mode.</summary>
        public readonly long* Reach = reach;
    }

    /// <summary>Lanes in <paramref name="lanes"/> whose node has no occupied cell reachable from their cell (mask mode).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static Vector512<long> Culled(long* reach, Vector512<long> lanes, Vector512<long> octant64, Vector512<long> cx, Vector512<long> cy,
        Vector512<long> cz, Vector512<long> occupancy)
    {
        Vector512<long> at = octant64 + (cx | Vector512.ShiftLeft(cy, 2) | Vector512.ShiftLeft(cz, 4));
        Vector256<long> lo = Avx2.GatherMaskVector256(Vector256<long>.Zero, reach, at.GetLower(), lanes.GetLower(), 8);
        Vector256<long> hi = Avx2.GatherMaskVector256(Vector256<long>.Zero, reach, at.GetUpper(), lanes.GetUpper(), 8);
        return lanes & Vector512.Equals(occupancy & Vector512.Create(lo, hi), Vector512<long>.Zero);
    }

    /// <summary>
    /// The lanes of <paramref name="left"/> at the depth of its lowest lane, taken out of it; <paramref name="row"/> is
    /// that depth's first frame slot. The lanes of a block are at one or two depths, so a loop over these is short.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static Vector512<long> NextDepth(ref Vector512<long> left, Vector512<long> sp, out int row)
    {
        int l = BitOperations.TrailingZeroCount(left.ExtractMostSignificantBits());
        long d = sp.GetElement(l);
        Vector512<long> m = left & Vector512.Equals(sp, Vector512.Create(d));
        left &= ~m;
        row = (int)d * Lanes;
        return m;
    }

    /// <summary>Node words for every lane (child mask, solid mask, first child), gathered four lanes at a time.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static Vector512<long> Gather(Node* nodes, Vector512<long> index, int word)
    {
        // A node record is three 64-bit words: child mask, solid mask, first child (low half).
        Vector512<long> at = index * 3 + Vector512.Create((long)word);
        Vector256<long> lo = Avx2.GatherVector256((long*)nodes, at.GetLower(), 8);
        Vector256<long> hi = Avx2.GatherVector256((long*)nodes, at.GetUpper(), 8);
        return Vector512.Create(lo, hi);
    }

    [SkipLocalsInit]
    private static long Trace8(in World w, Camera camera, int x0, int y, Span<bool> hit)
    {
        // Per-lane set-up, one lane at a time, exactly as the scalar loop does it.
        double* sOx = stackalloc double[Lanes], sOy = stackalloc double[Lanes], sOz = stackalloc double[Lanes];
        double* sDx = stackalloc double[Lanes], sDy = stackalloc double[Lanes], sDz = stackalloc double[Lanes];
        double* sIx = stackalloc double[Lanes], sIy = stackalloc double[Lanes], sIz = stackalloc double[Lanes];
        double* sT = stackalloc double[Lanes], sTe = stackalloc double[Lanes];
        double* sTx = stackalloc double[Lanes], sTy = stackalloc double[Lanes], sTz = stackalloc double[Lanes];
        double* sDdx = stackalloc double[Lanes], sDdy = stackalloc double[Lanes], sDdz = stackalloc double[Lanes];
        long* sCx = stackalloc long[Lanes], sCy = stackalloc long[Lanes], sCz = stackalloc long[Lanes];
        long* sSx = stackalloc long[Lanes], sSy = stackalloc long[Lanes], sSz = stackalloc long[Lanes];
        long* sUx = stackalloc long[Lanes], sUy = stackalloc long[Lanes], sUz = stackalloc long[Lanes];
        long* sPx = stackalloc long[Lanes], sPy = stackalloc long[Lanes], sPz = stackalloc long[Lanes];
        long* sActive = stackalloc long[Lanes];
        long* sOct = stackalloc long[Lanes];
        int shift0 = w.RootShift;
        for (int l = 0; l < Lanes; l++)
        {
            Vector3 dir = camera.Direction(x0 + (l & 3), y + (l >> 2));
            Vector3 eye = camera.Eye;
            double ox = eye.X, oy = eye.Y, oz = eye.Z, dx = dir.X, dy = dir.Y, dz = dir.Z;
            double ix = 1.0 / dx, iy = 1.0 / dy, iz = 1.0 / dz;
            bool px = dx == 0, py = dy == 0, pz = dz == 0;
            int sx = ix < 0 ? -1 : 1, sy = iy < 0 ? -1 : 1, sz = iz < 0 ? -1 : 1;
            double near = double.NegativeInfinity, far = double.PositiveInfinity;
            bool ok = ReferenceLoop.Clip(px, ox, ix, w.Ex, ref near, ref far) && ReferenceLoop.Clip(py, oy, iy, w.Ey, ref near, ref far)
                && ReferenceLoop.Clip(pz, oz, iz, w.Ez, ref near, ref far);
            if (near < 0) near = 0;
            ok = ok && near <= far;
            sActive[l] = ok ? -1 : 0;
            sOct[l] = ((ix < 0 ? 1 : 0) | (iy < 0 ? 2 : 0) | (iz < 0 ? 4 : 0)) << 6;
            sOx[l] = ox; sOy[l] = oy; sOz[l] = oz; sDx[l] = dx; sDy[l] = dy; sDz[l] = dz; sIx[l] = ix; sIy[l] = iy; sIz[l] = iz;
            sT[l] = near; sTe[l] = far;
            sSx[l] = sx; sSy[l] = sy; sSz[l] = sz; sUx[l] = sx > 0 ? 1 : 0; sUy[l] = sy > 0 ? 1 : 0; sUz[l] = sz > 0 ? 1 : 0;
            sPx[l] = px ? -1 : 0; sPy[l] = py ? -1 : 0; sPz[l] = pz ? -1 : 0;
            int cx = ok ? ReferenceLoop.Vox(ox, dx, near, 0, w.Ex) >> shift0 : 0, cy = ok ? ReferenceLoop.Vox(oy, dy, near, 0, w.Ey) >> shift0 : 0;
            int cz = ok ? ReferenceLoop.Vox(oz, dz, near, 0, w.Ez) >> shift0 : 0;
            sCx[l] = cx; sCy[l] = cy; sCz[l] = cz;
            double cs = 1 << shift0;
            sDdx[l] = px ? double.PositiveInfinity : cs * Math.Abs(ix);
            sDdy[l] = py ? double.PositiveInfinity : cs * Math.Abs(iy);
            sDdz[l] = pz ? double.PositiveInfinity : cs * Math.Abs(iz);
            sTx[l] = px ? double.PositiveInfinity : ((double)((cx + sUx[l]) << shift0) - ox) * ix;
            sTy[l] = py ? double.PositiveInfinity : ((double)((cy + sUy[l]) << shift0) - oy) * iy;
            sTz[l] = pz ? double.PositiveInfinity : ((double)((cz + sUz[l]) << shift0) - oz) * iz;
        }

        Vector512<double> ox8 = Vector512.Load(sOx), oy8 = Vector512.Load(sOy), oz8 = Vector512.Load(sOz);
        Vector512<double> dx8 = Vector512.Load(sDx), dy8 = Vector512.Load(sDy), dz8 = Vector512.Load(sDz);
        Vector512<double> ix8 = Vector512.Load(sIx), iy8 = Vector512.Load(sIy), iz8 = Vector512.Load(sIz);
        Vector512<double> t = Vector512.Load(sT), tExit = Vector512.Load(sTe);
        Vector512<double> tx = Vector512.Load(sTx), ty = Vector512.Load(sTy), tz = Vector512.Load(sTz);
        Vector512<double> ddx = Vector512.Load(sDdx), ddy = Vector512.Load(sDdy), ddz = Vector512.Load(sDdz);
        Vector512<long> cx8 = Vector512.Load(sCx), cy8 = Vector512.Load(sCy), cz8 = Vector512.Load(sCz);
        Vector512<long> sx8 = Vector512.Load(sSx), sy8 = Vector512.Load(sSy), sz8 = Vector512.Load(sSz);
        Vector512<long> ux8 = Vector512.Load(sUx), uy8 = Vector512.Load(sUy), uz8 = Vector512.Load(sUz);
        Vector512<double> px8 = Vector512.Load(sPx).AsDouble(), py8 = Vector512.Load(sPy).AsDouble(), pz8 = Vector512.Load(sPz).AsDouble();
        Vector512<long> active = Vector512.Load(sActive);
        Vector512<long> gx = Vector512<long>.Zero, gy = Vector512<long>.Zero, gz = Vector512<long>.Zero;
        Vector512<long> shift = Vector512.Create((long)shift0);
        Vector512<long> node = Vector512<long>.Zero, sp = Vector512<long>.Zero, it = Vector512<long>.Zero;
        Vector512<long> ch = Vector512.Create((long)w.Nodes[0].ChildMask), so = Vector512.Create((long)w.Nodes[0].SolidMask);
        Vector512<long> ascending = Vector512<long>.Zero, hitMask = Vector512<long>.Zero;
        Vector512<double> inf = Vector512.Create(double.PositiveInfinity);
        Vector512<long> one = Vector512<long>.One, three = Vector512.Create(3L);
        Vector512<long> octant64 = Vector512.Load(sOct);
        // The reference leaves at once when the root's mask leaves nothing: with an empty path that is a miss.
        if (w.Reach != null)
            active &= ~Culled(w.Reach, active, octant64, cx8, cy8, cz8, ch | so);

        // Per-lane frames, [depth * 8 + lane]
        long* fN = stackalloc long[MaxDepth * Lanes], fCx = stackalloc long[MaxDepth * Lanes], fCy = stackalloc long[MaxDepth * Lanes], fCz = stackalloc long[MaxDepth * Lanes];
        double* fTx = stackalloc double[MaxDepth * Lanes], fTy = stackalloc double[MaxDepth * Lanes], fTz = stackalloc double[MaxDepth * Lanes];

        while (active != Vector512<long>.Zero)
        {
            // 1. Lanes ascending pop one level; an empty stack is a miss.
            Vector512<long> pop = active & ascending;
            if (pop != Vector512<long>.Zero)
            {
                Vector512<long> done = pop & Vector512.Equals(sp, Vector512<long>.Zero);
                active &= ~done;
                pop &= ~done;
                if (pop != Vector512<long>.Zero)
                {
                    sp -= pop & one;
                    // One masked row per depth the popping lanes are at (usually one or two)
                    Vector512<long> left = pop;
                    while (left != Vector512<long>.Zero)
                    {
                        Vector512<long> m = NextDepth(ref left, sp, out int row);
                        Vector512<double> md = m.AsDouble();
                        node = Vector512.ConditionalSelect(m, Vector512.Load(fN + row), node);
                        cx8 = Vector512.ConditionalSelect(m, Vector512.Load(fCx + row), cx8);
                        cy8 = Vector512.ConditionalSelect(m, Vector512.Load(fCy + row), cy8);
                        cz8 = Vector512.ConditionalSelect(m, Vector512.Load(fCz + row), cz8);
                        tx = Vector512.ConditionalSelect(md, Vector512.Load(fTx + row), tx);
                        ty = Vector512.ConditionalSelect(md, Vector512.Load(fTy + row), ty);
                        tz = Vector512.ConditionalSelect(md, Vector512.Load(fTz + row), tz);
                    }
                    ch = Vector512.ConditionalSelect(pop, Gather(w.Nodes, node, 0), ch);
                    so = Vector512.ConditionalSelect(pop, Gather(w.Nodes, node, 1), so);
                    shift += pop & Vector512.Create(2L);
                    Vector512<double> popD = pop.AsDouble();
                    ddx = Vector512.ConditionalSelect(popD, ddx * 4.0, ddx);
                    ddy = Vector512.ConditionalSelect(popD, ddy * 4.0, ddy);
                    ddz = Vector512.ConditionalSelect(popD, ddz * 4.0, ddz);
                    Vector512<ulong> us = shift.AsUInt64();
                    gx -= pop & Avx512F.ShiftLeftLogicalVariable(cx8, us);
                    gy -= pop & Avx512F.ShiftLeftLogicalVariable(cy8, us);
                    gz -= pop & Avx512F.ShiftLeftLogicalVariable(cz8, us);
                }
            }

            // 2. Lanes at a cell test it: a hit ends the lane, an occupied cell is descended into.
            Vector512<long> test = active & ~ascending;
            it -= test; // all ones is -1
            Vector512<long> bit = cx8 | Vector512.ShiftLeft(cy8, 2) | Vector512.ShiftLeft(cz8, 4);
            Vector512<long> b = Avx512F.ShiftLeftLogicalVariable(one, bit.AsUInt64());
            Vector512<long> occ = test & ~Vector512.Equals((ch | so) & b, Vector512<long>.Zero);
            Vector512<long> solid = occ & ~Vector512.Equals(so & b, Vector512<long>.Zero);
            hitMask |= solid;
            active &= ~solid;
            Vector512<long> desc = occ & ~solid;
            if (desc != Vector512<long>.Zero)
            {
                // One masked row per depth the descending lanes are at
                Vector512<long> left = desc;
                while (left != Vector512<long>.Zero)
                {
                    Vector512<long> m = NextDepth(ref left, sp, out int row);
                    Vector512<double> md = m.AsDouble();
                    Avx512F.MaskStore(fN + row, m, node);
                    Avx512F.MaskStore(fCx + row, m, cx8);
                    Avx512F.MaskStore(fCy + row, m, cy8);
                    Avx512F.MaskStore(fCz + row, m, cz8);
                    Avx512F.MaskStore(fTx + row, md, tx);
                    Avx512F.MaskStore(fTy + row, md, ty);
                    Avx512F.MaskStore(fTz + row, md, tz);
                }
                Vector512<long> first = Gather(w.Nodes, node, 2) & Vector512.Create(0xFFFFFFFFL);
                Vector512<long> child = first + PopCount(ch & (b - one));
                sp += desc & one;
                node = Vector512.ConditionalSelect(desc, child, node);
                ch = Vector512.ConditionalSelect(desc, Gather(w.Nodes, node, 0), ch);
                so = Vector512.ConditionalSelect(desc, Gather(w.Nodes, node, 1), so);
                Vector512<ulong> us = shift.AsUInt64();
                Vector512<long> span = Avx512F.ShiftLeftLogicalVariable(one, us);
                Vector512<long> ngx = gx + Avx512F.ShiftLeftLogicalVariable(cx8, us);
                Vector512<long> ngy = gy + Avx512F.ShiftLeftLogicalVariable(cy8, us);
                Vector512<long> ngz = gz + Avx512F.ShiftLeftLogicalVariable(cz8, us);
                Vector512<long> nshift = shift - Vector512.Create(2L);
                Vector512<ulong> nus = nshift.AsUInt64();
                Vector512<long> ncx = Avx512F.ShiftRightArithmeticVariable(VoxV(ox8, dx8, t, ngx, ngx + span) - ngx, nus);
                Vector512<long> ncy = Avx512F.ShiftRightArithmeticVariable(VoxV(oy8, dy8, t, ngy, ngy + span) - ngy, nus);
                Vector512<long> ncz = Avx512F.ShiftRightArithmeticVariable(VoxV(oz8, dz8, t, ngz, ngz + span) - ngz, nus);
                Vector512<double> dD = desc.AsDouble();
                Vector512<double> q = Vector512.Create(0.25);
                ddx = Vector512.ConditionalSelect(dD, ddx * q, ddx);
                ddy = Vector512.ConditionalSelect(dD, ddy * q, ddy);
                ddz = Vector512.ConditionalSelect(dD, ddz * q, ddz);
                Vector512<double> ntx = Vector512.ConditionalSelect(px8, inf, (Vector512.ConvertToDouble(ngx + Avx512F.ShiftLeftLogicalVariable(ncx + ux8, nus)) - ox8) * ix8);
                Vector512<double> nty = Vector512.ConditionalSelect(py8, inf, (Vector512.ConvertToDouble(ngy + Avx512F.ShiftLeftLogicalVariable(ncy + uy8, nus)) - oy8) * iy8);
                Vector512<double> ntz = Vector512.ConditionalSelect(pz8, inf, (Vector512.ConvertToDouble(ngz + Avx512F.ShiftLeftLogicalVariable(ncz + uz8, nus)) - oz8) * iz8);
                tx = Vector512.ConditionalSelect(dD, ntx, tx);
                ty = Vector512.ConditionalSelect(dD, nty, ty);
                tz = Vector512.ConditionalSelect(dD, ntz, tz);
                gx = Vector512.ConditionalSelect(desc, ngx, gx);
                gy = Vector512.ConditionalSelect(desc, ngy, gy);
                gz = Vector512.ConditionalSelect(desc, ngz, gz);
                cx8 = Vector512.ConditionalSelect(desc, ncx, cx8);
                cy8 = Vector512.ConditionalSelect(desc, ncy, cy8);
                cz8 = Vector512.ConditionalSelect(desc, ncz, cz8);
                shift = Vector512.ConditionalSelect(desc, nshift, shift);
            }

            // 3. Lanes at an empty cell and lanes just popped step along the axis of the nearest plane.
            Vector512<long> step = (test & ~occ) | pop;
            Vector512<double> stepD = step.AsDouble();
            Vector512<double> onX = Vector512.LessThanOrEqual(tx, ty) & Vector512.LessThanOrEqual(tx, tz);
            Vector512<double> onY = ~onX & Vector512.LessThanOrEqual(ty, tz);
            Vector512<double> onZ = ~onX & ~onY;
            Vector512<double> tNext = Vector512.ConditionalSelect(onX, tx, Vector512.ConditionalSelect(onY, ty, tz));
            Vector512<long> leaves = step & Vector512.GreaterThan(tNext, tExit).AsInt64();
            active &= ~leaves;
            step &= ~leaves;
            stepD = step.AsDouble();
            // The ascent's step keeps the later of the plane and t, as the scalar ascent does.
            Vector512<double> tNew = Vector512.ConditionalSelect(pop.AsDouble(), Vector512.Max(tNext, t), tNext);
            t = Vector512.ConditionalSelect(stepD, tNew, t);
            Vector512<long> sX = step & onX.AsInt64(), sY = step & onY.AsInt64(), sZ = step & onZ.AsInt64();
            tx = Vector512.ConditionalSelect(sX.AsDouble(), tx + ddx, tx);
            ty = Vector512.ConditionalSelect(sY.AsDouble(), ty + ddy, ty);
            tz = Vector512.ConditionalSelect(sZ.AsDouble(), tz + ddz, tz);
            cx8 += sX & sx8;
            cy8 += sY & sy8;
            cz8 += sZ & sz8;
            Vector512<long> outside = Vector512.GreaterThan(cx8.AsUInt64(), three.AsUInt64()).AsInt64()
                | Vector512.GreaterThan(cy8.AsUInt64(), three.AsUInt64()).AsInt64()
                | Vector512.GreaterThan(cz8.AsUInt64(), three.AsUInt64()).AsInt64();
            ascending = Vector512.ConditionalSelect(step, outside, ascending & ~test);
            ascending &= active;
            if (w.Reach != null)
            {
                // Mask mode: a lane that entered a cell (by descending, or by a step that stayed in its node) whose
                // node has nothing reachable from it ascends, as the reference's jump into its ascent does.
                Vector512<long> entered = active & (desc | (step & ~outside));
                ascending |= Culled(w.Reach, entered, octant64, cx8, cy8, cz8, ch | so);
            }
        }

        ulong hitBits = hitMask.ExtractMostSignificantBits();
        for (int l = 0; l < Lanes; l++)
            hit[l] = ((hitBits >> l) & 1) != 0;
        return Vector512.Sum(it);
    }

    /// <summary>Bits set in each lane (the classic shift-and-add count; AVX-512's own count is not exposed here).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static Vector512<long> PopCount(Vector512<long> v)
    {
        Vector512<ulong> x = v.AsUInt64();
        x -= (x >> 1) & Vector512.Create(0x5555555555555555UL);
        x = (x & Vector512.Create(0x3333333333333333UL)) + ((x >> 2) & Vector512.Create(0x3333333333333333UL));
        x = (x + (x >> 4)) & Vector512.Create(0x0F0F0F0F0F0F0F0FUL);
        return ((x * Vector512.Create(0x0101010101010101UL)) >> 56).AsInt64();
    }

    /// <summary>The scalar loop's floor-and-clamp voxel look-up, eight lanes at a time.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static Vector512<long> VoxV(Vector512<double> o, Vector512<double> d, Vector512<double> t, Vector512<long> lo, Vector512<long> hi)
    {
        Vector512<double> p = Vector512.Floor(o + t * d);
        Vector512<double> loD = Vector512.ConvertToDouble(lo), hiD = Vector512.ConvertToDouble(hi);
        Vector512<long> v = Vector512.ConvertToInt64Native(Vector512.Max(p, loD));
        return Vector512.ConditionalSelect(Vector512.GreaterThanOrEqual(p, hiD).AsInt64(), hi - Vector512<long>.One, v);
    }
}
