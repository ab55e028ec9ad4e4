using System.Security.Cryptography;

namespace VoxProf.Core.Scenes.Import;

/// <summary>A read-only stream that feeds every byte read into the scene's content hash.</summary>
internal sealed class HashingStream(Stream inner, IncrementalHash? hash) : Stream
{
    public override bool CanRead => true;
    public override bool CanSeek => false;
    public override bool CanWrite => false;
    public override long Length => inner.Length;
    public override long Position { get => inner.Position; set => throw new NotSupportedException(); }

    public override int Read(byte[] buffer, int offset, int count) => Read(buffer.AsSpan(offset, count));

    public override int Read(Span<byte> buffer)
    {
        int n = inner.Read(buffer);
        hash?.AppendData(buffer[..n]);
        return n;
    }

    /// <summary>Reads and hashes whatever the reader left, so the hash always covers the whole file.</summary>
    public void Drain()
    {
        Span<byte> scratch = stackalloc byte[4096];
        while (Read(scratch) > 0)
        {
        }
    }

    public override void Flush() { }
    public override long Seek(long offset, SeekOrigin origin) => throw new NotSupportedException();
    public override void SetLength(long value) => throw new NotSupportedException();
    public override void Write(byte[] buffer, int offset, int count) => throw new NotSupportedException();

    protected override void Dispose(bool disposing)
    {
        if (disposing)
            inner.Dispose();
        base.Dispose(disposing);
    }
}
