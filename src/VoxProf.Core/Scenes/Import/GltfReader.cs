using System.Globalization;
using System.Numerics;
using System.Runtime.CompilerServices;
using SharpGLTF.Schema2;
using SharpGLTF.Validation;
using VoxProf.Core.Scenes.Loading;

namespace VoxProf.Core.Scenes.Import;

/// <summary>
/// glTF 2.0 (<c>.gltf</c> with its buffers, or <c>.glb</c>) through SharpGLTF: every triangle primitive of every node
/// of the default scene (the first scene when none is marked default), positions transformed by the node's world
/// matrix. Point and line primitives are skipped. Every external URI must resolve inside the scene's folder, and
/// every file read counts towards the size limit.
/// </summary>
internal static class GltfReader
{
    /// <summary>Largest total of the glTF file and the external files it names.</summary>
    public const long MaxBytes = 1L << 31;

    public static TriangleMesh Read(byte[] bytes, string file, string sceneDirectory, Action<byte[]> hash, bool realPaths = false)
    {
        string folder = Path.GetDirectoryName(Path.GetFullPath(file)) ?? ".";
        string sceneFolder = realPaths ? ScenePaths.Real(sceneDirectory) : Path.GetFullPath(sceneDirectory);
        string root = Path.TrimEndingDirectorySeparator(sceneFolder) + Path.DirectorySeparatorChar;
        var total = new StrongBox<long>(bytes.LongLength);
        ModelRoot model;
        try
        {
            var context = ReadContext.Create(uri => new ArraySegment<byte>(ReadExternal(uri, file, folder, root, total, hash, realPaths)));
            context.Validation = ValidationMode.Strict;
            model = context.ReadSchema2(new MemoryStream(bytes, writable: false));
        }
        catch (Exception ex) when (ex is ModelException or InvalidDataException or FormatException or ArgumentException
            or InvalidOperationException or System.Text.Json.JsonException or EndOfStreamException or NotSupportedException)
        {
            throw new SceneFormatException(file, "$", "not a valid glTF 2.0 file: " + OneLine(ex.Message));
        }

        var builder = new MeshBuilder(file);
        SharpGLTF.Schema2.Scene? scene = model.DefaultScene ?? model.LogicalScenes.FirstOrDefault();
        if (scene is null)
            throw new SceneFormatException(file, "$.scenes", "no scene; expected a scene whose nodes hold meshes");
        foreach (Node node in Node.Flatten(scene))
        {
            if (node.Mesh is null)
                continue;
            Matrix4x4 world = node.WorldMatrix;
            foreach (MeshPrimitive primitive in node.Mesh.Primitives)
            {
                if (primitive.DrawPrimitiveType is not (PrimitiveType.TRIANGLES or PrimitiveType.TRIANGLE_STRIP or PrimitiveType.TRIANGLE_FAN))
                    continue;
                string where = string.Create(CultureInfo.InvariantCulture,
                    $"$.meshes[{node.Mesh.LogicalIndex}].primitives[{primitive.LogicalIndex}]");
                Accessor? positions = primitive.GetVertexAccessor("POSITION");
                if (positions is null)
                    throw new SceneFormatException(file, where, "no POSITION attribute; expected vertex positions");
                var ids = new int[positions.Count];
                int v = 0;
                foreach (Vector3 p in positions.AsVector3Array())
                {
                    Vector3 q = Vector3.Transform(p, world);
                    ids[v] = builder.AddVertex(q.X, q.Y, q.Z, string.Create(CultureInfo.InvariantCulture, $"{where} vertex {v}"));
                    v++;
                }
                foreach (var (a, b, c) in primitive.GetTriangleIndices())
                {
                    if ((uint)a >= ids.Length || (uint)b >= ids.Length || (uint)c >= ids.Length)
                    {
                        throw new SceneFormatException(file, where, string.Create(CultureInfo.InvariantCulture,
                            $"index out of range ({a}, {b}, {c}); expected 0 to {ids.Length - 1}"));
                    }
                    builder.AddTriangle(ids[a], ids[b], ids[c], where);
                }
            }
        }
        if (builder.TriangleCount == 0)
            throw new SceneFormatException(file, "$", "no triangles in the default scene; expected a mesh with triangle primitives");
        return builder.Build();
    }

    private static byte[] ReadExternal(string uri, string file, string folder, string root, StrongBox<long> total,
        Action<byte[]> hash, bool realPaths)
    {
        string where = "uri \"" + uri + "\"";
        if (uri.Contains(':', StringComparison.Ordinal) || uri.StartsWith('/') || uri.StartsWith('\\'))
            throw new SceneFormatException(file, where, "absolute or external URI; expected a path relative to the glTF file, inside the scene's folder");
        string decoded = Uri.UnescapeDataString(uri);
        if (decoded.Contains('\0', StringComparison.Ordinal))
            throw new SceneFormatException(file, where, "contains a NUL character; expected a path relative to the glTF file");
        string path = Path.GetFullPath(Path.Combine(folder, decoded));
        if (realPaths)
            path = ScenePaths.Real(path);
        if (!path.StartsWith(root, StringComparison.Ordinal))
            throw new SceneFormatException(file, where, $"resolves to {path}, outside the scene's folder {root}; expected a file inside it");
        if (!File.Exists(path))
            throw new SceneFormatException(file, where, $"file not found: {path}");
        total.Value += new FileInfo(path).Length;
        if (total.Value > MaxBytes)
        {
            throw new SceneFormatException(file, where, string.Create(CultureInfo.InvariantCulture,
                $"the glTF and its files exceed {MaxBytes} bytes; expected at most that"));
        }
        byte[] data = File.ReadAllBytes(path);
        hash(data);
        return data;
    }

    private static string OneLine(string message)
    {
        string first = message.ReplaceLineEndings(" ").Trim();
        int cut = first.IndexOf("Model generated by", StringComparison.Ordinal);
        return cut > 0 ? first[..cut].Trim() : first;
    }
}
