namespace VoxProf.Core.Scenes.Loading;

/// <summary>
/// Real paths for the files a scene names: every symbolic link on the way followed, and <c>..</c> taken after the
/// link before it, as the operating system does when it opens the path. Readers open the real path, so what is
/// checked (size, folder) is what is read.
/// </summary>
internal static class ScenePaths
{
    // The usual limit of links followed in one lookup (Linux's MAXSYMLINKS is 40).
    private const int MaxLinks = 40;

    /// <summary>The real path of <paramref name="path"/> (absolute); components that do not exist are kept as written.</summary>
    public static string Real(string path)
    {
        int links = 0;
        // Not Path.GetFullPath: it would take a ".." before the link in front of it is followed.
        return Resolve(Path.IsPathRooted(path) ? path : Path.Combine(Environment.CurrentDirectory, path), ref links);
    }

    /// <summary>Whether <paramref name="real"/> lies inside the folder <paramref name="realFolder"/> (both real paths).</summary>
    public static bool IsInside(string real, string realFolder)
    {
        string root = Path.TrimEndingDirectorySeparator(realFolder) + Path.DirectorySeparatorChar;
        return real.StartsWith(root, StringComparison.Ordinal);
    }

    private static string Resolve(string absolute, ref int links)
    {
        string root = Path.GetPathRoot(absolute) ?? "/";
        string current = root;
        string[] parts = absolute[root.Length..].Split([Path.DirectorySeparatorChar, Path.AltDirectorySeparatorChar], StringSplitOptions.RemoveEmptyEntries);
        for (int i = 0; i < parts.Length; i++)
        {
            string part = parts[i];
            if (part == ".")
                continue;
            if (part == "..")
            {
                current = Path.GetDirectoryName(current) ?? root;
                continue;
            }
            string next = Path.Combine(current, part);
            string? target = LinkTarget(next);
            if (target is not null)
            {
                if (++links > MaxLinks)
                    throw new IOException($"{next}: too many levels of symbolic links");
                string rest = string.Join(Path.DirectorySeparatorChar, parts[(i + 1)..]);
                string joined = Path.IsPathRooted(target) ? target : Path.Combine(current, target);
                return Resolve(Path.Combine(joined, rest), ref links);
            }
            current = next;
        }
        return current;
    }

    private static string? LinkTarget(string path)
    {
        try
        {
            return new FileInfo(path).LinkTarget;
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            return null;
        }
    }
}
