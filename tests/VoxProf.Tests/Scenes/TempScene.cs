namespace VoxProf.Tests.Scenes;

/// <summary>A scene file (and optional side files) in a fresh temporary folder, removed on dispose.</summary>
internal sealed class TempScene : IDisposable
{
    public const string Camera = "{'name': 'cam', 'eye': [1, 2, 3], 'target': [10, 2, 10]}";

    public TempScene(string json, string fileName = "test.vpscene.json")
    {
        Folder = System.IO.Path.Combine(System.IO.Path.GetTempPath(), "voxprof-scenes-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(Folder);
        Path = System.IO.Path.Combine(Folder, fileName);
        File.WriteAllText(Path, json.Replace('\'', '"'));
    }

    public string Folder { get; }
    public string Path { get; }

    /// <summary>A scene with the given layers (JSON array body) and cameras, quotes written as apostrophes.</summary>
    public static TempScene With(string layers, string cameras = Camera, string extent = "[64, 32, 64]") =>
        new($"{{'extent': {extent}, 'layers': [{layers}], 'cameras': [{cameras}]}}");

    public void WriteSideFile(string name, byte[] bytes) => File.WriteAllBytes(System.IO.Path.Combine(Folder, name), bytes);

    public void Dispose() => Directory.Delete(Folder, recursive: true);
}
