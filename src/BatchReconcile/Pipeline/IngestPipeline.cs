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
    /// <summary>Files up to this size are read once, into memory: the hash and both passes of the reader
    /// work on the same bytes (a group holds at most its file count times this).</summary>
    public const int InMemoryMaxBytes = 64 * 1024;

    /// <summary>How many times a file that changes while it is read is read again within one call, before it is left in the inbox.</summary>
    public const int MaxReads = 3;

    /// <summary>Processes a group of ready files in one transaction; returns one outcome per file, in order.</summary>
    /// <remarks><para>New files are read and reconciled on a second thread (<see cref="ReadAhead"/>) while the
    /// store writes the batches of the files before them; the store still takes them one by one, in order.</para>
    /// <para>A file whose bytes change while it is read is not stored at all and is read again, with its new
    /// content, up to <see cref="MaxReads"/> times; a file still changing then stays in the inbox
    /// (<see cref="FilesStillChangingException"/>, which carries the outcomes of the other files; the service
    /// takes it again later).</para></remarks>
    public IReadOnlyList<FileOutcome> Process(IReadOnlyList<ReadyFile> files, CancellationToken cancellation = default)
    {
        var outcomes = ProcessOnce(files, cancellation).ToArray();
        for (var read = 2; read <= MaxReads && outcomes.Any(o => o is null); read++)
        {
            var again = Enumerable.Range(0, files.Count).Where(i => outcomes[i] is null).ToList();
            var retried = ProcessOnce(again.Select(i => Refreshed(files[i])).ToList(), cancellation);
            for (var k = 0; k < again.Count; k++)
            {
                outcomes[again[k]] = retried[k];
            }
        }

        var still = Enumerable.Range(0, files.Count).Where(i => outcomes[i] is null).Select(i => files[i].Name).ToList();
        if (still.Count > 0)
        {
            throw new FilesStillChangingException(outcomes.OfType<FileOutcome>().ToList(), still);
        }

        return outcomes!;
    }

    /// <summary>One transaction over the group; null for a file that changed while it was read (nothing of it stored or moved).</summary>
    private IReadOnlyList<FileOutcome?> ProcessOnce(IReadOnlyList<ReadyFile> files, CancellationToken cancellation)
    {
        IReadOnlyList<FileCommitResult> results;
        var prepared = new List<PreparedFile>(files.Count);
        using (var readAhead = new ReadAhead())
        {
            foreach (var file in files)
            {
                cancellation.ThrowIfCancellationRequested();
                prepared.Add(Prepare(file, readAhead));
            }

            readAhead.Complete();

            // Nothing is stored or moved once the group is prepared unless all of it is committed.
            cancellation.ThrowIfCancellationRequested();
            results = store.Commit(prepared.Select(p => p.Ingest).ToList());
        }

        // The read-ahead has stopped: no file of the group is read while it is moved.
        return prepared.Zip(results, Settle).ToList();
    }

    private static ReadyFile Refreshed(ReadyFile file)
    {
        var info = new FileInfo(file.FullPath);
        return info.Exists ? file with { Size = info.Length, LastWriteUtc = info.LastWriteTimeUtc } : file;
    }

    /// <summary>
    /// Hashes one file and decides how it is to be stored; stores nothing. A new file is not stored here:
    /// it is read and reconciled by <paramref name="readAhead"/> and stored batch by batch inside the
    /// commit (<see cref="FileIngest.Streamed"/>).
    /// </summary>
    /// <remarks>
    /// Every new file, small or large, takes the streamed path: one path to keep right. A small file is
    /// read once, into memory, so the bytes that are hashed are the bytes that are read; a larger one is
    /// hashed and then read again from the disk, holding about one batch at a time.
    /// </remarks>
    private PreparedFile Prepare(ReadyFile file, ReadAhead readAhead)
    {
        byte[]? content = null;
        string? readPath = null;
        string sha256;
        var readAt = time.GetUtcNow();
        if (file.Size <= InMemoryMaxBytes)
        {
            content = File.ReadAllBytes(file.FullPath);
            sha256 = FileHash.Sha256Of(content);
        }
        else
        {
            // Read under a second name: a rename over the inbox name meanwhile leaves these bytes reachable for the archive.
            readPath = ReadingLink.Create(file.FullPath) ?? file.FullPath;
            sha256 = FileHash.Sha256Of(readPath);
        }

        var known = store.FindFile(sha256);
        if (known is null)
        {
            var index = readAhead.Add(storeBatch => Produce(file with { FullPath = readPath ?? file.FullPath }, content, sha256, storeBatch));
            return new PreparedFile(file, FileIngest.Streamed(file.Name, sha256, file.ArrivedAt, storeBatch => readAhead.Consume(index, storeBatch)).WithReadAt(readAt), null, content, readPath);
        }

        if (known.Outcome != IngestOutcome.Quarantined)
        {
            // Same bytes as a file already taken: no need to read it again.
            return new PreparedFile(file, FileIngest.Accepted(file.Name, sha256, file.ArrivedAt, []).WithReadAt(readAt), known, content, readPath);
        }

        // Same bytes as a file quarantined before: logged as a duplicate and sent back to quarantine
        // with a fresh report, so only its errors are wanted; its batches are dropped as they are read.
        var scan = Scan(file, content, catalog.Current, calendar.Zone, static _ => { });
        var ingest = scan.IsValid
            ? FileIngest.Accepted(file.Name, sha256, file.ArrivedAt, [])
            : FileIngest.Quarantined(file.Name, sha256, file.ArrivedAt, scan.Errors, QuarantineReport.Render(file.Name, sha256, scan.Errors, time.GetUtcNow()));
        return new PreparedFile(file, ingest, known, content, readPath);
    }

    /// <summary>Reads and reconciles one file without storing or moving anything (the <c>check</c> command).</summary>
    public (ExportReadResult Read, IReadOnlyList<BatchIngest> Batches) Check(string path, DateTimeOffset arrivedAt)
    {
        var current = catalog.Current;
        var read = ExportReader.Read(path, Path.GetFileName(path), current, calendar.Zone);
        var batches = read.IsValid ? read.Batches.Select(b => Reconcile(b, current, arrivedAt)).ToList() : [];
        return (read, batches);
    }

    /// <summary>Reads the file and hands each batch over, reconciled, as soon as its last row is read (the
    /// store writes it inside the file's savepoint). An error found later makes the store roll back what it stored.</summary>
    private StreamedFileEnd Produce(ReadyFile file, byte[]? content, string sha256, Action<BatchIngest> storeBatch)
    {
        // One snapshot of the definitions for the whole file, so that a reload meanwhile cannot read
        // one part of the file against one version of them and reconcile another against the next.
        var current = catalog.Current;
        try
        {
            void OnBatch(BatchRecord batch) => storeBatch(ReconcileOrFault(batch, current, file.ArrivedAt).Precompute());
            ExportScanResult scan;
            if (content is null)
            {
                // A file too large for memory is read a second time to be parsed: the bytes parsed are hashed as they
                // are read, and a file rewritten in between is not stored (it is read again) rather than stored as
                // one content under the hash of another.
                using var hashing = new HashingReadStream(new FileStream(file.FullPath, FileMode.Open, FileAccess.Read, FileShare.Read, 81920, FileOptions.SequentialScan));
                scan = ExportReader.Scan(hashing, file.Name, current, calendar.Zone, OnBatch);
                if (!string.Equals(hashing.FinishHash(), sha256, StringComparison.Ordinal))
                {
                    return StreamedFileEnd.Changed;
                }
            }
            else
            {
                scan = Scan(file, content, current, calendar.Zone, OnBatch);
            }

            return scan.IsValid
                ? StreamedFileEnd.Valid
                : StreamedFileEnd.Rejected(scan.Errors, QuarantineReport.Render(file.Name, sha256, scan.Errors, time.GetUtcNow()));
        }
        catch (ReconcileFault fault)
        {
            // A fault of the program on one file must not stop the others: what was stored of the file is
            // rolled back, and the file goes to quarantine untouched, with the reason.
            logger.LogError(fault.InnerException, "{File} could not be reconciled because of an internal error; quarantined", file.Name);
            ExportError[] errors = [new ExportError(file.Name, 0, string.Empty, string.Empty, $"internal error while reconciling ({fault.InnerException!.GetType().Name}: {fault.Message}); nothing was stored, please report this file")];
            return StreamedFileEnd.Rejected(errors, QuarantineReport.Render(file.Name, sha256, errors, time.GetUtcNow()));
        }
    }

    private static ExportScanResult Scan(ReadyFile file, byte[]? content, ProcessCatalog current, TimeZoneInfo zone, Action<BatchRecord> onBatch)
    {
        if (content is null)
        {
            return ExportReader.Scan(file.FullPath, file.Name, current, zone, onBatch);
        }

        return ExportReader.Scan(content, file.Name, current, zone, onBatch);
    }

    private BatchIngest ReconcileOrFault(BatchRecord batch, ProcessCatalog current, DateTimeOffset arrivedAt)
    {
        try
        {
            return Reconcile(batch, current, arrivedAt);
        }
        catch (Exception e) when (e is not OperationCanceledException)
        {
            throw new ReconcileFault(e);
        }
    }

    private BatchIngest Reconcile(BatchRecord batch, ProcessCatalog current, DateTimeOffset arrivedAt)
    {
        var recipe = current.FindRecipe(batch.RecipeCode, batch.RecipeVersion)
            ?? throw new InvalidOperationException($"recipe {batch.RecipeCode} v{batch.RecipeVersion} is not in the definitions the file was read against");
        var outcome = BatchReconciler.Reconcile(batch, recipe, current, settings);
        return new BatchIngest(outcome, calendar.DayOfBatch(outcome, arrivedAt));
    }

    private FileOutcome? Settle(PreparedFile prepared, FileCommitResult result)
    {
        try
        {
            return SettleFile(prepared, result);
        }
        finally
        {
            if (prepared.ReadPath is { } link && !string.Equals(link, prepared.Source.FullPath, StringComparison.Ordinal) && File.Exists(link))
            {
                File.Delete(link);
            }
        }
    }

    private FileOutcome? SettleFile(PreparedFile prepared, FileCommitResult result)
    {
        var file = prepared.Source;
        using var _ = LogContext.PushProperty("File", file.Name);
        if (result.Failure is FileChangedException changed)
        {
            logger.LogWarning("{Reason}", changed.Message);
            return null;
        }

        if (result.TakenBy is { } taken)
        {
            // Two instances on one inbox and one store: the other one stored it and moves it.
            logger.LogInformation("{File} ({Sha256}) was stored by another instance at {At:O} while this one read it; left to that instance", file.Name, result.Sha256, taken.ProcessedAt);
            return null;
        }

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
            var errors = result.Errors;
            var moved = mover.MoveToQuarantine(file.FullPath, result.Report ?? QuarantineReport.Render(file.Name, result.Sha256, errors, time.GetUtcNow()));
            foreach (var error in errors.Take(20))
            {
                logger.LogWarning("{File} line {Line} column {Column} value {Value}: {Reason}", file.Name, error.Line, error.Column, error.Value, error.Reason);
            }

            logger.LogWarning("{File} quarantined with {ErrorCount} problems; report {Report}", file.Name, errors.Count, moved.ReportPath);
            return new FileOutcome(file.Name, result.Sha256, outcome, [], errors, moved.File.DestinationPath, moved.ReportPath);
        }

        // A duplicate whose copy the archive already holds is removed from the inbox, not archived twice.
        var (archived, alreadyArchived) = outcome == IngestOutcome.Duplicate
            ? mover.MoveDuplicate(file.FullPath, result.Sha256)
            : (Archive(prepared, result.Sha256), false);
        foreach (var batch in result.Batches)
        {
            // Names as the user reads them (new, revision, yield-low, major), never the program's enum names.
            logger.LogInformation(
                "{File} batch {Batch} {Disposition} as revision {Revision} with {FlagCount} flags; recipe {Recipe} v{RecipeVersion} ({RecipeVersionSource})",
                file.Name, batch.BatchId, batch.Disposition.ToText(), batch.Revision, batch.FlagIds.Count, batch.Recipe, batch.RecipeVersion, batch.RecipeVersionSource.ToText());
        }

        if (outcome == IngestOutcome.Duplicate)
        {
            if (alreadyArchived)
            {
                logger.LogInformation("{File} is a duplicate ({Sha256}) of {Archived}, already archived; removed from the inbox without storing", file.Name, result.Sha256, archived.DestinationPath);
            }
            else
            {
                logger.LogInformation("{File} is a duplicate ({Sha256}); archived without storing", file.Name, result.Sha256);
            }
        }

        // The flags are read back from the store rather than kept from reconciling: a large file's
        // outcomes are gone by now, and only what was committed is logged.
        if (result.Batches.Any(b => b.FlagIds.Count > 0) && result.IngestId is { } ingestId)
        {
            store.ForEachFlagOfIngest(ingestId, (batchId, stored) =>
            {
                var flag = stored.Flag;
                logger.LogInformation("{File} batch {Batch} step {Step} flag {Flag} ({Severity}): {Message}", file.Name, batchId, flag.Step, flag.Code.ToText(), flag.Severity.ToText(), flag.Message);
            });
        }

        return new FileOutcome(file.Name, result.Sha256, outcome, result.Batches, [], archived.DestinationPath, null);
    }

    /// <summary>
    /// Moves the file to the archive, once it is sure that the file in the inbox is still the one that was read (same
    /// size and SHA-256). When it is not, the inbox file is new content and stays there
    /// as a new arrival; the archive gets the bytes that were read when they are still in memory.
    /// </summary>
    private MovedFile Archive(PreparedFile prepared, string sha256)
    {
        var file = prepared.Source;
        var info = new FileInfo(file.FullPath);
        // A small file is compared by size first and then read again (it is in the page cache); a large one is hashed again.
        var same = info.Exists && (prepared.Content is { } read
            ? info.Length == read.Length && string.Equals(FileHash.Sha256Of(File.ReadAllBytes(file.FullPath)), sha256, StringComparison.Ordinal)
            : string.Equals(FileHash.Sha256Of(file.FullPath), sha256, StringComparison.Ordinal));
        if (same)
        {
            return mover.MoveToArchive(file.FullPath);
        }

        if (prepared.Content is { } content)
        {
            logger.LogWarning("{File} changed after it was read; the content that was stored is archived from memory and the new content stays in the inbox as a new arrival", file.Name);
            return mover.WriteToArchive(file.FullPath, content);
        }

        if (prepared.ReadPath is { } link && !string.Equals(link, file.FullPath, StringComparison.Ordinal)
            && string.Equals(FileHash.Sha256Of(link), sha256, StringComparison.Ordinal))
        {
            logger.LogWarning("{File} was replaced after it was read; the content that was stored is archived and the new content stays in the inbox as a new arrival", file.Name);
            return mover.MoveToArchive(link, file.Name);
        }

        logger.LogError("{File} changed after it was read and before it was archived; the stored content ({Sha256}) is kept in the database's raw rows but not in the archive, and the new content stays in the inbox as a new arrival", file.Name, sha256);
        return new MovedFile(file.FullPath, file.FullPath, false);
    }

    /// <summary>Carries a reconciling fault out of the reader's callback, apart from the store's own errors.</summary>
    private sealed class ReconcileFault(Exception inner) : Exception(inner.Message, inner);
}
