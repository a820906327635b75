using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Storage.Sql;

namespace BatchReconcile.Storage.Ingest;

/// <summary>A reconciled batch ready to be stored, with the production day it belongs to.</summary>
/// <remarks>
/// What the store derives from the batch (its content hash, its raw rows and the JSON columns as stored) is computed
/// once, when first asked for; <see cref="Precompute"/> lets a reader on another thread do it before the
/// batch is handed to the store, so the store's thread only writes. Equality is that of the outcome and
/// the day: whether the derived values were computed yet does not matter.
/// </remarks>
public sealed record BatchIngest(BatchOutcome Outcome, DateOnly ProductionDay)
{
    private string? _contentSha256;
    private RawRowsText? _rawRows;
    private StoredStepText[]? _stepTexts;
    private string? _linksJson;

    public string BatchId => Outcome.Batch.BatchId;

    /// <summary>The <see cref="BatchContentHash"/> of the batch's rows.</summary>
    public string ContentSha256 => _contentSha256 ??= BatchContentHash.Compute(Outcome.Batch);

    internal RawRowsText RawRows => _rawRows ??= RawRowsText.Of(Outcome.Batch.Rows);

    /// <summary>The JSON columns of each step, in the order of <see cref="BatchOutcome.Steps"/>.</summary>
    internal IReadOnlyList<StoredStepText> StepTexts => _stepTexts ??= Outcome.Steps.Select(StoredStepText.Of).ToArray();

    /// <summary>The intermediate links as stored (<c>batch_revision.step_links</c>).</summary>
    internal string LinksJson => _linksJson ??= Outcome.Links.Count == 0 ? "[]" : StoreJson.Links(Outcome.Links);

    /// <summary>Computes the derived values now (on the caller's thread); returns this batch.</summary>
    public BatchIngest Precompute()
    {
        _ = ContentSha256;
        _ = RawRows;
        _ = StepTexts;
        _ = LinksJson;
        return this;
    }

    public bool Equals(BatchIngest? other) =>
        other is not null && EqualityComparer<BatchOutcome>.Default.Equals(Outcome, other.Outcome) && ProductionDay == other.ProductionDay;

    public override int GetHashCode() => HashCode.Combine(Outcome, ProductionDay);
}

/// <summary>The JSON columns of one stored step (<c>step_result</c>).</summary>
internal sealed record StoredStepText(string Equivalents, string Ladder, string? EquivalentsRanges)
{
    public static StoredStepText Of(StepOutcome step) => new(
        StoreJson.Equivalents(step.Equivalents),
        StoreJson.Ladder(step.Ladder),
        step.Limits.EquivalentsRanges is { } ranges ? StoreJson.EquivalentsRanges(ranges) : null);
}
