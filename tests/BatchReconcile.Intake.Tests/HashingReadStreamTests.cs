using System.Security.Cryptography;
using System.Text;

namespace BatchReconcile.Intake.Tests;

/// <summary>
/// The hashing stream the pipeline parses large files through: it hashes the bytes of the pass that was read, it can
/// be rewound to its start for a second pass (which the export reader needs to stream batch by batch), and nowhere else.
/// </summary>
public sealed class HashingReadStreamTests
{
    private static readonly byte[] Content = Encoding.UTF8.GetBytes(string.Concat(Enumerable.Repeat("batch,recipe,step\nB-1,R,S1\n", 5000)));

    private static string Sha(byte[] bytes) => Convert.ToHexStringLower(SHA256.HashData(bytes));

    [Fact]
    public void One_pass_gives_the_sha256_of_every_byte()
    {
        using var stream = new HashingReadStream(new MemoryStream(Content));
        var buffer = new byte[1000];
        _ = stream.Read(buffer);

        // FinishHash reads the rest itself.
        Assert.Equal(Sha(Content), stream.FinishHash());
    }

    [Fact]
    public void A_rewind_to_the_start_starts_the_hash_again_so_it_covers_the_second_pass_only()
    {
        using var stream = new HashingReadStream(new MemoryStream(Content));
        Assert.True(stream.CanSeek);
        stream.CopyTo(Stream.Null);
        stream.Position = 0;
        var half = new byte[Content.Length / 2];
        stream.ReadExactly(half);

        Assert.Equal(Content.Length / 2, stream.Position);
        Assert.Equal(Sha(Content), stream.FinishHash());
    }

    [Fact]
    public void A_stream_that_starts_part_way_in_rewinds_to_where_it_started()
    {
        var inner = new MemoryStream(Content) { Position = 28 };
        using var stream = new HashingReadStream(inner);
        stream.CopyTo(Stream.Null);
        stream.Seek(28, SeekOrigin.Begin);

        Assert.Equal(Sha(Content[28..]), stream.FinishHash());
    }

    [Theory]
    [InlineData(1L)]
    [InlineData(500L)]
    public void Seeking_anywhere_but_the_start_is_refused(long target)
    {
        using var stream = new HashingReadStream(new MemoryStream(Content));

        Assert.Throws<NotSupportedException>(() => stream.Position = target);
    }

    [Fact]
    public void Over_a_stream_that_cannot_seek_it_cannot_either()
    {
        using var stream = new HashingReadStream(new ForwardOnly(Content));

        Assert.False(stream.CanSeek);
        Assert.Throws<NotSupportedException>(() => stream.Position = 0);
        Assert.Equal(Sha(Content), stream.FinishHash());
    }

    private sealed class ForwardOnly(byte[] bytes) : MemoryStream(bytes)
    {
        public override bool CanSeek => false;
    }
}
