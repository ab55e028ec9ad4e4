namespace VoxProf.Core.Scenes.Import;

/// <summary>
/// A problem inside a file a layer reads (a mesh, a heightmap, a volume): names the file, the place in it (a line,
/// a byte offset, a header field) and what was expected, on one line.
/// </summary>
public sealed class ImportException : InputException
{
    public ImportException(string file, string where, string problem)
        : base($"{file}: {where}: {problem}")
    {
        File = file;
        Where = where;
        Problem = problem;
    }

    public string File { get; }

    /// <summary>"line 12", "byte offset 84", "header line 3" or "$" for the file as a whole.</summary>
    public string Where { get; }

    public string Problem { get; }

    internal static string Line(long line) => FormattableString.Invariant($"line {line}");

    internal static string Offset(long offset) => FormattableString.Invariant($"byte offset {offset}");
}
