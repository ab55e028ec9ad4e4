using System.Globalization;
using System.Numerics;

namespace VoxProf.Core.Scenes;

/// <summary>The part of a camera a <see cref="CameraProblem"/> is about, so each caller can name its own source.</summary>
public enum CameraPart
{
    Target,
    Up,
    Fov,
}

/// <summary>Why a camera cannot be used: the part at fault and what is wrong with it and what was expected.</summary>
public sealed record CameraProblem(CameraPart Part, string Message);

/// <summary>
/// The one validation of a camera, for scene files and the command line alike. The tracer builds its camera basis in
/// single precision (docs/strategies.md): forward = normalize(target − eye), right = normalize(forward × up),
/// trueUp = right × forward. A camera is accepted when that float basis comes out finite and orthonormal (each
/// length within <see cref="BasisTolerance"/> of 1, each pair's dot product within it of 0) and up is at least
/// <see cref="MinUpSine"/> away from the view direction.
/// </summary>
/// <remarks>
/// Why 1e-3 for the angle: forward × up is rounded to about 1.2e-7 (2^-23) per component, so with sin θ ≥ 1e-3 the
/// direction of right is good to about 1e-4 rad, under a tenth of a pixel's angle at 720 rows and 60° (1.5e-3 rad);
/// nearer the view direction the image's roll is set by rounding. Checking the float basis itself, rather than
/// the inputs, also catches vectors so short (1e-30) or long that normalising them in float gives NaN or infinity.
/// </remarks>
public static class CameraChecks
{
    /// <summary>Smallest vertical field of view accepted, in degrees.</summary>
    public const float MinFovDegrees = 1;

    /// <summary>Largest vertical field of view accepted, in degrees.</summary>
    public const float MaxFovDegrees = 179;

    /// <summary>Smallest sine of the angle between the view direction and up (about 0.057°).</summary>
    public const double MinUpSine = 1e-3;

    /// <summary>How far the float basis may be from orthonormal.</summary>
    public const float BasisTolerance = 1e-3f;

    /// <summary>"a vertical field of view from 1 to 179 degrees"</summary>
    public static string FovRange { get; } =
        string.Create(CultureInfo.InvariantCulture, $"a vertical field of view from {MinFovDegrees} to {MaxFovDegrees} degrees");

    /// <summary>Null when the camera is usable, else the first problem found.</summary>
    /// <param name="upIsDefault">True when up was not given (the default +y): a parallel view is then the target's fault.</param>
    public static CameraProblem? Check(Vector3 eye, Vector3 target, Vector3 up, float fovDegrees, bool upIsDefault = false)
    {
        if (!(fovDegrees >= MinFovDegrees && fovDegrees <= MaxFovDegrees))
            return new(CameraPart.Fov, $"{Text(fovDegrees)} is out of range; expected {FovRange}");

        // The view direction, computed as the tracer computes it.
        Vector3 view = target - eye;
        if (view == Vector3.Zero)
            return new(CameraPart.Target, "equals the eye; expected a point the camera looks at, away from the eye");
        if (!float.IsFinite(view.X) || !float.IsFinite(view.Y) || !float.IsFinite(view.Z))
            return new(CameraPart.Target, "is too far from the eye for single precision; expected a point nearer the eye");
        Vector3 forward = Vector3.Normalize(view);
        if (!IsUnit(forward))
        {
            return new(CameraPart.Target,
                $"lies {Text(Length(view))} voxels from the eye, too close to give a view direction in single precision; expected a point farther from the eye");
        }

        if (up == Vector3.Zero)
            return new(CameraPart.Up, "zero vector; expected an up direction across the view, such as (0, 1, 0)");
        // The angle between view and up in double, from the float inputs: |a × b| / (|a| |b|) = sin θ.
        double sine = Length(CrossD(view, up)) / (Length(view) * Length(up));
        if (!(sine >= MinUpSine))
        {
            string angle = $"sine of the angle between them {Text(sine)}, below {Text(MinUpSine)}";
            return upIsDefault
                ? new(CameraPart.Target, $"the camera looks along the default up direction (0, 1, 0) ({angle}); expected a target off the vertical through the eye, or an up direction across the view")
                : new(CameraPart.Up, $"lies along the view direction ({angle}); expected an up direction across the view");
        }

        // The rest of the basis, again as the tracer computes it.
        Vector3 right = Vector3.Normalize(Vector3.Cross(forward, up));
        Vector3 trueUp = Vector3.Cross(right, forward);
        if (!IsUnit(right) || !IsUnit(trueUp) || !Orthogonal(forward, right) || !Orthogonal(forward, trueUp) || !Orthogonal(right, trueUp))
        {
            return new(CameraPart.Up,
                $"has length {Text(Length(up))}, which single precision cannot turn into a camera basis; expected an up direction of ordinary length, such as (0, 1, 0)");
        }
        return null;
    }

    private static bool IsUnit(Vector3 v) => float.IsFinite(v.X) && float.IsFinite(v.Y) && float.IsFinite(v.Z)
        && Math.Abs(v.Length() - 1) <= BasisTolerance;

    private static bool Orthogonal(Vector3 a, Vector3 b) => Math.Abs(Vector3.Dot(a, b)) <= BasisTolerance;

    private static (double X, double Y, double Z) CrossD(Vector3 a, Vector3 b) =>
        ((double)a.Y * b.Z - (double)a.Z * b.Y, (double)a.Z * b.X - (double)a.X * b.Z, (double)a.X * b.Y - (double)a.Y * b.X);

    private static double Length((double X, double Y, double Z) v) => Math.Sqrt(v.X * v.X + v.Y * v.Y + v.Z * v.Z);

    private static double Length(Vector3 v) => Length(((double)v.X, (double)v.Y, (double)v.Z));

    private static string Text(double v) => v.ToString("G3", CultureInfo.InvariantCulture);
}
