using System.Security.Cryptography;

namespace HandLine.Formats;

/// <summary>
/// Passes reads or writes through to another stream, hashing every byte with SHA-256 on the way; reads stop at
/// <c>limit</c> bytes, so a container's trailing checksum is never read as data.
/// </summary>
internal sealed class HashingStream(Stream inner, long limit = long.MaxValue) : Stream
{
    private readonly IncrementalHash _hash = IncrementalHash.CreateHash(HashAlgorithmName.SHA256);
    private long _passed;

    /// <summary>Bytes read or written so far.</summary>
    public long Passed => _passed;

    public byte[] Hash() => _hash.GetCurrentHash();

    public override bool CanRead => inner.CanRead;
    public override bool CanSeek => false;
    public override bool CanWrite => inner.CanWrite;
    public override long Length => throw new NotSupportedException();

    public override long Position
    {
        get => _passed;
        set => throw new NotSupportedException();
    }

    public override int Read(byte[] buffer, int offset, int count) => Read(buffer.AsSpan(offset, count));

    public override int Read(Span<byte> buffer)
    {
        var wanted = (int)Math.Min(buffer.Length, limit - _passed);
        if (wanted <= 0) return 0;
        var n = inner.Read(buffer[..wanted]);
        _hash.AppendData(buffer[..n]);
        _passed += n;
        return n;
    }

    public override void Write(byte[] buffer, int offset, int count) => Write(buffer.AsSpan(offset, count));

    public override void Write(ReadOnlySpan<byte> buffer)
    {
        inner.Write(buffer);
        _hash.AppendData(buffer);
        _passed += buffer.Length;
    }

    public override void Flush() => inner.Flush();
    public override long Seek(long offset, SeekOrigin origin) => throw new NotSupportedException();
    public override void SetLength(long value) => throw new NotSupportedException();

    protected override void Dispose(bool disposing)
    {
        if (disposing) _hash.Dispose();
        base.Dispose(disposing);
    }
}
