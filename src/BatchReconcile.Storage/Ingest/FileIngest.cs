using BatchReconcile.Records.Exports;

namespace BatchReconcile.Storage.Ingest;

/// <summary>
/// One export file, read and reconciled, ready for <see cref="BatchStore.Commit"/>: either its
/// batches (accepted) or its contract errors (quarantined). Whether it is stored, a revision or a
/// duplicate is decided by the store inside the commit.
/// </summary>
public sealed record FileIngest
{
    private FileIngest(
        string fileName,
        string sha256,
        DateTimeOffset receivedAt,
        IReadOnlyList<BatchIngest> batches,
        IReadOnlyList<ExportError> errors,
        string? report)
    {
        FileName = fileName;
        Sha256 = sha256;
        ReceivedAt = receivedAt;
        Batches = batches;
        Errors = errors;
        Report = report;
    }

    /// <summary>The file's name as it arrived in the inbox (no folder).</summary>
    public string FileName { get; }

    /// <summary>SHA-256 of the file's bytes, lower-case hex.</summary>
    public string Sha256 { get; }

    /// <summary>When the file arrived in the inbox.</summary>
    public DateTimeOffset ReceivedAt { get; }

    public IReadOnlyList<BatchIngest> Batches { get; }

    public IReadOnlyList<ExportError> Errors { get; }

    /// <summary>The human-readable report written beside a quarantined file, kept in the ingest log.</summary>
    public string? Report { get; }

    public bool IsQuarantined => Errors.Count > 0;

    /// <summary>A file that passed the contract.</summary>
    /// <exception cref="ArgumentException">A bad hash, an empty name, or the same batch twice (the reader groups rows by batch).</exception>
    public static FileIngest Accepted(string fileName, string sha256, DateTimeOffset receivedAt, IReadOnlyList<BatchIngest> batches)
    {
        ArgumentNullException.ThrowIfNull(batches);
        var duplicate = batches.GroupBy(b => b.BatchId, StringComparer.Ordinal).FirstOrDefault(g => g.Count() > 1);
        if (duplicate is not null)
        {
            throw new ArgumentException($"Batch {duplicate.Key} appears {duplicate.Count()} times in {fileName}.", nameof(batches));
        }

        return new FileIngest(CheckName(fileName), NormaliseSha256(sha256), receivedAt, batches, [], null);
    }

    /// <summary>A file that broke the contract: only its ingest log entry and error count are stored.</summary>
    /// <exception cref="ArgumentException">No errors given, a bad hash or an empty name.</exception>
    public static FileIngest Quarantined(string fileName, string sha256, DateTimeOffset receivedAt, IReadOnlyList<ExportError> errors, string? report = null)
    {
        ArgumentNullException.ThrowIfNull(errors);
        if (errors.Count == 0)
        {
            throw new ArgumentException("A quarantined file needs at least one error.", nameof(errors));
        }

        return new FileIngest(CheckName(fileName), NormaliseSha256(sha256), receivedAt, [], errors, report);
    }

    /// <summary>Lower-case form of a SHA-256 hex digest.</summary>
    /// <exception cref="ArgumentException">Not 64 hexadecimal digits.</exception>
    public static string NormaliseSha256(string sha256)
    {
        ArgumentNullException.ThrowIfNull(sha256);
        if (sha256.Length != 64 || !sha256.All(char.IsAsciiHexDigit))
        {
            throw new ArgumentException($"'{sha256}' is not a SHA-256 digest (64 hexadecimal digits).", nameof(sha256));
        }

        return sha256.ToLowerInvariant();
    }

    private static string CheckName(string fileName)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(fileName);
        return fileName;
    }
}
