namespace VoxProf.Reports.Compare;

/// <summary>Writes a file under a temporary name beside it and renames it when complete, so an interrupted run
/// never leaves a half-written file under the real name.</summary>
internal static class AtomicFile
{
    public static void Write(string path, Action<Stream> write)
    {
        var temp = Path.Combine(Path.GetDirectoryName(Path.GetFullPath(path)) ?? ".", $".{Path.GetFileName(path)}.{Guid.NewGuid():N}.tmp");
        try
        {
            using (var stream = new FileStream(temp, FileMode.CreateNew, FileAccess.Write))
                write(stream);
            File.Move(temp, path, overwrite: true);
        }
        finally
        {
            if (File.Exists(temp))
                File.Delete(temp);
        }
    }
}
