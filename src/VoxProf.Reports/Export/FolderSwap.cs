using System.Runtime.InteropServices;

namespace VoxProf.Reports.Export;

/// <summary>
/// The file-system steps of an all-or-nothing output folder: a lock per folder, the hidden sibling folders a run
/// writes into, the swap that puts a finished one in place, and the clean-up of what dead runs left.
/// Names beside folder NAME: <c>.NAME.voxprof-lock</c>, <c>.NAME.voxprof-stage-PID-ID</c>, <c>.NAME.voxprof-old-PID-ID</c>.
/// </summary>
internal static class FolderSwap
{
    private const string Marker = ".voxprof-";

    public static string LockPath(string parent, string name) => Path.Combine(parent, $".{name}{Marker}lock");

    public static string NewSibling(string parent, string name, string kind) =>
        Path.Combine(parent, $".{name}{Marker}{kind}-{Environment.ProcessId}-{Guid.NewGuid():N}");

    /// <summary>
    /// <see cref="TryLock"/>, tried again for about a second: another run's clean-up may hold this folder's lock for
    /// a moment while it removes what a dead run left beside it.
    /// </summary>
    public static FileStream? Lock(string parent, string name)
    {
        for (int attempt = 0; ; attempt++)
        {
            if (TryLock(parent, name) is { } held)
                return held;
            if (attempt == 10)
                return null;
            Thread.Sleep(100);
        }
    }

    /// <summary>
    /// Takes the folder's lock: an exclusive lock on the lock file, which the system drops when the process ends, so
    /// a killed run never leaves a folder locked. Null when another run holds it. The empty lock file stays.
    /// </summary>
    public static FileStream? TryLock(string parent, string name)
    {
        try
        {
            return new FileStream(LockPath(parent, name), FileMode.OpenOrCreate, FileAccess.ReadWrite, FileShare.None, 1, FileOptions.None);
        }
        catch (IOException) when (File.Exists(LockPath(parent, name)))
        {
            return null;
        }
    }

    /// <summary>
    /// Removes what dead runs left beside folders of <paramref name="parent"/>: stage and old folders whose folder's
    /// lock is free (a live run holds its lock). A folder missing after a swap was cut short gets its old copy back.
    /// </summary>
    public static void CleanUp(string parent, string ownName)
    {
        string[] leftovers;
        try
        {
            leftovers = Directory.GetDirectories(parent, "." + "*" + Marker + "*");
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            return;
        }
        foreach (string path in leftovers)
        {
            if (!TryParse(Path.GetFileName(path), out string name, out string kind))
                continue;
            FileStream? held = null;
            try
            {
                if (name != ownName && (held = TryLock(parent, name)) is null)
                    continue;
                string folder = Path.Combine(parent, name);
                if (kind == "old" && !Directory.Exists(folder) && !File.Exists(folder))
                    Directory.Move(path, folder);
                else
                    DeleteTree(path);
            }
            catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
            {
                // Best effort: the next run into that folder tries again.
            }
            finally
            {
                held?.Dispose();
            }
        }
    }

    /// <summary>
    /// Puts <paramref name="stage"/> in place of <paramref name="target"/> in one step where the system can exchange
    /// two folders atomically (Linux renameat2 with RENAME_EXCHANGE), so a reader sees the old folder or the new one,
    /// never neither; elsewhere in two renames, after which a cut-short swap is undone by <see cref="CleanUp"/>.
    /// </summary>
    public static void Replace(string stage, string target, string parent, string name)
    {
        if (!Directory.Exists(target))
        {
            Directory.Move(stage, target);
            return;
        }
        if (TryExchange(stage, target))
        {
            DeleteTree(stage);
            return;
        }
        string old = NewSibling(parent, name, "old");
        Directory.Move(target, old);
        Directory.Move(stage, target);
        DeleteTree(old);
    }

    /// <summary>
    /// Whether <paramref name="full"/> is where a file system is mounted (Linux: listed in /proc/self/mountinfo):
    /// such a folder cannot be renamed, so it cannot be swapped.
    /// </summary>
    public static bool IsMountPoint(string full)
    {
        try
        {
            if (!OperatingSystem.IsLinux() || !File.Exists("/proc/self/mountinfo"))
                return false;
            foreach (string line in File.ReadLines("/proc/self/mountinfo"))
            {
                // Field 5 is the mount point, with space, tab, newline and backslash written as octal escapes.
                string[] fields = line.Split(' ');
                if (fields.Length > 4 && Unescape(fields[4]) == full)
                    return true;
            }
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            // No table to read: the swap itself reports a folder it cannot rename.
        }
        return false;
    }

    private static string Unescape(string field) =>
        field.Contains('\\', StringComparison.Ordinal)
            ? System.Text.RegularExpressions.Regex.Replace(field, @"\\([0-7]{3})", m => ((char)Convert.ToInt32(m.Groups[1].Value, 8)).ToString())
            : field;

    public static void DeleteTree(string path)
    {
        try
        {
            if (Directory.Exists(path))
                Directory.Delete(path, recursive: true);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            // Left for the next run's clean-up.
        }
    }

    private static bool TryParse(string entry, out string name, out string kind)
    {
        name = kind = "";
        int marker = entry.LastIndexOf(Marker, StringComparison.Ordinal);
        if (marker <= 1 || !entry.StartsWith('.'))
            return false;
        name = entry[1..marker];
        string rest = entry[(marker + Marker.Length)..];
        kind = rest.StartsWith("stage-", StringComparison.Ordinal) ? "stage" : rest.StartsWith("old-", StringComparison.Ordinal) ? "old" : "";
        return kind.Length > 0;
    }

    private static bool TryExchange(string a, string b)
    {
        if (!OperatingSystem.IsLinux())
            return false;
        try
        {
            return RenameAt2(AtCurrentDirectory, a, AtCurrentDirectory, b, RenameExchange) == 0;
        }
        catch (Exception ex) when (ex is EntryPointNotFoundException or DllNotFoundException)
        {
            return false;
        }
    }

    private const int AtCurrentDirectory = -100;
    private const uint RenameExchange = 2;

    [DllImport("libc", EntryPoint = "renameat2", SetLastError = true)]
    private static extern int RenameAt2(int oldDirectory, [MarshalAs(UnmanagedType.LPUTF8Str)] string oldPath,
        int newDirectory, [MarshalAs(UnmanagedType.LPUTF8Str)] string newPath, uint flags);
}
