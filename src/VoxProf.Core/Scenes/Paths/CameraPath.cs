using System.Globalization;
using System.Numerics;

namespace VoxProf.Core.Scenes.Paths;

/// <summary>How a camera path moves between its keys.</summary>
public enum PathInterpolation
{
    /// <summary>Straight lines between keys: corners at the keys.</summary>
    Linear,
    /// <summary>Centripetal Catmull–Rom through the keys (<see cref="CatmullRom"/>).</summary>
    CatmullRom,
}

/// <summary>One key of a camera path: where the camera is and what it looks at.</summary>
public sealed record PathKey(Vector3 Eye, Vector3 Target);

/// <summary>
/// A named camera path of a scene file: <see cref="Frames"/> views named NAME#000, NAME#001, …, the first at the first
/// key and the last at the last, each pair of neighbouring keys taking an equal share of the frames. Eye and target
/// follow their own curves through the keys; up and the field of view are the path's.
/// </summary>
public sealed record CameraPath(string Name, IReadOnlyList<PathKey> Keys, int Frames, PathInterpolation Interpolation,
    Vector3 Up, float FovYDegrees)
{
    /// <summary>The separator between a path's name and a frame number.</summary>
    public const char FrameSeparator = '#';

    /// <summary>Most frames one path may have.</summary>
    public const int MaxFrames = 100_000;

    /// <summary>"walk#007": the frame number zero-padded to at least three digits, more when the path needs them.</summary>
    public string FrameName(int frame)
    {
        int digits = Math.Max(3, (Frames - 1).ToString(CultureInfo.InvariantCulture).Length);
        return Name + FrameSeparator + frame.ToString("D" + digits.ToString(CultureInfo.InvariantCulture), CultureInfo.InvariantCulture);
    }

    /// <summary>Key parameter of a frame: 0 at the first key, Keys.Count − 1 at the last.</summary>
    public double KeyParameter(int frame) => Frames == 1 ? 0 : (double)frame * (Keys.Count - 1) / (Frames - 1);

    /// <summary>The camera of one frame.</summary>
    public CameraSpec Frame(int frame)
    {
        if ((uint)frame >= (uint)Frames)
            throw new ArgumentOutOfRangeException(nameof(frame));
        double u = KeyParameter(frame);
        Vector3[] eyes = Keys.Select(k => k.Eye).ToArray();
        Vector3[] targets = Keys.Select(k => k.Target).ToArray();
        Vector3 eye = Interpolation == PathInterpolation.Linear ? CatmullRom.Linear(eyes, u) : CatmullRom.Point(eyes, u);
        Vector3 target = Interpolation == PathInterpolation.Linear ? CatmullRom.Linear(targets, u) : CatmullRom.Point(targets, u);
        return new CameraSpec(FrameName(frame), eye, target, Up, FovYDegrees);
    }

    /// <summary>Every frame in order.</summary>
    public IReadOnlyList<CameraSpec> AllFrames() => Enumerable.Range(0, Frames).Select(Frame).ToArray();
}
