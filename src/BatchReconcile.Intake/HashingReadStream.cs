using System.Security.Cryptography;

namespace BatchReconcile.Intake;

/// <summary>
/// A read-only stream over another that hashes (SHA-256) every byte read through it, so that the bytes a reader
/// parses are the bytes that are hashed: a file rewritten while it is read shows as a hash that differs from the
/// one taken before.
/// </summary>
public sealed class HashingReadStream(Stream inner) : Stream
{
    private readonly IncrementalHash _hash = IncrementalHash.CreateHash(HashAlgorithmName.SHA256);

    public override bool CanRead => true;

    public override bool CanSeek => false;

    public override bool CanWrite => false;

    public override long Length => throw new NotSupportedException();

    public override long Position { get => throw new NotSupportedException(); set => throw new NotSupportedException(); }

    public override int Read(byte[] buffer, int offset, int count) => Read(buffer.AsSpan(offset, count));

    public override int Read(Span<byte> buffer)
    {
        var read = inner.Read(buffer);
        _hash.AppendData(buffer[..read]);
        return read;
    }

    /// <summary>Reads what the reader left unread, then gives the SHA-256 of every byte, as <see cref="FileHash"/> writes it.</summary>
    public string FinishHash()
    {
        var rest = new byte[81920];
        while (Read(rest) > 0)
        {
        }

        return Convert.ToHexStringLower(_hash.GetHashAndReset());
    }

    public override void Flush()
    {
    }

    public override long Seek(long offset, SeekOrigin origin) => throw new NotSupportedException();

    public override void SetLength(long value) => throw new NotSupportedException();

    public override void Write(byte[] buffer, int offset, int count) => throw new NotSupportedException();

    protected override void Dispose(bool disposing)
    {
        if (disposing)
        {
            _hash.Dispose();
            inner.Dispose();
        }

        base.Dispose(disposing);
    }
}
