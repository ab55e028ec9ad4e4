using VoxProf.Core;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Export;

/// <summary>
/// An output folder that changes all at once (docs/reports.md, "The output folder"): a run writes into a hidden
/// sibling folder and <see cref="Commit"/> swaps it in whole, with <see cref="ReportManifest.FileName"/> listing what
/// it wrote, so a killed run leaves the previous folder as it was and two runs never mix their files. A second
/// run into the same folder is refused while the first holds its lock. Safe for concurrent writes of different files.
/// </summary>
public sealed class OutputDirectory : IDisposable
{
    private readonly object _sync = new();
    private readonly List<ManifestFile> _written = [];
    private readonly FileStream _lock;
    private readonly string _stage;
    private readonly string _parent;
    private readonly string _name;
    private bool _committed;
    private bool _disposed;

    // A subfolder (Folder) shares its root's stage, lock and manifest; only the root commits.
    private readonly OutputDirectory? _root;
    private readonly string _prefix = "";

    private OutputDirectory(string path, string parent, string name, string stage, FileStream held)
    {
        FullPath = path;
        _parent = parent;
        _name = name;
        _stage = stage;
        _lock = held;
        RunId = Guid.NewGuid().ToString("N");
    }

    private OutputDirectory(OutputDirectory root, string prefix)
    {
        _root = root;
        _prefix = prefix;
        FullPath = Path.Combine(root.FullPath, prefix);
        _parent = root._parent;
        _name = root._name;
        _stage = root._stage;
        _lock = root._lock;
        RunId = root.RunId;
    }

    /// <summary>The folder the files end up in (after <see cref="Commit"/>).</summary>
    public string FullPath { get; }

    /// <summary>
    /// Where this run's files are until <see cref="Commit"/> puts them at <see cref="FullPath"/>: an exporter that
    /// reads a file written earlier in the run (a page inlining its images) reads it here.
    /// </summary>
    public string WorkingPath => _root is { } root ? Path.Combine(root.WorkingPath, _prefix) : _committed ? FullPath : _stage;

    /// <summary>A fresh id for this run, written into the manifest.</summary>
    public string RunId { get; }

    /// <summary>File names written so far, in completion order (for a subfolder, those inside it, relative to it).</summary>
    public IReadOnlyList<string> Written
    {
        get
        {
            if (_root is { } root)
            {
                string start = _prefix + "/";
                return root.Written.Where(n => n.StartsWith(start, StringComparison.Ordinal)).Select(n => n[start.Length..]).ToList();
            }
            lock (_sync)
                return _written.Select(f => f.Name).ToList();
        }
    }

    /// <summary>
    /// A subfolder of this run's folder (one run of several views writes one per view), written through the same
    /// stage and committed with it: its files are listed in the root's manifest as "FOLDER/NAME".
    /// </summary>
    /// <param name="relative">Plain names joined by '/', such as "views/main-street".</param>
    public OutputDirectory Folder(string relative)
    {
        if (!IsRelativePath(relative))
            throw new ArgumentException($"not a plain relative folder: {relative}", nameof(relative));
        return _root is { } root ? root.Folder(_prefix + "/" + relative) : new OutputDirectory(this, relative);
    }

    private static bool IsRelativePath(string relative) =>
        relative.Length > 0 && !relative.Contains('\\', StringComparison.Ordinal) &&
        relative.Split('/').All(part => part.Length > 0 && !part.StartsWith('.') && part != ReportManifest.FileName);

    /// <summary>Refuses an empty path (<c>--out ''</c>) or one naming a file, before any slow work.</summary>
    public static void CheckPath(string? path, string option)
    {
        if (path is null)
            return;
        if (string.IsNullOrWhiteSpace(path))
            throw new InputException($"{option}: empty; expected an output folder path");
        if (path.Contains('\0', StringComparison.Ordinal))
            throw new InputException($"{option}: the path contains a NUL character; expected an output folder path");
        if (File.Exists(path))
            throw new InputException($"{path}: is a file, expected an output directory");
    }

    /// <summary>
    /// Locks the folder, removes what dead runs left beside it and prepares the hidden folder this run writes into,
    /// proving the parent writable; one clear <see cref="InputException"/> if any of that fails.
    /// </summary>
    public static OutputDirectory Open(string path)
    {
        CheckPath(path, "output folder");
        string full = Path.TrimEndingDirectorySeparator(Path.GetFullPath(path));
        // A link to a folder: replace the folder it points to, not the link.
        if (Directory.Exists(full) && new DirectoryInfo(full).LinkTarget is not null
            && new DirectoryInfo(full).ResolveLinkTarget(returnFinalTarget: true) is DirectoryInfo target)
            full = Path.TrimEndingDirectorySeparator(target.FullName);
        string? parent = Path.GetDirectoryName(full);
        string name = Path.GetFileName(full);
        if (parent is null || name.Length == 0)
            throw new InputException($"{path}: is the root of a file system; expected a folder inside one");
        if (FolderSwap.IsMountPoint(full))
            throw new InputException($"{path}: is a mount point, which cannot be replaced by renaming; give a folder inside it");
        FileStream? held = null;
        try
        {
            Directory.CreateDirectory(parent);
            held = FolderSwap.Lock(parent, name)
                ?? throw new InputException($"{path}: another voxprof run is writing this folder (it holds {FolderSwap.LockPath(parent, name)}); wait for it to finish or choose another output folder");
            FolderSwap.CleanUp(parent, name);
            FolderOwnership.RequireOurs(path, full);
            string stage = FolderSwap.NewSibling(parent, name, "stage");
            Directory.CreateDirectory(stage);
            return new OutputDirectory(full, parent, name, stage, held);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException or NotSupportedException)
        {
            held?.Dispose();
            throw new InputException($"{path}: cannot write the output directory ({ex.Message})", ex);
        }
        catch
        {
            held?.Dispose();
            throw;
        }
    }

    /// <summary>Writes <paramref name="name"/> through <paramref name="write"/> into this run's folder; a failed file is left out.</summary>
    public void Write(string name, Action<Stream> write)
    {
        if (name.IndexOfAny(['/', '\\']) >= 0 || name.StartsWith('.') || name == ReportManifest.FileName)
            throw new ArgumentException($"not a plain file name: {name}", nameof(name));
        if (_root is { } root)
        {
            root.WriteRelative(_prefix + "/" + name, write);
            return;
        }
        WriteRelative(name, write);
    }

    private void WriteRelative(string name, Action<Stream> write)
    {
        ObjectDisposedException.ThrowIf(_disposed, this);
        if (_committed)
            throw new InvalidOperationException("the output folder is already committed");
        string path = Path.Combine(_stage, name);
        if (name.Contains('/', StringComparison.Ordinal))
            Directory.CreateDirectory(Path.GetDirectoryName(path)!);
        ManifestFile entry;
        try
        {
            using var file = new FileStream(path, FileMode.Create, FileAccess.Write, FileShare.None, 1 << 16);
            using var hashing = new HashingWriteStream(file);
            write(hashing);
            hashing.Flush();
            entry = new ManifestFile(name, hashing.Length, hashing.Hash());
        }
        catch
        {
            TryDelete(path);
            throw;
        }
        lock (_sync)
        {
            _written.RemoveAll(f => f.Name == name);
            _written.Add(entry);
        }
    }

    public void WriteText(string name, Action<TextWriter> write) =>
        Write(name, s =>
        {
            using var w = new StreamWriter(s, new System.Text.UTF8Encoding(false), 1 << 16, leaveOpen: true);
            write(w);
        });

    /// <summary>Writes the manifest and puts this run's folder in place of the old one, whole; then releases the lock.</summary>
    public void Commit()
    {
        if (_root is not null)
            throw new InvalidOperationException("a subfolder is committed with its run's folder");
        ObjectDisposedException.ThrowIf(_disposed, this);
        if (_committed)
            throw new InvalidOperationException("the output folder is already committed");
        ManifestFile[] files;
        lock (_sync)
            files = [.. _written.OrderBy(f => f.Name, StringComparer.Ordinal)];
        var manifest = new ReportManifest("voxprof", ToolInfo.Version, RunId, files);
        File.WriteAllBytes(Path.Combine(_stage, ReportManifest.FileName), manifest.ToJson());
        FolderSwap.Replace(_stage, FullPath, _parent, _name);
        _committed = true;
        Dispose();
    }

    /// <summary>Without a commit, throws this run's files away and leaves the folder as it was.</summary>
    public void Dispose()
    {
        if (_disposed || _root is not null)
            return;
        _disposed = true;
        if (!_committed)
            FolderSwap.DeleteTree(_stage);
        _lock.Dispose();
    }

    private static void TryDelete(string path)
    {
        try
        {
            File.Delete(path);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            // Best effort: the stage folder is removed whole at the end.
        }
    }
}
