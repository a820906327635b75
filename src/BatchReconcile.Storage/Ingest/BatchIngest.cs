using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Storage.Sql;

namespace BatchReconcile.Storage.Ingest;

/// <summary>A reconciled batch ready to be stored, with the production day it belongs to.</summary>
/// <remarks>
/// What the store derives from the batch's rows (its content hash, its raw rows as stored) is computed
/// once, when first asked for; <see cref="Precompute"/> lets a reader on another thread do it before the
/// batch is handed to the store, so the store's thread only writes. Equality is that of the outcome and
/// the day: whether the derived values were computed yet does not matter.
/// </remarks>
public sealed record BatchIngest(BatchOutcome Outcome, DateOnly ProductionDay)
{
    private string? _contentSha256;
    private RawRowsText? _rawRows;

    public string BatchId => Outcome.Batch.BatchId;

    /// <summary>The <see cref="BatchContentHash"/> of the batch's rows.</summary>
    public string ContentSha256 => _contentSha256 ??= BatchContentHash.Compute(Outcome.Batch);

    internal RawRowsText RawRows => _rawRows ??= RawRowsText.Of(Outcome.Batch.Rows);

    /// <summary>Computes the derived values now (on the caller's thread); returns this batch.</summary>
    public BatchIngest Precompute()
    {
        _ = ContentSha256;
        _ = RawRows;
        return this;
    }

    public bool Equals(BatchIngest? other) =>
        other is not null && EqualityComparer<BatchOutcome>.Default.Equals(Outcome, other.Outcome) && ProductionDay == other.ProductionDay;

    public override int GetHashCode() => HashCode.Combine(Outcome, ProductionDay);
}
