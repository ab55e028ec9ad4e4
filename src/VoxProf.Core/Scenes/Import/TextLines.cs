using System.Globalization;
using System.Text;

namespace VoxProf.Core.Scenes.Import;

/// <summary>
/// Reads an ASCII file line by line (LF or CRLF) without decoding it to strings, counting lines from 1 so errors can
/// name them. Lines longer than 1 MiB are refused: no text mesh format needs them and a binary file read as text
/// would otherwise be buffered whole.
/// </summary>
internal sealed class TextLines(Stream stream, string file)
{
    private const int MaxLine = 1 << 20;

    private byte[] _buffer = new byte[1 << 16];
    private int _start, _end;
    private bool _eof;

    /// <summary>Number of the line last returned by <see cref="Next"/>.</summary>
    public long LineNumber { get; private set; }

    public string Where => FilePlace.Line(LineNumber);

    public string File => file;

    /// <summary>Bytes consumed so far, for formats whose binary data follows a text header.</summary>
    public long Consumed { get; private set; }

    public bool Next(out ReadOnlySpan<byte> line)
    {
        while (true)
        {
            int nl = _buffer.AsSpan(_start, _end - _start).IndexOf((byte)'\n');
            if (nl >= 0)
            {
                line = Trim(_buffer.AsSpan(_start, nl));
                _start += nl + 1;
                Consumed += nl + 1;
                LineNumber++;
                return true;
            }
            if (_eof)
            {
                if (_start == _end)
                {
                    line = default;
                    return false;
                }
                line = Trim(_buffer.AsSpan(_start, _end - _start));
                Consumed += _end - _start;
                _start = _end;
                LineNumber++;
                return true;
            }
            Fill();
        }
    }

    /// <summary>The bytes read past the last line returned (binary data after a text header) and the stream itself.</summary>
    public ReadOnlyMemory<byte> Leftover => _buffer.AsMemory(_start, _end - _start);

    public SceneFormatException Error(string problem) => new(file, Where, problem);

    private void Fill()
    {
        if (_start > 0)
        {
            Buffer.BlockCopy(_buffer, _start, _buffer, 0, _end - _start);
            _end -= _start;
            _start = 0;
        }
        if (_end == _buffer.Length)
        {
            if (_buffer.Length >= MaxLine)
                throw new SceneFormatException(file, FilePlace.Line(LineNumber + 1), "line longer than 1 MiB; expected a text file of short lines");
            Array.Resize(ref _buffer, _buffer.Length * 2);
        }
        int n = stream.Read(_buffer, _end, _buffer.Length - _end);
        if (n == 0)
            _eof = true;
        _end += n;
    }

    private static ReadOnlySpan<byte> Trim(ReadOnlySpan<byte> s)
    {
        if (s.Length > 0 && s[^1] == '\r')
            s = s[..^1];
        return s;
    }
}

/// <summary>Whitespace-separated words of one ASCII line.</summary>
internal ref struct Words(ReadOnlySpan<byte> line)
{
    private ReadOnlySpan<byte> _rest = line;

    public bool Next(out ReadOnlySpan<byte> word)
    {
        int i = 0;
        while (i < _rest.Length && IsSpace(_rest[i]))
            i++;
        int j = i;
        while (j < _rest.Length && !IsSpace(_rest[j]))
            j++;
        word = _rest[i..j];
        _rest = _rest[j..];
        return j > i;
    }

    /// <summary>What is left of the line after the words taken so far, without leading spaces.</summary>
    public readonly ReadOnlySpan<byte> Rest
    {
        get
        {
            int i = 0;
            while (i < _rest.Length && IsSpace(_rest[i]))
                i++;
            return _rest[i..];
        }
    }

    public static bool IsSpace(byte b) => b is (byte)' ' or (byte)'\t' or (byte)'\f' or (byte)'\v' or (byte)'\r';

    public static bool Is(ReadOnlySpan<byte> word, string keyword) => Ascii.EqualsIgnoreCase(word, keyword);

    /// <summary>A word as text for a message, shortened.</summary>
    public static string Show(ReadOnlySpan<byte> text)
    {
        if (text.IsEmpty)
            return "nothing";
        string s = Encoding.UTF8.GetString(text.Length > 40 ? text[..40] : text);
        return "\"" + s + (text.Length > 40 ? "..." : "") + "\"";
    }

    public static bool TryFloat(ReadOnlySpan<byte> word, out float value) =>
        float.TryParse(word, NumberStyles.Float, CultureInfo.InvariantCulture, out value);

    public static bool TryLong(ReadOnlySpan<byte> word, out long value) =>
        long.TryParse(word, NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out value);
}
