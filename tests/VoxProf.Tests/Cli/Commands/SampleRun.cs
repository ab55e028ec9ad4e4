namespace VoxProf.Tests.Cli.Commands;

/// <summary>
/// In-process command runs on the bundled ring-post sample: a scratch folder (removed on dispose) and the captured
/// standard output and error.
/// </summary>
internal sealed class SampleRun : IDisposable
{
    public static readonly string Scene = Path.Combine(AppContext.BaseDirectory, "samples", "ring-post.vpscene.json");

    public SampleRun(string prefix)
    {
        Dir = Path.Combine(Path.GetTempPath(), $"voxprof-{prefix}-{Guid.NewGuid():N}");
        Directory.CreateDirectory(Dir);
    }

    public string Dir { get; }

    public StringWriter Out { get; } = new();

    public StringWriter Err { get; } = new();

    /// <summary>A path inside the scratch folder.</summary>
    public string In(string name) => Path.Combine(Dir, name);

    public int Run(params string[] args) => VoxProf.Cli.Cli.Run(args, Out, Err);

    public void Dispose() => Directory.Delete(Dir, recursive: true);
}
