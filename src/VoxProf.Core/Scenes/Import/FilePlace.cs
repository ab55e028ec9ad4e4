namespace VoxProf.Core.Scenes.Import;

/// <summary>How errors name a place inside a file a layer reads.</summary>
internal static class FilePlace
{
    public static string Line(long line) => FormattableString.Invariant($"line {line}");

    public static string Offset(long offset) => FormattableString.Invariant($"byte offset {offset}");
}
