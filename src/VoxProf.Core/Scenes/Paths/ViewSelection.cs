namespace VoxProf.Core.Scenes.Paths;

/// <summary>
/// The views a run traces, chosen by name from a scene's cameras and camera paths: "all", or a comma-separated list of
/// camera names, path names (every frame) and frame names ("walk#012"). Names match without regard to case.
/// </summary>
public static class ViewSelection
{
    /// <summary>The word that selects every camera and every frame of every path.</summary>
    public const string All = "all";

    /// <summary>Every view of the scene in file order: a camera is one view, a path one view per frame.</summary>
    public static IReadOnlyList<CameraSpec> Every(Scene scene) => Entries(scene).SelectMany(e => e.Views()).ToArray();

    /// <summary>The default view set: the first entry of the scene's camera list (all frames if it is a path).</summary>
    public static IReadOnlyList<CameraSpec> Default(Scene scene) =>
        Entries(scene).FirstOrDefault()?.Views()
        ?? throw new InputException($"{scene.SourcePath ?? scene.Name}: the scene has no cameras; give --eye and --target");

    /// <summary>Resolves <paramref name="text"/>; an unknown name is an <see cref="InputException"/> naming the option and the choices.</summary>
    public static IReadOnlyList<CameraSpec> Resolve(Scene scene, string text, string option = "--camera")
    {
        if (string.Equals(text.Trim(), All, StringComparison.OrdinalIgnoreCase))
            return Every(scene);
        var entries = Entries(scene);
        var views = new List<CameraSpec>();
        var seen = new HashSet<string>(StringComparer.OrdinalIgnoreCase);
        foreach (string raw in text.Split(','))
        {
            string name = raw.Trim();
            if (name.Length == 0)
                throw new InputException($"{option}: empty name in '{MessageText.Excerpt(text)}'; expected camera or path names, or {All}");
            IReadOnlyList<CameraSpec> found = Find(entries, name)
                ?? throw new InputException($"{option}: no camera or path '{MessageText.Excerpt(name)}' in {scene.SourcePath ?? scene.Name}; " +
                    $"expected one of: {string.Join(", ", entries.Select(e => e.Name))}, a frame such as NAME#000, or {All}");
            foreach (CameraSpec view in found)
            {
                if (seen.Add(view.Name))
                    views.Add(view);
            }
        }
        return views;
    }

    /// <summary>
    /// The views of shard <paramref name="index"/> (1-based) of <paramref name="count"/>: every count-th view from the
    /// index-th, so neighbouring frames of a path, which cost about the same, spread over the shards.
    /// </summary>
    public static IReadOnlyList<int> Shard(int views, int index, int count)
    {
        if (count < 1 || index < 1 || index > count)
            throw new ArgumentOutOfRangeException(nameof(index), "shard index must be 1..count");
        var picked = new List<int>();
        for (int v = index - 1; v < views; v += count)
            picked.Add(v);
        return picked;
    }

    private static IReadOnlyList<CameraSpec>? Find(IReadOnlyList<Entry> entries, string name)
    {
        foreach (Entry e in entries)
        {
            if (string.Equals(e.Name, name, StringComparison.OrdinalIgnoreCase))
                return e.Views();
        }
        foreach (Entry e in entries)
        {
            if (e.Path is { } path && name.Length > path.Name.Length && name[path.Name.Length] == CameraPath.FrameSeparator
                && name.StartsWith(path.Name, StringComparison.OrdinalIgnoreCase))
            {
                for (int f = 0; f < path.Frames; f++)
                {
                    if (string.Equals(path.FrameName(f), name, StringComparison.OrdinalIgnoreCase))
                        return [path.Frame(f)];
                }
            }
        }
        return null;
    }

    private static IReadOnlyList<Entry> Entries(Scene scene)
    {
        var entries = scene.Cameras.Select(c => new Entry(c.Name, c, null))
            .Concat(scene.Paths.Select(p => new Entry(p.Name, null, p))).ToList();
        if (scene.CameraOrder.Count == 0)
            return entries;
        var order = scene.CameraOrder.Select((n, i) => (n, i)).ToDictionary(x => x.n, x => x.i, StringComparer.Ordinal);
        return entries.OrderBy(e => order.TryGetValue(e.Name, out int i) ? i : int.MaxValue).ToList();
    }

    private sealed record Entry(string Name, CameraSpec? Camera, CameraPath? Path)
    {
        public IReadOnlyList<CameraSpec> Views() => Camera is { } c ? [c] : Path!.AllFrames();
    }
}
