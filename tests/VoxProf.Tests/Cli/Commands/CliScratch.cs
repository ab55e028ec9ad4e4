using VoxProf.Tests.Scenes;

namespace VoxProf.Tests.Cli.Commands;

/// <summary>A scene file and a scratch folder for end-to-end command runs (the real pipeline), both removed on dispose.</summary>
internal sealed class CliScratch : IDisposable
{
    private readonly string _dir = Path.Combine(Path.GetTempPath(), $"voxprof-cli-{Guid.NewGuid():N}");

    public CliScratch(string layers, string cameras) => Scene = TempScene.With(layers, cameras);

    public TempScene Scene { get; }

    /// <summary>A path inside the scratch folder.</summary>
    public string Out(string name) => Path.Combine(_dir, name);

    /// <summary>voxprof with these arguments: exit code, stdout, stderr.</summary>
    public static (int Code, string Out, string Err) Run(params string[] args)
    {
        var output = new StringWriter();
        var error = new StringWriter();
        int code = VoxProf.Cli.Cli.Run(args, output, error);
        return (code, output.ToString(), error.ToString());
    }

    public void Dispose()
    {
        Scene.Dispose();
        if (Directory.Exists(_dir))
            Directory.Delete(_dir, recursive: true);
    }
}
