using System.Data.Common;
using System.Globalization;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Records.Exports;
using BatchReconcile.Storage.Audit;
using BatchReconcile.Storage.Ingest;
using BatchReconcile.Storage.Sql;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage;

public sealed partial class BatchStore
{
    /// <summary>
    /// At most this many batches are listed in a file's audit entry (<c>ingest.stored</c>, ...); a larger
    /// file's entry adds <c>batchCount</c> and <c>batchesNotListed</c>.
    /// </summary>
    /// <remarks>The entry is one JSON text that is hashed whole: listing every batch of a 200 MB export
    /// would take more memory than the rest of its ingestion. Each batch revision still records its file
    /// (<c>batch_revision.ingest_ref</c>), and each new revision of a stored batch has its own entry.</remarks>
    public const int MaxAuditedBatches = 1000;

    /// <summary>How recent another instance's first ingest of the same file must be for this one to leave the file to it.</summary>
    public static readonly TimeSpan TakenWindow = TimeSpan.FromSeconds(60);

    /// <summary>
    /// Stores a group of files in ONE transaction (one sync to disk for the whole group), each file
    /// all-or-nothing inside it. Files are taken in list order, so a later file sees the batches of
    /// an earlier one (a re-export in the same group becomes a revision).
    /// </summary>
    /// <returns>One result per file, in order. A file that failed has a null outcome and its
    /// <see cref="FileCommitResult.Failure"/>; nothing of it is stored, the other files are.</returns>
    /// <remarks>
    /// When this returns, every committed file's hash is known (<see cref="IsKnown"/>) and on disk
    /// to the degree <see cref="StoreSettings.Synchronous"/> promises; only then may the host move
    /// the files. When it throws, nothing of the group is stored.
    /// </remarks>
    /// <exception cref="StoreException">SQLite abandoned the whole transaction (disk full, I/O error); nothing was stored.</exception>
    public IReadOnlyList<FileCommitResult> Commit(IReadOnlyList<FileIngest> files)
    {
        ArgumentNullException.ThrowIfNull(files);
        return Guarded(() => CommitGroup(files));
    }

    private IReadOnlyList<FileCommitResult> CommitGroup(IReadOnlyList<FileIngest> files)
    {
        lock (_gate)
        {
            ThrowIfDisposed();
            var now = _time.GetUtcNow();
            var results = new List<FileCommitResult>(files.Count);
            using var transaction = BeginWrite();
            using (var statements = new CommitStatements(_connection, transaction))
            {
                foreach (var file in files)
                {
                    statements.BeginFile.Execute();
                    try
                    {
                        results.Add(CommitFile(statements, file, now, statements.RollBackFile));
                        statements.EndFile.Execute();
                    }
                    // A fault of the database itself (locked, full, read-only, I/O) is not the file's: it abandons the
                    // whole group (Guarded turns it into a transient StoreException) and every file stays in the inbox.
                    catch (Exception failure) when (failure is DbException s ? StoreFaults.Describe(s) is null
                        : failure is InvalidDataException or NotSupportedException or ArgumentException)
                    {
                        RollBackFile(statements, file, failure);
                        results.Add(new FileCommitResult(file.FileName, file.Sha256, null, null, [], file.Errors.Count, failure));
                    }
                }
            }

            transaction.Commit();
            return results;
        }
    }

    private static void RollBackFile(CommitStatements statements, FileIngest file, Exception failure)
    {
        try
        {
            statements.RollBackFile();
            statements.EndFile.Execute();
        }
        catch (DbException lost)
        {
            // Some errors (disk full, I/O; on PostgreSQL a lost connection) abandon the whole transaction; then the
            // earlier files of the group are gone too and only the caller can retry them.
            throw new StoreException(
                $"Storing {file.FileName} failed ({failure.Message}) and the database abandoned the whole group; nothing of it was stored.",
                new AggregateException(failure, lost));
        }
    }

    /// <summary>Stores one file inside its savepoint; <paramref name="rollBackFile"/> undoes all of it
    /// and leaves the savepoint open.</summary>
    /// <remarks>
    /// Every file with batches, listed or streamed, takes the same path: each batch is planned against
    /// the store and written as soon as it is handed over, so a streamed file holds about one batch in
    /// memory. The file's log entry is written first (its revisions refer to it) and its outcome and
    /// batch count are set at the end, when they are known. An error the producer reports after some
    /// batches were written rolls the file back to its savepoint, and it is logged as quarantined.
    /// </remarks>
    private static FileCommitResult CommitFile(CommitStatements sql, FileIngest file, DateTimeOffset now, Action rollBackFile)
    {
        var known = ReadKnownFile(sql.FindFile.Set("$sha256", file.Sha256));
        if (known is not null && file.ReadAt is { } readAt && string.Equals(known.FileName, file.FileName, StringComparison.Ordinal)
            && known.ProcessedAt > file.ReceivedAt && readAt - known.ProcessedAt < TakenWindow)
        {
            // Stored under its name after it arrived in the inbox, moments before this instance read it: another instance
            // on the same inbox took it first (the site's write lock made this commit wait for that one), and moves it.
            // Nothing is recorded twice. Past the window a file still there is a resend and is logged as a duplicate.
            return new FileCommitResult(file.FileName, file.Sha256, null, null, [], 0, null) { TakenBy = known };
        }

        if (known is not null)
        {
            // A streamed file known by its hash (its twin came earlier in the same group) is never read,
            // so its batch count is 0, as for a known file in a later group.
            var id = LogIngest(sql, file, IngestOutcome.Duplicate, file.Errors.Count, file.Batches.Count, file.Report, now);
            Audit(sql, now, "ingest.duplicate", file, new { file = file.FileName, sha256 = file.Sha256, firstIngest = known.IngestId, firstOutcome = known.Outcome.ToText() });
            return new FileCommitResult(file.FileName, file.Sha256, IngestOutcome.Duplicate, id, [], file.Errors.Count, null) { Errors = file.Errors, Report = file.Report };
        }

        if (file.IsQuarantined)
        {
            return LogQuarantined(sql, file, file.Errors, file.Report, now);
        }

        var ingestId = LogIngest(sql, file, IngestOutcome.Stored, 0, 0, null, now);
        var batches = new List<(int FirstLine, BatchCommitResult Result)>();
        var seen = new HashSet<string>(StringComparer.Ordinal);
        var end = file.Produce(batch =>
        {
            ArgumentNullException.ThrowIfNull(batch);
            if (!seen.Add(batch.BatchId))
            {
                throw new ArgumentException($"Batch {batch.BatchId} appears twice in {file.FileName}.", nameof(batch));
            }

            var (plan, batchRef, currentRef) = PlanBatch(sql.FindBatch, batch.Outcome.Batch.BatchId, batch.ContentSha256);
            var result = plan.Disposition == BatchDisposition.Unchanged
                ? new BatchCommitResult(plan.BatchId, plan.Disposition, plan.Revision, [], batch.Outcome.Batch.RecipeCode, batch.Outcome.Batch.RecipeVersion, batch.Outcome.Batch.RecipeVersionSource)
                : StoreRevision(sql, file, ingestId, batch, plan, batchRef, currentRef, now);
            batches.Add((batch.Outcome.Batch.Rows.Count > 0 ? batch.Outcome.Batch.Rows[0].Line : 0, result));
        });

        if (end.IsChanged)
        {
            // Not the file's fault and not a fault of the store: nothing of it stays, not even its log entry.
            rollBackFile();
            return new FileCommitResult(file.FileName, file.Sha256, null, null, [], 0, new FileChangedException(file.FileName));
        }

        if (!end.IsValid)
        {
            // Nothing of the file may stay, not even its provisional log entry: the same bytes are
            // recorded once, as quarantined, with every error the producer found.
            rollBackFile();
            return LogQuarantined(sql, file, end.Errors, end.Report, now);
        }

        // A listed file's batches keep the list's order. A streamed file's are put in the order of their
        // first row, as a whole-file read lists them: the reader hands a batch over when its last row is
        // read, which differs only when batches are interleaved.
        var batchResults = (file.IsStreamed ? batches.OrderBy(b => b.FirstLine) : batches.AsEnumerable()).Select(b => b.Result).ToList();
        var outcome = batchResults.Any(b => b.Disposition == BatchDisposition.Revision) ? IngestOutcome.Revision
            : batchResults.Any(b => b.Disposition == BatchDisposition.New) ? IngestOutcome.Stored
            : batchResults.Count > 0 ? IngestOutcome.Duplicate
            : IngestOutcome.Stored;

        sql.FinishIngest.Set("$outcome", outcome.ToText()).Set("$batches", batchResults.Count).Set("$id", ingestId).Execute();
        var listed = batchResults.Take(MaxAuditedBatches).Select(b => (b.BatchId, b.Disposition.ToText(), b.Revision));
        var complete = batchResults.Count <= MaxAuditedBatches;
        sql.Audit.Append(now, AuditWriter.SystemActor, "ingest." + outcome.ToText(), "file:" + file.Sha256, StoreJson.FileDetail(
            file.FileName, file.Sha256, listed, complete ? null : batchResults.Count, complete ? null : batchResults.Count - MaxAuditedBatches));
        return new FileCommitResult(file.FileName, file.Sha256, outcome, ingestId, batchResults, 0, null);
    }

    private static FileCommitResult LogQuarantined(CommitStatements sql, FileIngest file, IReadOnlyList<ExportError> errors, string? report, DateTimeOffset now)
    {
        var id = LogIngest(sql, file, IngestOutcome.Quarantined, errors.Count, 0, report, now);
        Audit(sql, now, "ingest.quarantined", file, new { file = file.FileName, sha256 = file.Sha256, errors = errors.Count });
        return new FileCommitResult(file.FileName, file.Sha256, IngestOutcome.Quarantined, id, [], errors.Count, null) { Errors = errors, Report = report };
    }

    private static BatchCommitResult StoreRevision(
        CommitStatements sql, FileIngest file, long ingestId, BatchIngest batch, BatchPlan plan, long? batchRef, long? previousRef, DateTimeOffset now)
    {
        var record = batch.Outcome.Batch;
        var at = DbText.Time(now);
        var day = DbText.Day(batch.ProductionDay);
        var batchKey = batchRef ?? sql.InsertBatch.Set("$batch", record.BatchId).Set("$at", at).ScalarInt64();

        // The previous revision stops being current before the new one is written: the unique
        // index on current revisions is checked row by row, not at commit.
        if (previousRef is { } previous)
        {
            sql.Supersede.Set("$at", at).Set("$old", previous).Execute();
        }

        var revisionId = sql.InsertRevision
            .Set("$batch", batchKey).Set("$revision", plan.Revision).Set("$ingest", ingestId)
            .Set("$recipe", record.RecipeCode).Set("$recipeVersion", record.RecipeVersion)
            .Set("$versionSource", record.RecipeVersionSource.ToText())
            .Set("$content", plan.ContentSha256).Set("$day", day)
            .Set("$lastOutput", DbText.TimeOrNull(batch.Outcome.LastOutputAt)).Set("$at", at)
            .Set("$routeYield", batch.Outcome.Route.YieldPct).Set("$routeTheoretical", batch.Outcome.Route.TheoreticalKg)
            .Set("$routeNote", batch.Outcome.Route.Reason)
            .Set("$links", batch.LinksJson)
            .ScalarInt64();

        if (previousRef is { } old)
        {
            sql.LinkSuperseded.Set("$new", revisionId).Set("$old", old).Execute();
            sql.RetireFlags.Set("$old", old).Execute();
            sql.RetireSteps.Set("$old", old).Execute();
            sql.Audit.Append(now, AuditWriter.SystemActor, "batch.revision", "batch:" + record.BatchId, StoreJson.Detail(new
            {
                batch = record.BatchId,
                supersededRevision = plan.Revision - 1,
                revision = plan.Revision,
                file = file.FileName,
                sha256 = file.Sha256,
                contentSha256 = plan.ContentSha256,
            }));
            CloseFlagsOfSuperseded(sql, old, record.BatchId, plan.Revision, file.FileName, now);
        }

        var raw = batch.RawRows;
        sql.InsertRawRows.Set("$revision", revisionId).Set("$header", raw.Header).Set("$count", raw.LineCount).Set("$lines", raw.Lines).Execute();

        var flagIds = new List<long>();
        var order = 0;
        var texts = batch.StepTexts;
        foreach (var step in batch.Outcome.Steps)
        {
            var text = texts[order];
            sql.InsertStep
                .Set("$revision", revisionId).Set("$step", step.Step).Set("$order", ++order).Set("$hasRows", step.HasRows ? 1 : 0)
                .Set("$limiting", step.LimitingReactant).Set("$extent", step.ExtentMaxMol).Set("$theoretical", step.TheoreticalKg)
                .Set("$actual", step.ActualKg).Set("$yield", step.YieldPct).Set("$ae", step.AtomEconomyPct)
                .Set("$sf", step.StoichiometricFactor).Set("$rme", step.RmePct).Set("$mrp", step.Mrp)
                .Set("$overallRme", step.OverallRmePct).Set("$pmi", step.Pmi).Set("$cef", step.CompleteEFactor)
                .Set("$sef", step.SimpleEFactor).Set("$massIn", step.MassInKg).Set("$reactantMass", step.ReactantMassKg)
                .Set("$stoichMass", step.StoichiometricMassKg).Set("$recovered", step.RecoveredKg).Set("$massOut", step.MassOutKg)
                .Set("$vented", step.VentedKg).Set("$ventedMax", step.VentedMaxKg).Set("$gap", step.GapKg)
                .Set("$closure", step.ClosurePct).Set("$uncertainty", step.CombinedUncertaintyKg)
                .Set("$equivalents", text.Equivalents).Set("$ladder", text.Ladder)
                .Set("$recipe", record.RecipeCode).Set("$day", day)
                .Set("$yieldMin", step.Limits.YieldMinPct).Set("$yieldMax", step.Limits.YieldMaxPct)
                .Set("$tolerance", step.Limits.BalanceTolerancePct).Set("$k", step.Limits.CoverageFactor)
                .Set("$expanded", step.Limits.ExpandedUncertaintyKg)
                .Set("$ranges", text.EquivalentsRanges)
                .Set("$inWasteMax", step.Limits.ProductInWasteMaxPct)
                .Set("$solventIn", step.SolventInKg).Set("$waterIn", step.WaterInKg)
                .Set("$recipeVersion", record.RecipeVersion).Set("$lastOutput", DbText.TimeOrNull(batch.Outcome.LastOutputAt))
                .Execute();
        }

        // Flags after all steps: a flag names its step, and the foreign key refuses a flag whose
        // step was not stored with the revision.
        foreach (var flag in batch.Outcome.Flags)
        {
            flagIds.Add(sql.InsertFlag
                .Set("$revision", revisionId).Set("$step", flag.Step).Set("$code", flag.Code.ToText())
                .Set("$severity", flag.Severity.ToText()).Set("$measured", flag.Measured).Set("$limit", flag.Limit)
                .Set("$unit", flag.Unit).Set("$message", flag.Message).Set("$subject", flag.Subject)
                .Set("$at", at).Set("$day", day)
                .ScalarInt64());
        }

        return new BatchCommitResult(plan.BatchId, plan.Disposition, plan.Revision, flagIds, record.RecipeCode, record.RecipeVersion, record.RecipeVersionSource);
    }

    private static long LogIngest(CommitStatements sql, FileIngest file, IngestOutcome outcome, int errorCount, int batchCount, string? report, DateTimeOffset now) =>
        sql.InsertIngest
            .Set("$file", file.FileName).Set("$sha256", file.Sha256).Set("$outcome", outcome.ToText())
            .Set("$errors", errorCount).Set("$batches", batchCount)
            .Set("$received", DbText.Time(file.ReceivedAt)).Set("$processed", DbText.Time(now))
            .Set("$report", report)
            .ScalarInt64();

    private static void Audit(CommitStatements sql, DateTimeOffset now, string kind, FileIngest file, object detail) =>
        sql.Audit.Append(now, AuditWriter.SystemActor, kind, "file:" + file.Sha256, StoreJson.Detail(detail));

    /// <summary>
    /// The flags of a superseded revision that still wait for a decision are closed by the system:
    /// the re-export replaced the figures they were about, and the new revision has its own flags.
    /// Closed flags keep the outcome their reviewer gave.
    /// </summary>
    private static void CloseFlagsOfSuperseded(CommitStatements sql, long oldRevisionRef, string batchId, int newRevision, string fileName, DateTimeOffset now)
    {
        var unclosed = new List<(long Id, string State, string Step, string Code)>();
        using (var reader = sql.UnclosedFlags.Set("$old", oldRevisionRef).Read())
        {
            while (reader.Read())
            {
                unclosed.Add((reader.GetInt64(0), reader.GetString(1), reader.GetString(2), reader.GetString(3)));
            }
        }

        var note = $"superseded by revision {newRevision.ToString(CultureInfo.InvariantCulture)} from file {fileName}";
        foreach (var flag in unclosed)
        {
            SupersededClosing.Close(sql.CloseSuperseded, sql.Audit, now, flag.Id, flag.State, note, new
            {
                batch = batchId,
                revision = newRevision - 1,
                supersededByRevision = newRevision,
                file = fileName,
                step = flag.Step,
                code = flag.Code,
                outcome = "superseded",
            });
        }
    }
}
