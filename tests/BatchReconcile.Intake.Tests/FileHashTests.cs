namespace BatchReconcile.Intake.Tests;

public sealed class FileHashTests : IDisposable
{
    private readonly TempFolder _temp = new();

    public void Dispose() => _temp.Dispose();

    // Test vectors of NIST FIPS 180-2, Appendix B.1 ("abc") and B.3 (one million 'a'); the empty-input
    // digest is the widely published SHA-256 of zero bytes (from memory, and agrees with .NET's SHA256).
    [Theory]
    [InlineData("", 0, "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855")]
    [InlineData("abc", 1, "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad")]
    [InlineData("a", 1_000_000, "cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0")]
    public async Task Hashes_match_the_published_vectors(string unit, int repeat, string expected)
    {
        var path = Path.Combine(_temp.Path, "data.bin");
        File.WriteAllText(path, string.Concat(Enumerable.Repeat(unit, repeat)));

        Assert.Equal(expected, FileHash.Sha256Of(path));
        Assert.Equal(expected, await FileHash.Sha256OfAsync(path));
        Assert.Equal(expected, FileHash.Sha256Of(File.ReadAllBytes(path)));
    }
}
