using System.Buffers.Binary;
using System.Globalization;

namespace VoxProf.Core.Scenes.Import;

/// <summary>
/// Reads fixed-size records from a stream through a buffer, tracking the byte offset so a short file is reported at
/// the exact record that is missing.
/// </summary>
internal sealed class BinaryCursor(Stream stream, string file, long startOffset)
{
    private readonly byte[] _buffer = new byte[1 << 16];
    private int _start, _end;

    public long Offset { get; private set; } = startOffset;

    public string Where => FilePlace.Offset(Offset);

    /// <summary>The next <paramref name="count"/> bytes (at most 64 KiB), or an error naming what was cut short.</summary>
    public ReadOnlySpan<byte> Take(int count, string what)
    {
        if (_end - _start < count)
            Refill(count, what);
        var span = _buffer.AsSpan(_start, count);
        _start += count;
        Offset += count;
        return span;
    }

    public float Float(ReadOnlySpan<byte> bytes, bool bigEndian) =>
        bigEndian ? BinaryPrimitives.ReadSingleBigEndian(bytes) : BinaryPrimitives.ReadSingleLittleEndian(bytes);

    public bool AtEnd()
    {
        if (_end > _start)
            return false;
        Refill(0, "");
        return _end == _start;
    }

    private void Refill(int count, string what)
    {
        Buffer.BlockCopy(_buffer, _start, _buffer, 0, _end - _start);
        _end -= _start;
        _start = 0;
        while (_end < _buffer.Length)
        {
            int n = stream.Read(_buffer, _end, _buffer.Length - _end);
            if (n == 0)
                break;
            _end += n;
        }
        if (_end < count)
        {
            throw new SceneFormatException(file, Where, string.Create(CultureInfo.InvariantCulture,
                $"file ends with {_end} of the {count} bytes of {what}; expected the whole record"));
        }
    }
}
