using System.Globalization;
using System.Security.Cryptography;
using System.Text.Json;
using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes.Loading;
using VoxProf.Core.Scenes.Paths;

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

    /// <summary>Largest scene file read: scenes are a few kilobytes; anything this large is not one.</summary>
    public const long MaxSceneBytes = 64L << 20;

    /// <summary>Loads and validates a scene; throws <see cref="SceneFormatException"/> naming the file and JSON path.</summary>
    public static Scene Load(string path) => Load(path, SceneLoadOptions.Default);

    /// <summary>Loads and validates a scene with the given checks on the files it names.</summary>
    public static Scene Load(string path, SceneLoadOptions options)
    {
        ArgumentNullException.ThrowIfNull(options);
        byte[] bytes = ReadFile(path, path, "$", "scene file", MaxSceneBytes);
        ReadOnlyMemory<byte> text = JsonText.WithoutBom(bytes);
        if (JsonText.FindInvalidUtf8(text.Span) is { } notUtf8)
            throw new SceneFormatException(path, notUtf8.Where, notUtf8.Problem);
        using JsonDocument doc = Parse(path, text);
        if (JsonText.FindLoneSurrogate(doc.RootElement) is { } lone)
            throw new SceneFormatException(path, lone.Where, lone.Problem);
        var root = new JsonValue(doc.RootElement, "$", path).AsObject("an object holding a scene");
        root.AllowOnly("in a scene", "version", "description", "extent", "layers", "cameras");

        root.Optional("version")?.Int(FormatVersion.ToString(CultureInfo.InvariantCulture), FormatVersion, FormatVersion);
        string? description = root.Optional("description")?.String();

        int[] e = root.Required("extent", "[x, y, z] voxel counts").Ints("[x, y, z] voxel counts", 3, 1,
            Scene.MaxExtent, $"an integer from 1 to {Scene.MaxExtent.ToString(CultureInfo.InvariantCulture)}");
        var extent = new Box3i(0, 0, 0, e[0], e[1], e[2]);

        using var hash = IncrementalHash.CreateHash(HashAlgorithmName.SHA256);
        hash.AppendData(bytes);
        var reader = new LayerReader(path, Path.GetDirectoryName(Path.GetFullPath(path)) ?? ".", extent, hash, options.ConfineFiles);
        JsonValue[] layerValues = root.Required("layers", "an array of layers").AsArray("an array of layers");
        var layers = layerValues.Select(reader.Read).ToArray();

        JsonValue[] cameraValues = root.Required("cameras", "an array of cameras").AsArray("an array of cameras");
        if (cameraValues.Length == 0)
            throw new SceneFormatException(path, "$.cameras", "empty; expected at least one camera (the first is the default)");
        var cameras = new List<CameraSpec>(cameraValues.Length);
        var paths = new List<CameraPath>();
        var order = new List<string>(cameraValues.Length);
        var names = new HashSet<string>(StringComparer.Ordinal);
        foreach (JsonValue c in cameraValues)
        {
            bool isPath = c.Element.ValueKind == JsonValueKind.Object && c.Element.TryGetProperty("path", out _);
            CameraPath? cameraPath = isPath ? CameraReader.ReadPath(c) : null;
            CameraSpec? camera = isPath ? null : CameraReader.ReadCamera(c);
            string name = cameraPath?.Name ?? camera!.Name;
            // A set, not a search of the list so far: a scene of 50,000 cameras loads in linear time.
            if (!names.Add(name))
                throw new SceneFormatException(path, c.Path + ".name", $"duplicate camera name \"{MessageText.Excerpt(name)}\"; expected unique names");
            order.Add(name);
            if (cameraPath is not null)
                paths.Add(cameraPath);
            else
                cameras.Add(camera!);
        }
        CameraReader.RequireDistinctFrames(path, cameras, paths);

        string contentHash = Convert.ToHexStringLower(hash.GetHashAndReset());
        return new Scene(e[0], e[1], e[2], layers, cameras, NameOf(path), path, contentHash)
        {
            Description = description,
            Paths = paths,
            CameraOrder = order,
        };
    }

    /// <summary>The scene name for a path: the file name without <see cref="Extension"/> (or its last extension).</summary>
    public static string NameOf(string path)
    {
        string file = Path.GetFileName(path);
        return file.EndsWith(Extension, StringComparison.OrdinalIgnoreCase)
            ? file[..^Extension.Length]
            : Path.GetFileNameWithoutExtension(file);
    }

    /// <summary>
    /// Reads a whole file the scene needs, refusing a folder, a missing file and anything over
    /// <paramref name="maxBytes"/>: by its length when it has one, else (a device, a pipe) by reading one byte past it.
    /// </summary>
    internal static byte[] ReadFile(string sceneFile, string path, string where, string what, long maxBytes)
    {
        string full = Path.GetFullPath(path);
        if (Directory.Exists(full))
            throw new SceneFormatException(sceneFile, where, $"{what} {full} is a folder; expected a file");
        try
        {
            using var stream = new FileStream(full, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 16);
            if (stream.CanSeek && stream.Length > maxBytes)
                throw TooLarge(sceneFile, where, what, full, stream.Length.ToString("N0", CultureInfo.InvariantCulture), maxBytes);
            using var copy = new MemoryStream(stream.CanSeek ? (int)stream.Length : 1 << 16);
            var buffer = new byte[1 << 16];
            int n;
            while ((n = stream.Read(buffer, 0, (int)Math.Min(buffer.Length, maxBytes + 1 - copy.Length))) > 0)
            {
                copy.Write(buffer, 0, n);
                if (copy.Length > maxBytes)
                    throw TooLarge(sceneFile, where, what, full, "more than " + maxBytes.ToString("N0", CultureInfo.InvariantCulture), maxBytes);
            }
            return copy.ToArray();
        }
        catch (Exception ex) when (ex is FileNotFoundException or DirectoryNotFoundException)
        {
            throw new SceneFormatException(sceneFile, where, $"{what} not found: {full}");
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            throw new SceneFormatException(sceneFile, where, $"{what} cannot be read: {full} ({ex.Message})");
        }
    }

    private static SceneFormatException TooLarge(string sceneFile, string where, string what, string full, string found, long maxBytes) =>
        new(sceneFile, where, string.Create(CultureInfo.InvariantCulture,
            $"{what} {full} holds {found} bytes; expected at most {maxBytes:N0}"));

    private static JsonDocument Parse(string path, ReadOnlyMemory<byte> bytes)
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
            throw new SceneFormatException(path, $"line {line}, column {column}", $"malformed JSON: {MessageText.CutEchoes(detail)}");
        }
    }
}
