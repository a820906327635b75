using System.Security.Cryptography;

namespace BatchReconcile.Intake;

/// <summary>Content hashes of files, read as a stream (memory does not grow with the file).</summary>
public static class FileHash
{
    /// <summary>SHA-256 of the file's bytes as 64 lowercase hex digits.</summary>
    public static string Sha256Of(string path)
    {
        using var stream = OpenForHash(path);
        return Convert.ToHexStringLower(SHA256.HashData(stream));
    }

    /// <summary>SHA-256 of a file's bytes already read into memory, in the same form as <see cref="Sha256Of(string)"/>.</summary>
    public static string Sha256Of(ReadOnlySpan<byte> content) => Convert.ToHexStringLower(SHA256.HashData(content));

    /// <summary>SHA-256 of the file's bytes as 64 lowercase hex digits.</summary>
    public static async Task<string> Sha256OfAsync(string path, CancellationToken cancellationToken = default)
    {
        var stream = OpenForHash(path);
        await using (stream.ConfigureAwait(false))
        {
            var hash = await SHA256.HashDataAsync(stream, cancellationToken).ConfigureAwait(false);
            return Convert.ToHexStringLower(hash);
        }
    }

    private static FileStream OpenForHash(string path) =>
        new(path, FileMode.Open, FileAccess.Read, FileShare.Read, bufferSize: 81920, FileOptions.SequentialScan);
}
