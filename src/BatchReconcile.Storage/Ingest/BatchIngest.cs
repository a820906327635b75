using BatchReconcile.Reconciliation.Outcomes;

namespace BatchReconcile.Storage.Ingest;

/// <summary>A reconciled batch ready to be stored, with the production day it belongs to.</summary>
public sealed record BatchIngest(BatchOutcome Outcome, DateOnly ProductionDay)
{
    public string BatchId => Outcome.Batch.BatchId;
}
