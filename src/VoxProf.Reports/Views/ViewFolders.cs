namespace VoxProf.Reports.Views;

/// <summary>The folder of each view inside a run's folder: views/NAME with the name made safe for any file system.</summary>
public static class ViewFolders
{
    public const string Root = "views";

    /// <summary>
    /// One folder per view, in order: letters, digits, '-', '_' and '.' kept, anything else '_' ("walk#007" →
    /// views/walk_007); a name that would repeat one taken earlier gets "-2", "-3", … Decided from the whole run's
    /// list, so every shard names a view's folder alike.
    /// </summary>
    public static IReadOnlyList<string> Assign(IReadOnlyList<string> viewNames)
    {
        var taken = new HashSet<string>(StringComparer.OrdinalIgnoreCase);
        var folders = new List<string>(viewNames.Count);
        foreach (string name in viewNames)
        {
            string safe = Safe(name);
            string folder = safe;
            for (int n = 2; !taken.Add(folder); n++)
                folder = $"{safe}-{n}";
            folders.Add(Root + "/" + folder);
        }
        return folders;
    }

    /// <summary>A name as a file name: letters, digits, '-', '_' and '.' kept, the rest '_', no leading or trailing dot.</summary>
    public static string Safe(string name)
    {
        var chars = name.Select(ch => char.IsAsciiLetterOrDigit(ch) || ch is '-' or '_' or '.' ? ch : '_').ToArray();
        string safe = new string(chars).Trim('.');
        return safe.Length == 0 ? "view" : safe;
    }
}
