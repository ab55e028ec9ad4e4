namespace VoxProf.Core;

/// <summary>
/// Bad input from the user (a scene, a report, an option value). The command line catches it once and prints
/// <see cref="Exception.Message"/> as one line with exit code 2, so the message must name the file and the place in it.
/// </summary>
public class InputException : Exception
{
    public InputException(string message) : base(message) { }
    public InputException(string message, Exception inner) : base(message, inner) { }
}

/// <summary>
/// A problem in a scene file or in a file it names (a mesh, a heightmap, a volume): names the file, the place in it
/// (a JSON path, "line L, column C", "line L", "byte offset N", "header") and what was expected.
/// </summary>
public sealed class SceneFormatException : InputException
{
    public SceneFormatException(string file, string where, string problem)
        : base($"{file}: {where}: {problem}")
    {
        File = file;
        Where = where;
        Problem = problem;
    }

    public string File { get; }

    /// <summary>The JSON path (e.g. <c>$.layers[2].radius</c>), "line L, column C", "line L" or "byte offset N".</summary>
    public string Where { get; }

    public string Problem { get; }
}
