using System.Numerics;
using System.Runtime.CompilerServices;
using VoxProf.Core.Scenes;

namespace VoxProf.Core.Rays;

/// <summary>
/// Pinhole camera producing one ray per pixel, in single precision as a shader would (docs/strategies.md):
/// forward = normalize(target − eye), right = normalize(forward × up), trueUp = right × forward, and the ray of pixel
/// (x, y), row 0 at the top, points along forward + (2(x + 0.5)/W − 1)·tan(fov/2)·(W/H)·right + (1 − 2(y + 0.5)/H)·tan(fov/2)·trueUp,
/// normalised so that t is a distance in voxels.
/// </summary>
public readonly struct Camera
{
    private readonly Vector3 _forward;
    private readonly Vector3 _right;
    private readonly Vector3 _trueUp;
    private readonly float _tanHalf;
    private readonly float _aspect;

    public Camera(CameraSpec spec, int width, int height)
    {
        Eye = spec.Eye;
        Width = width;
        Height = height;
        _forward = Vector3.Normalize(spec.Target - spec.Eye);
        _right = Vector3.Normalize(Vector3.Cross(_forward, spec.Up));
        _trueUp = Vector3.Cross(_right, _forward);
        // Math.Tan in double, rounded once: float tangent functions differ between C runtimes in the last bit.
        _tanHalf = (float)Math.Tan(spec.FovYDegrees * Math.PI / 360.0);
        _aspect = (float)width / height;
        DirectionAngleWidening = Math.Tan(2 * DirectionAngleError);
    }

    public Vector3 Eye { get; }
    public int Width { get; }
    public int Height { get; }

    /// <summary>Unit direction of the ray through the centre of pixel (x, y).</summary>
    public Vector3 Direction(int x, int y) => Direction(x + 0.5f, y + 0.5f);

    /// <summary>Unit direction through any image point; (0, 0) is the top-left corner of the image.</summary>
    public Vector3 Direction(float px, float py)
    {
        float u = (2f * px / Width - 1f) * _tanHalf * _aspect;
        float v = (1f - 2f * py / Height) * _tanHalf;
        Vector3 d = _forward + u * _right + v * _trueUp;
        return Vector3.Normalize(d);
    }

    /// <summary>
    /// The point of the image plane a pixel's direction stands for before any float rounding: forward + u·right +
    /// v·trueUp, u and v as in <see cref="Direction(float, float)"/>, evaluated in double from the camera's float
    /// vectors (not normalised). A pixel's float direction is within <see cref="DirectionAngleError"/> of it in angle.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal (double X, double Y, double Z) PlanePoint(double px, double py)
    {
        double u = (2 * px / Width - 1) * _tanHalf * _aspect;
        double v = (1 - 2 * py / Height) * _tanHalf;
        return (_forward.X + u * _right.X + v * _trueUp.X, _forward.Y + u * _right.Y + v * _trueUp.Y,
            _forward.Z + u * _right.Z + v * _trueUp.Z);
    }

    /// <summary>
    /// A bound, in radians, on the angle between any pixel's float direction and the exact point of the image plane
    /// it stands for (forward + u·right + v·trueUp with u and v unrounded): each of u and v carries a few float
    /// roundings of magnitude up to tan(fov/2)·(W/H) and tan(fov/2), the sum and the normalisation a few of its own
    /// length, which is at least 1: at most 11·2⁻²⁴·(1 + tan(fov/2) + tan(fov/2)·(W/H)) in all (docs/strategies.md,
    /// prepass step 1). This is about six times that.
    /// </summary>
    internal double DirectionAngleError => Math.ScaleB(1.0 + _tanHalf + (double)_tanHalf * _aspect, -18);

    /// <summary>tan(2·<see cref="DirectionAngleError"/>): what the prepass widens every cone's half-angle by.</summary>
    internal double DirectionAngleWidening { get; }

    public RaySetup Ray(int x, int y) => new(Eye, Direction(x, y));
}
