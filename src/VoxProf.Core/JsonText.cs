using System.Buffers;
using System.Globalization;
using System.Text;
using System.Text.Json;
using System.Text.Unicode;

namespace VoxProf.Core;

/// <summary>A place in a JSON text ("line 3, column 12" or a JSON path) and what is wrong there.</summary>
public readonly record struct JsonTextProblem(string Where, string Problem);

/// <summary>
/// Checks of JSON text the parser leaves to the first read of a string: invalid UTF-8 and escaped lone surrogates
/// (<c>"\ud800"</c>) parse, then throw from <c>GetString</c> deep inside a reader. Checking once, up front, turns
/// them into one error naming the place.
/// </summary>
public static class JsonText
{
    /// <summary>The text without a leading UTF-8 byte-order mark (editors on some systems write one).</summary>
    public static ReadOnlyMemory<byte> WithoutBom(byte[] bytes) =>
        bytes.AsSpan().StartsWith(Encoding.UTF8.Preamble) ? bytes.AsMemory(3) : bytes;

    /// <summary>The first byte that is not UTF-8, as a line and column (counted from 1, columns in bytes); null when all is UTF-8.</summary>
    public static JsonTextProblem? FindInvalidUtf8(ReadOnlySpan<byte> text)
    {
        if (Utf8.IsValid(text))
            return null;
        char[] scratch = ArrayPool<char>.Shared.Rent(4096);
        try
        {
            int offset = 0;
            while (offset < text.Length)
            {
                OperationStatus status = Utf8.ToUtf16(text[offset..], scratch, out int read, out _, replaceInvalidSequences: false);
                offset += read;
                if (status == OperationStatus.InvalidData || status == OperationStatus.NeedMoreData)
                    break;
            }
            int line = 1, lineStart = 0;
            for (int i = 0; i < offset; i++)
            {
                if (text[i] == (byte)'\n')
                {
                    line++;
                    lineStart = i + 1;
                }
            }
            string found = offset < text.Length ? $"byte 0x{text[offset]:X2}" : "the end of the text";
            return new JsonTextProblem(
                string.Create(CultureInfo.InvariantCulture, $"line {line}, column {offset - lineStart + 1}"),
                $"not UTF-8: {found} at byte offset {offset.ToString(CultureInfo.InvariantCulture)} does not continue a valid character; expected UTF-8 text");
        }
        finally
        {
            ArrayPool<char>.Shared.Return(scratch);
        }
    }

    /// <summary>The JSON path of the first key or string holding an escaped lone surrogate (<c>\ud800</c>); null when none does.</summary>
    public static JsonTextProblem? FindLoneSurrogate(JsonElement root) => Walk(root, "$");

    private static JsonTextProblem? Walk(JsonElement e, string path)
    {
        switch (e.ValueKind)
        {
            case JsonValueKind.String:
                return Readable(e) ? null : Lone(path);
            case JsonValueKind.Array:
                int i = 0;
                foreach (JsonElement item in e.EnumerateArray())
                {
                    if (Walk(item, path, i) is { } found)
                        return found;
                    i++;
                }
                return null;
            case JsonValueKind.Object:
                int k = 0;
                foreach (JsonProperty p in e.EnumerateObject())
                {
                    string? name = NameOf(p);
                    if (name is null)
                        return new JsonTextProblem($"{path} (key {k.ToString(CultureInfo.InvariantCulture)})", LoneText);
                    if (p.Value.ValueKind is JsonValueKind.String or JsonValueKind.Array or JsonValueKind.Object
                        && Walk(p.Value, $"{path}.{MessageText.Excerpt(name)}") is { } found)
                        return found;
                    k++;
                }
                return null;
            default:
                return null;
        }
    }

    // Paths are built only for containers and strings, and an array's items share one prefix.
    private static JsonTextProblem? Walk(JsonElement item, string path, int index) =>
        item.ValueKind is JsonValueKind.String or JsonValueKind.Array or JsonValueKind.Object
            ? Walk(item, string.Create(CultureInfo.InvariantCulture, $"{path}[{index}]"))
            : null;

    private const string LoneText = "text holds an escaped lone surrogate (such as \\ud800 without its pair); expected valid Unicode text";

    private static JsonTextProblem Lone(string path) => new(path, LoneText);

    private static bool Readable(JsonElement e)
    {
        try
        {
            _ = e.GetString();
            return true;
        }
        catch (InvalidOperationException)
        {
            return false;
        }
    }

    private static string? NameOf(JsonProperty p)
    {
        try
        {
            return p.Name;
        }
        catch (InvalidOperationException)
        {
            return null;
        }
    }
}
