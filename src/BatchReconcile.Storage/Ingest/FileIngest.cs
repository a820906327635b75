using BatchReconcile.Records.Exports;

namespace BatchReconcile.Storage.Ingest;

/// <summary>
/// One export file ready for <see cref="BatchStore.Commit"/>: its batches, read and reconciled
/// (accepted), its contract errors (quarantined), or a producer that reads and reconciles it while
/// the store writes each batch (streamed). Whether it is stored, a revision or a duplicate is
/// decided by the store inside the commit.
/// </summary>
public sealed record FileIngest
{
    private readonly Func<Action<BatchIngest>, StreamedFileEnd>? _produce;

    private FileIngest(
        string fileName,
        string sha256,
        DateTimeOffset receivedAt,
        IReadOnlyList<BatchIngest> batches,
        IReadOnlyList<ExportError> errors,
        string? report,
        Func<Action<BatchIngest>, StreamedFileEnd>? produce = null)
    {
        FileName = fileName;
        Sha256 = sha256;
        ReceivedAt = receivedAt;
        Batches = batches;
        Errors = errors;
        Report = report;
        _produce = produce;
    }

    /// <summary>The file's name as it arrived in the inbox (no folder).</summary>
    public string FileName { get; }

    /// <summary>SHA-256 of the file's bytes, lower-case hex.</summary>
    public string Sha256 { get; }

    /// <summary>When the file arrived in the inbox.</summary>
    public DateTimeOffset ReceivedAt { get; }

    /// <summary>
    /// When this process read the file's bytes for the hash, on the store's clock (set by the service's pipeline).
    /// A first ingest of the same name and bytes recorded after the file arrived and less than
    /// <see cref="BatchStore.TakenWindow"/> before this moment was made by another instance on the same inbox, which took
    /// the file first (<see cref="FileCommitResult.TakenBy"/>). Null: no such check.
    /// </summary>
    public DateTimeOffset? ReadAt { get; private set; }

    /// <summary>Sets <see cref="ReadAt"/>; returns this file.</summary>
    public FileIngest WithReadAt(DateTimeOffset readAt)
    {
        ReadAt = readAt;
        return this;
    }

    /// <summary>The batches of an accepted file; empty for a streamed one (they exist only while it is stored).</summary>
    public IReadOnlyList<BatchIngest> Batches { get; }

    /// <summary>The errors of a quarantined file; empty for a streamed one (the store returns them in
    /// <see cref="FileCommitResult.Errors"/>).</summary>
    public IReadOnlyList<ExportError> Errors { get; }

    /// <summary>The human-readable report written beside a quarantined file, kept in the ingest log.</summary>
    public string? Report { get; }

    public bool IsQuarantined => Errors.Count > 0;

    /// <summary>True when the batches are produced during the commit (<see cref="Streamed"/>).</summary>
    public bool IsStreamed => _produce is not null;

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

    /// <summary>
    /// A file read and reconciled while it is stored, so that memory holds about one batch rather
    /// than the whole file. Inside the file's savepoint the store calls <paramref name="produce"/>
    /// once with a callback that stores a batch before it returns; the producer hands over each batch
    /// as soon as it is complete and returns how the file ended. When it ended with errors, whatever
    /// was stored is rolled back and the file is recorded as quarantined with them.
    /// </summary>
    /// <remarks>The producer must hand each batch id over at most once (the reader groups rows by batch);
    /// a second one fails the file. An exception it throws is treated like one of the store's own: a
    /// SQLite, invalid-data or argument error fails this file only (rolled back, <see cref="FileCommitResult.Failure"/>),
    /// any other ends the whole commit with nothing of the group stored.</remarks>
    /// <exception cref="ArgumentException">A bad hash or an empty name.</exception>
    public static FileIngest Streamed(string fileName, string sha256, DateTimeOffset receivedAt, Func<Action<BatchIngest>, StreamedFileEnd> produce)
    {
        ArgumentNullException.ThrowIfNull(produce);
        return new FileIngest(CheckName(fileName), NormaliseSha256(sha256), receivedAt, [], [], null, produce);
    }

    /// <summary>Hands every batch of the file to <paramref name="store"/>: those of the list, or the producer's.</summary>
    internal StreamedFileEnd Produce(Action<BatchIngest> store)
    {
        if (_produce is not null)
        {
            return _produce(store) ?? throw new InvalidOperationException($"The producer of {FileName} returned no end.");
        }

        foreach (var batch in Batches)
        {
            store(batch);
        }

        return Errors.Count > 0 ? StreamedFileEnd.Rejected(Errors, Report) : StreamedFileEnd.Valid;
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
