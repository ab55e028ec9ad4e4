using System.Security.Cryptography;
using System.Text.Json;
using System.Text.Json.Serialization;
using VoxProf.Core;

namespace VoxProf.Reports.Export;

/// <summary>One file of a run's folder: its name, length and SHA-256 (lower-case hex).</summary>
public sealed record ManifestFile(string Name, long Bytes, string Sha256);

/// <summary>
/// manifest.json, written last into every output folder (docs/reports.md): the run's id and every file the run
/// wrote. A reader checks the files it uses against it, so a folder whose files come from two runs is refused.
/// </summary>
public sealed record ReportManifest(string Tool, string Version, string RunId, IReadOnlyList<ManifestFile> Files)
{
    public const string FileName = "manifest.json";

    /// <summary>Largest manifest read: a few kilobytes normally.</summary>
    public const long MaxBytes = 16L << 20;

    private static readonly JsonSerializerOptions Options = new(JsonSerializerDefaults.Web)
    {
        WriteIndented = true,
        RespectRequiredConstructorParameters = true,
        RespectNullableAnnotations = true,
        DefaultIgnoreCondition = JsonIgnoreCondition.Never,
        TypeInfoResolver = Model.DocumentJson.Default,
    };

    public byte[] ToJson() => JsonSerializer.SerializeToUtf8Bytes(this, Options);

    /// <summary>The manifest of <paramref name="folder"/>, or null when it has none; a damaged one is an <see cref="InputException"/>.</summary>
    public static ReportManifest? Read(string folder)
    {
        string path = Path.Combine(folder, FileName);
        if (!File.Exists(path))
            return null;
        var info = new FileInfo(path);
        if (info.Length > MaxBytes)
            throw new InputException($"{path}: holds {info.Length} bytes; expected a manifest of at most {MaxBytes}");
        try
        {
            var manifest = JsonSerializer.Deserialize<ReportManifest>(JsonText.WithoutBom(File.ReadAllBytes(path)).Span, Options);
            if (manifest is null || manifest.Files.Any(f => f is null || f.Bytes < 0 || f.Name.Length == 0))
                throw new InputException($"{path}: damaged manifest; expected the list of files voxprof wrote");
            return manifest;
        }
        catch (Exception ex) when (ex is JsonException or InvalidOperationException)
        {
            throw new InputException($"{path}: damaged manifest ({MessageText.CutEchoes(ex.Message)}); expected the list of files voxprof wrote", ex);
        }
    }

    /// <summary>
    /// The manifest of <paramref name="folder"/> and its file <paramref name="name"/>'s bytes, checked against it;
    /// <paramref name="expected"/> says in the error what the folder should have been when it has no manifest.
    /// </summary>
    public static (ReportManifest Manifest, byte[] Bytes) ReadListed(string folder, string name, string expected)
    {
        ReportManifest manifest = Read(folder) ?? throw new InputException($"{folder}: has no {FileName}; expected {expected}");
        byte[] bytes = File.ReadAllBytes(Path.Combine(folder, name));
        manifest.Verify(folder, name, bytes);
        return (manifest, bytes);
    }

    /// <summary>
    /// Throws an <see cref="InputException"/> unless <paramref name="bytes"/> are the content the manifest lists for
    /// <paramref name="name"/> (a file it does not list, or one whose length or hash differs, is from another run).
    /// </summary>
    public void Verify(string folder, string name, ReadOnlySpan<byte> bytes)
    {
        ManifestFile? entry = Files.FirstOrDefault(f => string.Equals(f.Name, name, StringComparison.Ordinal));
        string path = Path.Combine(folder, name);
        if (entry is null)
            throw new InputException($"{path}: not listed in {FileName} of run {RunId}; the folder mixes files of different runs, trace again");
        if (entry.Bytes != bytes.Length || !string.Equals(entry.Sha256, Hash(bytes), StringComparison.OrdinalIgnoreCase))
            throw new InputException($"{path}: differs from what {FileName} lists for run {RunId} ({bytes.Length} bytes, expected {entry.Bytes}); the folder mixes files of different runs, trace again");
    }

    public static string Hash(ReadOnlySpan<byte> bytes) => Convert.ToHexStringLower(SHA256.HashData(bytes));
}
