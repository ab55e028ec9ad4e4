using System.Globalization;
using System.Numerics;
using System.Security.Cryptography;
using System.Text.Json;
using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes.Loading;

namespace VoxProf.Core.Scenes;

/// <summary>Reads a scene file (JSON; format in docs/scene-format.md).</summary>
public static class SceneLoader
{
    /// <summary>The file name ending a scene file should have; <see cref="Scene.Name"/> is the name without it.</summary>
    public const string Extension = ".vpscene.json";

    /// <summary>Format version written in <c>"version"</c>.</summary>
    public const int FormatVersion = 1;

    private static readonly JsonDocumentOptions Options = new()
    {
        CommentHandling = JsonCommentHandling.Skip,
        AllowTrailingCommas = false,
        MaxDepth = 32,
    };

    /// <summary>Loads and validates a scene; throws <see cref="SceneFormatException"/> naming the file and JSON path.</summary>
    public static Scene Load(string path)
    {
        byte[] bytes = ReadFile(path, path, "$", "scene file");
        using JsonDocument doc = Parse(path, bytes);
        var root = new JsonValue(doc.RootElement, "$", path).AsObject("an object holding a scene");
        root.AllowOnly("in a scene", "version", "description", "extent", "layers", "cameras");

        root.Optional("version")?.Int(FormatVersion.ToString(CultureInfo.InvariantCulture), FormatVersion, FormatVersion);
        string? description = root.Optional("description")?.String();

        int[] e = root.Required("extent", "[x, y, z] voxel counts").Ints("[x, y, z] voxel counts", 3, 1,
            Scene.MaxExtent, $"an integer from 1 to {Scene.MaxExtent.ToString(CultureInfo.InvariantCulture)}");
        var extent = new Box3i(0, 0, 0, e[0], e[1], e[2]);

        using var hash = IncrementalHash.CreateHash(HashAlgorithmName.SHA256);
        hash.AppendData(bytes);
        var reader = new LayerReader(path, Path.GetDirectoryName(Path.GetFullPath(path)) ?? ".", extent, hash);
        JsonValue[] layerValues = root.Required("layers", "an array of layers").AsArray("an array of layers");
        var layers = layerValues.Select(reader.Read).ToArray();

        JsonValue[] cameraValues = root.Required("cameras", "an array of cameras").AsArray("an array of cameras");
        if (cameraValues.Length == 0)
            throw new SceneFormatException(path, "$.cameras", "empty; expected at least one camera (the first is the default)");
        var cameras = new List<CameraSpec>();
        foreach (JsonValue c in cameraValues)
        {
            CameraSpec camera = ReadCamera(c);
            if (cameras.Any(k => k.Name == camera.Name))
                throw new SceneFormatException(path, c.Path + ".name", $"duplicate camera name \"{camera.Name}\"; expected unique names");
            cameras.Add(camera);
        }

        string contentHash = Convert.ToHexStringLower(hash.GetHashAndReset());
        return new Scene(e[0], e[1], e[2], layers, cameras, NameOf(path), path, contentHash) { Description = description };
    }

    /// <summary>The scene name for a path: the file name without <see cref="Extension"/> (or its last extension).</summary>
    public static string NameOf(string path)
    {
        string file = Path.GetFileName(path);
        return file.EndsWith(Extension, StringComparison.OrdinalIgnoreCase)
            ? file[..^Extension.Length]
            : Path.GetFileNameWithoutExtension(file);
    }

    internal static byte[] ReadFile(string sceneFile, string path, string where, string what)
    {
        try
        {
            return File.ReadAllBytes(path);
        }
        catch (Exception ex) when (ex is FileNotFoundException or DirectoryNotFoundException)
        {
            throw new SceneFormatException(sceneFile, where, $"{what} not found: {path}");
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            throw new SceneFormatException(sceneFile, where, $"{what} cannot be read: {path} ({ex.Message})");
        }
    }

    private static JsonDocument Parse(string path, byte[] bytes)
    {
        try
        {
            return JsonDocument.Parse(bytes, Options);
        }
        catch (JsonException ex)
        {
            long line = (ex.LineNumber ?? 0) + 1, column = (ex.BytePositionInLine ?? 0) + 1;
            string detail = ex.Message;
            int cut = detail.IndexOf(" LineNumber:", StringComparison.Ordinal);
            if (cut > 0)
                detail = detail[..cut].TrimEnd(' ', '|');
            throw new SceneFormatException(path, $"line {line}, column {column}", $"malformed JSON: {detail}");
        }
    }

    private static CameraSpec ReadCamera(JsonValue value)
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
        Vector3 up = Vector3.UnitY;
        JsonValue? upValue = c.Optional("up");
        if (upValue is { } u)
            up = u.Vector("[x, y, z] up direction");
        float fov = 60;
        JsonValue? fovValue = c.Optional("fovY");
        if (fovValue is { } f)
            fov = (float)f.Number(CameraChecks.FovRange, CameraChecks.MinFovDegrees, CameraChecks.MaxFovDegrees);

        if (CameraChecks.Check(eye, target, up, fov, upIsDefault: upValue is null) is { } problem)
        {
            JsonValue at = problem.Part switch
            {
                CameraPart.Up => upValue!.Value,
                CameraPart.Fov => fovValue!.Value,
                _ => targetValue,
            };
            throw at.Error(problem.Message);
        }
        return new CameraSpec(name, eye, target, up, fov);
    }
}
