using VoxProf.Core;

namespace VoxProf.Reports.Export;

/// <summary>
/// A report directory that only ever shows complete files: each is written under a temporary name beside its final
/// one and renamed over it when complete. Files it does not write are left alone. Safe for concurrent writers.
/// </summary>
public sealed class OutputDirectory
{
    private readonly object _lock = new();
    private readonly List<string> _written = [];

    private OutputDirectory(string path) => FullPath = path;

    public string FullPath { get; }

    /// <summary>File names written so far, in completion order.</summary>
    public IReadOnlyList<string> Written
    {
        get
        {
            lock (_lock)
                return _written.ToList();
        }
    }

    /// <summary>Creates the directory if needed and proves it writable; one clear <see cref="InputException"/> if not.</summary>
    public static OutputDirectory Open(string path)
    {
        string full = Path.GetFullPath(path);
        if (File.Exists(full))
            throw new InputException($"{path}: is a file, expected an output directory");
        try
        {
            Directory.CreateDirectory(full);
            string probe = Path.Combine(full, $".voxprof-probe-{Guid.NewGuid():N}.tmp");
            File.WriteAllBytes(probe, []);
            File.Delete(probe);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException or NotSupportedException)
        {
            throw new InputException($"{path}: cannot write the output directory ({ex.Message})", ex);
        }
        return new OutputDirectory(full);
    }

    /// <summary>Writes <paramref name="name"/> through <paramref name="write"/>; on any failure the old file (if any) stays.</summary>
    public void Write(string name, Action<Stream> write)
    {
        if (name.IndexOfAny(['/', '\\']) >= 0 || name.StartsWith('.'))
            throw new ArgumentException($"not a plain file name: {name}", nameof(name));
        string final = Path.Combine(FullPath, name);
        string temp = Path.Combine(FullPath, $".{name}.{Guid.NewGuid():N}.tmp");
        try
        {
            using (var stream = new FileStream(temp, FileMode.CreateNew, FileAccess.Write, FileShare.None, 1 << 16))
            {
                write(stream);
                stream.Flush(flushToDisk: false);
            }
            File.Move(temp, final, overwrite: true);
        }
        catch
        {
            TryDelete(temp);
            throw;
        }
        lock (_lock)
            _written.Add(name);
    }

    public void WriteText(string name, Action<TextWriter> write) =>
        Write(name, s =>
        {
            using var w = new StreamWriter(s, new System.Text.UTF8Encoding(false), 1 << 16, leaveOpen: true);
            write(w);
        });

    private static void TryDelete(string path)
    {
        try
        {
            File.Delete(path);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            // Best effort: a leftover .tmp is hidden and never mistaken for a report file.
        }
    }
}
