using System.Globalization;
using System.Numerics;
using System.Runtime.CompilerServices;
using VoxProf.Core.Rays;
using VoxProf.Core.Scenes;
using VoxProf.Core.Traversal;

namespace VoxProf.Core.Limits;

/// <summary>What tracing one camera will cost: the grid reference's steps and the result buffers' memory.</summary>
public static class TraceCost
{
    // Rays sampled for the grid estimate: enough for a mean within a few percent, cheap at any image size.
    private const int SampleSide = 64;

    /// <summary>Memory of one strategy's results per pixel: a 32-bit buffer per counter and a hit record.</summary>
    public static int BytesPerPixel => CounterNames.Count * sizeof(uint) + Unsafe.SizeOf<PixelHit>();

    /// <summary>
    /// Cells the <c>grid</c> strategy steps through if no ray hits anything: per pixel, the ray's path inside the
    /// extent in cells crossed (a DDA steps once per cell boundary, |dx| + |dy| + |dz| per voxel of length), averaged
    /// over a grid of sample rays and multiplied by the pixels. An upper bound: rays that hit stop early.
    /// </summary>
    public static double GridSteps(Scene scene, CameraSpec spec, int width, int height)
    {
        var camera = new Camera(spec, width, height);
        int nx = Math.Min(width, SampleSide), ny = Math.Min(height, SampleSide);
        double sum = 0;
        for (int j = 0; j < ny; j++)
        {
            for (int i = 0; i < nx; i++)
            {
                float x = (i + 0.5f) * width / nx, y = (j + 0.5f) * height / ny;
                sum += CellsCrossed(camera.Eye, camera.Direction(x, y), scene);
            }
        }
        return sum / (nx * ny) * ((double)width * height);
    }

    /// <summary>Throws a <see cref="LimitException"/> when the grid strategy's steps are over <paramref name="maxWork"/>.</summary>
    public static void RequireGridWork(Scene scene, CameraSpec camera, int width, int height, double maxWork)
    {
        double steps = GridSteps(scene, camera, width, height);
        if (steps <= maxWork)
            return;
        throw new LimitException(LimitKind.Work, string.Create(CultureInfo.InvariantCulture,
            $"strategy grid: tracing {width}×{height} pixels through the {scene.ExtentX}×{scene.ExtentY}×{scene.ExtentZ} extent from camera '{MessageText.Excerpt(camera.Name)}' takes up to {LayerCost.Figure(steps)} grid steps (about {LayerCost.Figure(steps / ((double)width * height))} per ray), over the work limit of {LayerCost.Figure(maxWork)}; the grid reference steps through every cell, empty or not"));
    }

    /// <summary>The trace's memory parts: every strategy's results stay in memory until the reports are written.</summary>
    public static IEnumerable<MemoryPart> MemoryParts(int width, int height, int strategies)
    {
        double pixels = (double)width * height;
        yield return new MemoryPart(
            string.Create(CultureInfo.InvariantCulture, $"results of {strategies} {(strategies == 1 ? "strategy" : "strategies")} at {width}×{height} ({BytesPerPixel} bytes per pixel each)"),
            pixels * BytesPerPixel * strategies);
    }

    private static double CellsCrossed(Vector3 eye, Vector3 dir, Scene scene)
    {
        double near = 0, far = double.PositiveInfinity;
        if (!Slab(eye.X, dir.X, scene.ExtentX, ref near, ref far) || !Slab(eye.Y, dir.Y, scene.ExtentY, ref near, ref far)
            || !Slab(eye.Z, dir.Z, scene.ExtentZ, ref near, ref far) || far <= near)
            return 0;
        return (far - near) * (Math.Abs(dir.X) + Math.Abs(dir.Y) + Math.Abs(dir.Z)) + 1;
    }

    private static bool Slab(double origin, double d, double size, ref double near, ref double far)
    {
        if (d == 0)
            return origin >= 0 && origin <= size;
        double t0 = (0 - origin) / d, t1 = (size - origin) / d;
        near = Math.Max(near, Math.Min(t0, t1));
        far = Math.Min(far, Math.Max(t0, t1));
        return true;
    }
}
