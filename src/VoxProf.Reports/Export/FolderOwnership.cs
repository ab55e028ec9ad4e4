using VoxProf.Core;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Export;

/// <summary>Whether an existing folder is one voxprof may replace whole (docs/reports.md, "The output folder").</summary>
internal static class FolderOwnership
{
    // A folder voxprof did not write (a home folder, a repository given as --out by mistake), or a file someone put
    // into a report folder, must never be swapped away: every entry must be listed in the folder's manifest or
    // carry a name voxprof writes (a folder from before manifests).
    public static void RequireOurs(string path, string full)
    {
        if (!Directory.Exists(full))
            return;
        var listed = new HashSet<string>(StringComparer.Ordinal);
        try
        {
            foreach (ManifestFile f in ReportManifest.Read(full)?.Files ?? [])
                listed.Add(f.Name);
        }
        catch (InputException)
        {
            // A damaged manifest vouches for nothing: the names alone decide.
        }
        // A run of several views writes subfolders: each must hold files its manifest lists and nothing else.
        var folders = new HashSet<string>(StringComparer.Ordinal);
        foreach (string name in listed)
        {
            for (int slash = name.IndexOf('/', StringComparison.Ordinal); slash > 0; slash = name.IndexOf('/', slash + 1))
                folders.Add(name[..slash]);
        }
        foreach (string entry in Directory.EnumerateFileSystemEntries(full, "*", SearchOption.AllDirectories))
        {
            string name = Path.GetRelativePath(full, entry).Replace(Path.DirectorySeparatorChar, '/');
            bool isFolder = Directory.Exists(entry);
            bool ours = isFolder
                ? folders.Contains(name) && new DirectoryInfo(entry).LinkTarget is null
                : listed.Contains(name) || (!name.Contains('/', StringComparison.Ordinal) && OutputNames.IsOwn(name));
            if (!ours)
                throw new InputException($"{path}: holds {(isFolder ? "a folder" : "a file")} voxprof did not write ('{MessageText.Excerpt(name)}'); expected a new or empty folder, or one voxprof wrote (it replaces the whole folder)");
        }
    }
}
