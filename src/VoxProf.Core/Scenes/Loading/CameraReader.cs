using System.Numerics;
using VoxProf.Core.Scenes.Paths;

namespace VoxProf.Core.Scenes.Loading;

/// <summary>Reads the entries of a scene's <c>cameras</c> list: cameras, and camera paths (docs/scene-format.md, "Camera paths").</summary>
internal static class CameraReader
{
    /// <summary>Up and field of view as a camera or path gives them, with their JSON values for messages.</summary>
    private sealed record Lens(Vector3 Up, JsonValue? UpValue, float Fov, JsonValue? FovValue);

    public static CameraSpec ReadCamera(JsonValue value)
    {
        JsonObjectReader c = value.AsObject("an object holding a camera");
        c.AllowOnly("in a camera", "name", "eye", "target", "up", "fovY");
        JsonValue nameValue = c.Required("name", "a camera name");
        string name = nameValue.String("a non-empty camera name");
        if (name.Length == 0)
            throw nameValue.Error("empty; expected a non-empty camera name");
        JsonValue eyeValue = c.Required("eye", "[x, y, z] eye position");
        JsonValue targetValue = c.Required("target", "[x, y, z] point looked at");
        Vector3 eye = eyeValue.Vector("[x, y, z] eye position");
        Vector3 target = targetValue.Vector("[x, y, z] point looked at");
        Lens lens = ReadLens(c);
        Check(eye, target, lens, targetValue);
        return new CameraSpec(name, eye, target, lens.Up, lens.Fov);
    }

    public static CameraPath ReadPath(JsonValue value)
    {
        JsonObjectReader c = value.AsObject("an object holding a camera");
        c.AllowOnly("in a camera path", "name", "path", "up", "fovY");
        JsonValue nameValue = c.Required("name", "a camera path name");
        string name = nameValue.String("a non-empty camera path name");
        if (name.Length == 0)
            throw nameValue.Error("empty; expected a non-empty camera path name");
        if (name.Contains(CameraPath.FrameSeparator, StringComparison.Ordinal) || name.Contains(',', StringComparison.Ordinal))
            throw nameValue.Error($"\"{MessageText.Excerpt(name)}\" contains '{CameraPath.FrameSeparator}' or ','; expected a path name without them (frames are named NAME{CameraPath.FrameSeparator}000, and --camera lists names with commas)");
        Lens lens = ReadLens(c);

        JsonObjectReader p = c.Required("path", "an object with keys, frames and interpolation").AsObject("an object with keys, frames and interpolation");
        p.AllowOnly("in a camera path's path", "keys", "frames", "interpolation");
        JsonValue[] keyValues = p.Required("keys", "an array of at least two {\"eye\", \"target\"} keys").AsArray("an array of at least two {\"eye\", \"target\"} keys");
        if (keyValues.Length < 2)
            throw new SceneFormatException(value.File, p.Child("keys"), $"holds {keyValues.Length} key{(keyValues.Length == 1 ? "" : "s")}; expected at least two");
        var keys = new List<PathKey>(keyValues.Length);
        foreach (JsonValue k in keyValues)
        {
            JsonObjectReader key = k.AsObject("a key {\"eye\": [x, y, z], \"target\": [x, y, z]}");
            key.AllowOnly("in a path key", "eye", "target");
            Vector3 eye = key.Required("eye", "[x, y, z] eye position").Vector("[x, y, z] eye position");
            JsonValue targetValue = key.Required("target", "[x, y, z] point looked at");
            Vector3 target = targetValue.Vector("[x, y, z] point looked at");
            Check(eye, target, lens, targetValue);
            keys.Add(new PathKey(eye, target));
        }
        int frames = p.Required("frames", $"a number of frames from 2 to {CameraPath.MaxFrames}").Int($"a number of frames from 2 to {CameraPath.MaxFrames}", 2, CameraPath.MaxFrames);
        var interpolation = PathInterpolation.CatmullRom;
        if (p.Optional("interpolation") is { } i)
            interpolation = i.Choice("linear", "catmull-rom") == "linear" ? PathInterpolation.Linear : PathInterpolation.CatmullRom;

        var path = new CameraPath(name, keys, frames, interpolation, lens.Up, lens.Fov);
        // Keys pass the camera checks; a curve between them can still turn a frame along up or onto its target.
        for (int frame = 0; frame < frames; frame++)
        {
            CameraSpec view = path.Frame(frame);
            if (CameraChecks.Check(view.Eye, view.Target, view.Up, view.FovYDegrees, lens.UpValue is null) is { } problem)
                throw new SceneFormatException(value.File, p.Child("keys"), $"frame {view.Name}: {problem.Message}; move the keys apart or add one between them");
        }
        return path;
    }

    /// <summary>A frame name that is also a camera's name would make --camera ambiguous.</summary>
    public static void RequireDistinctFrames(string file, IReadOnlyList<CameraSpec> cameras, IReadOnlyList<CameraPath> paths)
    {
        if (paths.Count == 0)
            return;
        var frames = new HashSet<string>(StringComparer.OrdinalIgnoreCase);
        foreach (CameraPath path in paths)
        {
            for (int f = 0; f < path.Frames; f++)
                frames.Add(path.FrameName(f));
        }
        for (int i = 0; i < cameras.Count; i++)
        {
            if (frames.Contains(cameras[i].Name))
                throw new SceneFormatException(file, "$.cameras", $"camera \"{MessageText.Excerpt(cameras[i].Name)}\" has the name of a path's frame; expected camera names that differ from NAME#000 frame names");
        }
    }

    private static Lens ReadLens(JsonObjectReader c)
    {
        Vector3 up = Vector3.UnitY;
        JsonValue? upValue = c.Optional("up");
        if (upValue is { } u)
            up = u.Vector("[x, y, z] up direction");
        float fov = 60;
        JsonValue? fovValue = c.Optional("fovY");
        if (fovValue is { } f)
            fov = (float)f.Number(CameraChecks.FovRange, CameraChecks.MinFovDegrees, CameraChecks.MaxFovDegrees);
        return new Lens(up, upValue, fov, fovValue);
    }

    // The camera checks, blaming the field at fault: up, fovY, or else the target.
    private static void Check(Vector3 eye, Vector3 target, Lens lens, JsonValue targetValue)
    {
        if (CameraChecks.Check(eye, target, lens.Up, lens.Fov, upIsDefault: lens.UpValue is null) is not { } problem)
            return;
        JsonValue at = problem.Part switch
        {
            CameraPart.Up => lens.UpValue!.Value,
            CameraPart.Fov => lens.FovValue!.Value,
            _ => targetValue,
        };
        throw at.Error(problem.Message);
    }
}
