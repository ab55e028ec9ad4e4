using System.Globalization;
using System.Security.Cryptography;

namespace VoxProf.Core.Scenes.Import;

/// <summary>The mesh formats a <c>mesh</c> layer reads, chosen by file extension unless the scene names one.</summary>
public static class MeshFiles
{
    /// <summary>Values of the <c>format</c> key.</summary>
    public static readonly string[] Formats = ["obj", "stl", "ply", "gltf", "glb"];

    /// <summary>The format a file name implies, or null when its extension is not one of <see cref="Formats"/>.</summary>
    public static string? FormatOf(string path)
    {
        string ext = Path.GetExtension(path).TrimStart('.').ToLowerInvariant();
        return Formats.Contains(ext) ? ext : null;
    }

    /// <summary>
    /// Reads a mesh file. Every byte read (and, for glTF, every external buffer) is appended to <paramref name="hash"/>
    /// when given. Problems inside the file throw <see cref="SceneFormatException"/> naming the line or byte offset.
    /// </summary>
    /// <param name="sceneDirectory">Folder glTF external URIs must stay inside.</param>
    /// <param name="realPaths">Check glTF external files by their real paths (symbolic links followed), as
    /// <see cref="SceneLoadOptions.ConfineFiles"/> asks.</param>
    public static TriangleMesh Read(string path, string format, string sceneDirectory, IncrementalHash? hash = null, bool realPaths = false)
    {
        long length = new FileInfo(path).Length;
        if (format is "gltf" or "glb")
        {
            if (length > GltfReader.MaxBytes)
            {
                throw new SceneFormatException(path, "$", string.Create(CultureInfo.InvariantCulture,
                    $"file holds {length} bytes; expected at most {GltfReader.MaxBytes}"));
            }
            byte[] bytes = File.ReadAllBytes(path);
            hash?.AppendData(bytes);
            return GltfReader.Read(bytes, path, sceneDirectory, b => hash?.AppendData(b), realPaths);
        }

        using Stream file = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 16);
        using var stream = new HashingStream(file, hash);
        TriangleMesh mesh = format switch
        {
            "obj" => ObjReader.Read(stream, path),
            "stl" => StlReader.Read(stream, length, path),
            _ => PlyReader.Read(stream, length, path),
        };
        stream.Drain();
        return mesh;
    }
}
