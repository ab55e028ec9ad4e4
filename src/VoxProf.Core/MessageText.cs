using System.Globalization;
using System.Text;

namespace VoxProf.Core;

/// <summary>
/// Keeps error messages to one readable line: control characters (a newline in a path, a NUL, an escape sequence)
/// are written as escapes, and long echoes of the input are cut to a short excerpt.
/// </summary>
public static class MessageText
{
    /// <summary>Longest quoted echo of the input a message keeps (a JSON parser quotes the rest of the file).</summary>
    public const int MaxEcho = 40;

    /// <summary>Longest message printed; anything longer is cut with a note of how much was left out.</summary>
    public const int MaxLength = 1000;

    /// <summary>
    /// The text on one line: CR, LF and tab as <c>\r</c>, <c>\n</c>, <c>\t</c>, every other control character
    /// (C0, DEL, C1, line and paragraph separators) and lone surrogates as <c>\uXXXX</c>.
    /// </summary>
    public static string OneLine(string text)
    {
        int first = 0;
        while (first < text.Length && !NeedsEscape(text, first))
            first++;
        if (first == text.Length)
            return text;
        var sb = new StringBuilder(text.Length + 16);
        sb.Append(text, 0, first);
        for (int i = first; i < text.Length; i++)
        {
            char c = text[i];
            if (char.IsHighSurrogate(c) && i + 1 < text.Length && char.IsLowSurrogate(text[i + 1]))
            {
                sb.Append(c).Append(text[++i]);
                continue;
            }
            if (!NeedsEscape(text, i))
            {
                sb.Append(c);
                continue;
            }
            sb.Append(c switch
            {
                '\n' => "\\n",
                '\r' => "\\r",
                '\t' => "\\t",
                _ => "\\u" + ((int)c).ToString("X4", CultureInfo.InvariantCulture),
            });
        }
        return sb.ToString();
    }

    /// <summary>At most <paramref name="max"/> characters of <paramref name="text"/>, on one line, marked "…" when cut.</summary>
    public static string Excerpt(string text, int max = MaxEcho)
    {
        string cut = text.Length <= max ? text : text[..max] + "…";
        return OneLine(cut);
    }

    /// <summary>
    /// A parser's message with its echo of the input cut to <see cref="MaxEcho"/> characters: System.Text.Json
    /// starts "'ECHO' is an invalid JSON literal", quoting a bad literal up to the end of the file, quotes and all.
    /// </summary>
    public static string CutEchoes(string message)
    {
        int end = message.StartsWith('\'') ? message.LastIndexOf("' is ", StringComparison.Ordinal) : -1;
        if (end <= MaxEcho + 1)
            return message;
        return $"'{message[1..(MaxEcho + 1)]}…{message[end..]}";
    }

    /// <summary>A message as printed: control characters escaped, the whole kept under <see cref="MaxLength"/>.</summary>
    public static string ForDisplay(string message)
    {
        string text = OneLine(message);
        if (text.Length > MaxLength)
            text = text[..MaxLength] + string.Create(CultureInfo.InvariantCulture, $"… ({text.Length - MaxLength} more characters)");
        return text;
    }

    private static bool NeedsEscape(string text, int i)
    {
        char c = text[i];
        if (char.IsSurrogate(c))
        {
            bool paired = char.IsHighSurrogate(c)
                ? i + 1 < text.Length && char.IsLowSurrogate(text[i + 1])
                : i > 0 && char.IsHighSurrogate(text[i - 1]);
            return !paired;
        }
        return char.IsControl(c) || c is '\u2028' or '\u2029';
    }
}
