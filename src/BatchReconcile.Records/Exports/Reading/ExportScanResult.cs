namespace BatchReconcile.Records.Exports.Reading;

/// <summary>The outcome of a streaming scan of one export (<see cref="ExportReader.Scan(string, string, BatchReconcile.Records.Definitions.ProcessCatalog, TimeZoneInfo, Action{BatchRecord})"/>).</summary>
/// <param name="Errors">Every problem found (capped, with a last "... and N more" entry). When there is
/// any, the file is rejected as a whole, including batches already handed to the callback.</param>
/// <param name="BatchesDelivered">How many batches were handed to the callback.</param>
/// <param name="DataRows">Data rows read (blank lines not counted).</param>
/// <param name="PeakRowsHeld">Most rows held in memory at once: the bound the streaming read keeps.</param>
/// <param name="PeakBatchesHeld">Most batches open at once.</param>
public sealed record ExportScanResult(
    string FileName,
    IReadOnlyList<ExportError> Errors,
    int BatchesDelivered,
    long DataRows,
    int PeakRowsHeld,
    int PeakBatchesHeld)
{
    public bool IsValid => Errors.Count == 0;
}
