using BatchReconcile.Intake;
using BatchReconcile.Intake.Archive;
using BatchReconcile.Intake.Inbox;
using BatchReconcile.Reconciliation;
using BatchReconcile.Reconciliation.ProductionDays;
using BatchReconcile.Reconciliation.Settings;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Records.Exports;
using BatchReconcile.Records.Exports.Reading;
using BatchReconcile.Storage;
using BatchReconcile.Storage.Ingest;
using Microsoft.Extensions.Logging;
using Serilog.Context;

namespace BatchReconcile.Pipeline;

/// <summary>
/// Takes ready files from hash to archive: read and validate, reconcile every batch, store a group of
/// files in one transaction (each file atomic), and only then move each original file, byte for byte,
/// to the archive or, with its report, to quarantine.
/// </summary>
/// <remarks>
/// Crash safety comes from the order. Killed before the commit: nothing is stored and the file is still
/// in the inbox, so it is processed again. Killed after the commit but before the move: the file's hash
/// is known, so on restart it is recorded as a duplicate and moved where it belongs; nothing is stored twice.
/// </remarks>
public sealed class IngestPipeline(
    CatalogSource catalog,
    BatchStore store,
    FileMover mover,
    ReconciliationSettings settings,
    ProductionDayCalendar calendar,
    TimeProvider time,
    ILogger<IngestPipeline> logger)
{
    /// <summary>Processes a group of ready files in one transaction; returns one outcome per file, in order.</summary>
    public IReadOnlyList<FileOutcome> Process(IReadOnlyList<ReadyFile> files, CancellationToken cancellation = default)
    {
        var prepared = new List<PreparedFile>(files.Count);
        foreach (var file in files)
        {
            cancellation.ThrowIfCancellationRequested();
            prepared.Add(Prepare(file));
        }

        // Nothing is stored or moved once the group is prepared unless all of it is committed.
        cancellation.ThrowIfCancellationRequested();
        var results = store.Commit(prepared.Select(p => p.Ingest).ToList());
        return prepared.Zip(results, Settle).ToList();
    }

    /// <summary>Hashes, reads and reconciles one file; stores nothing.</summary>
    public PreparedFile Prepare(ReadyFile file)
    {
        var sha256 = FileHash.Sha256Of(file.FullPath);
        var known = store.FindFile(sha256);
        if (known is not null && known.Outcome != IngestOutcome.Quarantined)
        {
            // Same bytes as a file already taken: no need to read it again.
            return new PreparedFile(file, FileIngest.Accepted(file.Name, sha256, file.ArrivedAt, []), known);
        }

        try
        {
            var read = ExportReader.Read(file.FullPath, file.Name, catalog.Current);
            if (!read.IsValid)
            {
                return Quarantine(file, sha256, read.Errors, known);
            }

            var batches = read.Batches.Select(b => Reconcile(b, file.ArrivedAt)).ToList();
            return new PreparedFile(file, FileIngest.Accepted(file.Name, sha256, file.ArrivedAt, batches), known);
        }
        catch (Exception e) when (e is not (IOException or UnauthorizedAccessException or OperationCanceledException))
        {
            // A fault of the program on one file must not stop the others: the file goes to quarantine
            // untouched, with the reason, and nothing of it is stored.
            logger.LogError(e, "{File} could not be reconciled because of an internal error; quarantined", file.Name);
            var error = new ExportError(file.Name, 0, string.Empty, string.Empty, $"internal error while reconciling ({e.GetType().Name}: {e.Message}); nothing was stored, please report this file");
            return Quarantine(file, sha256, [error], known);
        }
    }

    private PreparedFile Quarantine(ReadyFile file, string sha256, IReadOnlyList<ExportError> errors, KnownFile? known)
    {
        var report = QuarantineReport.Render(file.Name, sha256, errors, time.GetUtcNow());
        return new PreparedFile(file, FileIngest.Quarantined(file.Name, sha256, file.ArrivedAt, errors, report), known);
    }

    /// <summary>Reads and reconciles one file without storing or moving anything (the <c>check</c> command).</summary>
    public (ExportReadResult Read, IReadOnlyList<BatchIngest> Batches) Check(string path, DateTimeOffset arrivedAt)
    {
        var read = ExportReader.Read(path, Path.GetFileName(path), catalog.Current);
        var batches = read.IsValid ? read.Batches.Select(b => Reconcile(b, arrivedAt)).ToList() : [];
        return (read, batches);
    }

    private BatchIngest Reconcile(BatchRecord batch, DateTimeOffset arrivedAt)
    {
        var current = catalog.Current;
        var recipe = current.FindRecipe(batch.RecipeCode, batch.RecipeVersion)
            ?? throw new InvalidOperationException($"recipe {batch.RecipeCode} v{batch.RecipeVersion} vanished between reading and reconciling");
        var outcome = BatchReconciler.Reconcile(batch, recipe, current, settings);
        return new BatchIngest(outcome, calendar.DayOfBatch(outcome, arrivedAt));
    }

    private FileOutcome Settle(PreparedFile prepared, FileCommitResult result)
    {
        var file = prepared.Source;
        using var _ = LogContext.PushProperty("File", file.Name);
        if (!result.Committed)
        {
            // A storage failure of this file alone (its savepoint was rolled back): nothing of it is
            // stored; it goes to quarantine with the reason so that it does not come round forever.
            logger.LogError(result.Failure, "{File} could not be stored; moved to quarantine", file.Name);
            var error = new ExportError(file.Name, 0, string.Empty, string.Empty, $"could not be stored: {result.Failure?.Message}");
            var moved = mover.MoveToQuarantine(file.FullPath, QuarantineReport.Render(file.Name, result.Sha256, [error], time.GetUtcNow()));
            return new FileOutcome(file.Name, result.Sha256, IngestOutcome.Quarantined, [], [error], moved.File.DestinationPath, moved.ReportPath);
        }

        var outcome = result.Outcome!.Value;
        if (outcome == IngestOutcome.Quarantined || prepared.Known?.Outcome == IngestOutcome.Quarantined)
        {
            var errors = prepared.Ingest.Errors;
            var moved = mover.MoveToQuarantine(file.FullPath, prepared.Ingest.Report ?? QuarantineReport.Render(file.Name, result.Sha256, errors, time.GetUtcNow()));
            foreach (var error in errors.Take(20))
            {
                logger.LogWarning("{File} line {Line} column {Column} value {Value}: {Reason}", file.Name, error.Line, error.Column, error.Value, error.Reason);
            }

            logger.LogWarning("{File} quarantined with {ErrorCount} problems; report {Report}", file.Name, errors.Count, moved.ReportPath);
            return new FileOutcome(file.Name, result.Sha256, outcome, [], errors, moved.File.DestinationPath, moved.ReportPath);
        }

        var archived = mover.MoveToArchive(file.FullPath);
        foreach (var batch in result.Batches)
        {
            logger.LogInformation("{File} batch {Batch} {Disposition} as revision {Revision} with {FlagCount} flags", file.Name, batch.BatchId, batch.Disposition, batch.Revision, batch.FlagIds.Count);
        }

        if (outcome == IngestOutcome.Duplicate)
        {
            logger.LogInformation("{File} is a duplicate ({Sha256}); archived without storing", file.Name, result.Sha256);
        }

        var storedNow = result.Batches.Where(b => b.Disposition != BatchDisposition.Unchanged).Select(b => b.BatchId).ToHashSet(StringComparer.Ordinal);
        foreach (var flag in prepared.Ingest.Batches.Where(b => storedNow.Contains(b.BatchId)).SelectMany(b => b.Outcome.Flags.Select(f => (b.BatchId, Flag: f))))
        {
            logger.LogInformation("{File} batch {Batch} step {Step} flag {Flag} ({Severity}): {Message}", file.Name, flag.BatchId, flag.Flag.Step, flag.Flag.Code, flag.Flag.Severity, flag.Flag.Message);
        }

        return new FileOutcome(file.Name, result.Sha256, outcome, result.Batches, [], archived.DestinationPath, null);
    }
}
