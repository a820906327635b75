using System.Data.Common;
using BatchReconcile.Storage.Audit;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage.Sql;

/// <summary>Every statement a group commit runs, prepared once per transaction and reused for every file, batch, row, step and flag.</summary>
internal sealed class CommitStatements : IDisposable
{
    public const string FindFileSql = """
        SELECT id, file_name, sha256, outcome, error_count, processed_at
        FROM ingest_log WHERE sha256 = $sha256
        ORDER BY outcome = 'duplicate', id LIMIT 1
        """;

    public const string FindBatchSql = """
        SELECT b.id, r.id, r.revision, r.content_sha256
        FROM batch b LEFT JOIN batch_revision r ON r.batch_ref = b.id AND r.superseded_at IS NULL
        WHERE b.batch_id = $batch
        """;

    private readonly List<PreparedCommand> _all = [];

    public CommitStatements(DbConnection connection, DbTransaction transaction)
    {
        PreparedCommand Make(string sql, params (string, SqliteType)[] parameters)
        {
            var command = new PreparedCommand(connection, transaction, sql, parameters);
            _all.Add(command);
            return command;
        }

        const SqliteType T = SqliteType.Text, I = SqliteType.Integer, R = SqliteType.Real;

        // Each file of a group is stored inside its own savepoint (one name, released before the next file).
        BeginFile = Make("SAVEPOINT file");
        EndFile = Make("RELEASE file");
        RollBackToFile = Make("ROLLBACK TO file");
        FindFile = Make(FindFileSql, ("$sha256", T));
        FindBatch = Make(FindBatchSql, ("$batch", T));
        InsertIngest = Make(
            """
            INSERT INTO ingest_log (file_name, sha256, outcome, error_count, batch_count, received_at, processed_at, report)
            VALUES ($file, $sha256, $outcome, $errors, $batches, $received, $processed, $report) RETURNING id
            """,
            ("$file", T), ("$sha256", T), ("$outcome", T), ("$errors", I), ("$batches", I), ("$received", T), ("$processed", T), ("$report", T));
        FinishIngest = Make(
            "UPDATE ingest_log SET outcome = $outcome, batch_count = $batches WHERE id = $id",
            ("$outcome", T), ("$batches", I), ("$id", I));
        InsertBatch = Make(
            "INSERT INTO batch (batch_id, first_seen_at) VALUES ($batch, $at) RETURNING id",
            ("$batch", T), ("$at", T));
        InsertRevision = Make(
            """
            INSERT INTO batch_revision (batch_ref, revision, ingest_ref, recipe, recipe_version, recipe_version_source, content_sha256, production_day, last_output_at, stored_at,
                route_yield_pct, route_theoretical_kg, route_note, step_links)
            VALUES ($batch, $revision, $ingest, $recipe, $recipeVersion, $versionSource, $content, $day, $lastOutput, $at,
                $routeYield, $routeTheoretical, $routeNote, $links) RETURNING id
            """,
            ("$batch", I), ("$revision", I), ("$ingest", I), ("$recipe", T), ("$recipeVersion", I), ("$versionSource", T), ("$content", T), ("$day", T), ("$lastOutput", T), ("$at", T),
            ("$routeYield", R), ("$routeTheoretical", R), ("$routeNote", T), ("$links", T));
        Supersede = Make(
            "UPDATE batch_revision SET superseded_at = $at WHERE id = $old AND superseded_at IS NULL",
            ("$at", T), ("$old", I));
        LinkSuperseded = Make(
            "UPDATE batch_revision SET superseded_by = $new WHERE id = $old",
            ("$new", I), ("$old", I));
        RetireFlags = Make("UPDATE flag SET is_current = 0 WHERE revision_ref = $old", ("$old", I));
        RetireSteps = Make("UPDATE step_result SET is_current = 0 WHERE revision_ref = $old", ("$old", I));
        InsertRawRows = Make(
            "INSERT INTO raw_rows (revision_ref, header, line_count, lines) VALUES ($revision, $header, $count, $lines)",
            ("$revision", I), ("$header", T), ("$count", I), ("$lines", SqliteType.Blob));
        InsertStep = Make(
            """
            INSERT INTO step_result (
                revision_ref, step, step_order, has_rows, limiting_reactant, extent_max_mol, theoretical_kg, actual_kg,
                yield_pct, atom_economy_pct, stoichiometric_factor, rme_pct, mrp, overall_rme_pct, pmi,
                complete_e_factor, simple_e_factor, mass_in_kg, reactant_mass_kg, stoichiometric_mass_kg,
                recovered_kg, mass_out_kg, vented_kg, vented_max_kg, gap_kg, closure_pct, combined_uncertainty_kg,
                equivalents, ladder, recipe, production_day, is_current,
                yield_min_pct, yield_max_pct, balance_tolerance_pct, coverage_factor, expanded_uncertainty_kg,
                equivalents_ranges, product_in_waste_max_pct, solvent_in_kg, water_in_kg, recipe_version, last_output_at)
            VALUES (
                $revision, $step, $order, $hasRows, $limiting, $extent, $theoretical, $actual,
                $yield, $ae, $sf, $rme, $mrp, $overallRme, $pmi,
                $cef, $sef, $massIn, $reactantMass, $stoichMass,
                $recovered, $massOut, $vented, $ventedMax, $gap, $closure, $uncertainty,
                $equivalents, $ladder, $recipe, $day, 1,
                $yieldMin, $yieldMax, $tolerance, $k, $expanded,
                $ranges, $inWasteMax, $solventIn, $waterIn, $recipeVersion, $lastOutput)
            """,
            ("$revision", I), ("$step", T), ("$order", I), ("$hasRows", I), ("$limiting", T), ("$extent", R), ("$theoretical", R), ("$actual", R),
            ("$yield", R), ("$ae", R), ("$sf", R), ("$rme", R), ("$mrp", R), ("$overallRme", R), ("$pmi", R),
            ("$cef", R), ("$sef", R), ("$massIn", R), ("$reactantMass", R), ("$stoichMass", R),
            ("$recovered", R), ("$massOut", R), ("$vented", R), ("$ventedMax", R), ("$gap", R), ("$closure", R), ("$uncertainty", R),
            ("$equivalents", T), ("$ladder", T), ("$recipe", T), ("$day", T),
            ("$yieldMin", R), ("$yieldMax", R), ("$tolerance", R), ("$k", R), ("$expanded", R),
            ("$ranges", T), ("$inWasteMax", R), ("$solventIn", R), ("$waterIn", R), ("$recipeVersion", I), ("$lastOutput", T));
        InsertFlag = Make(
            """
            INSERT INTO flag (revision_ref, step, code, severity, measured, limit_value, unit, message, subject, state, created_at, production_day, is_current)
            VALUES ($revision, $step, $code, $severity, $measured, $limit, $unit, $message, $subject, 'open', $at, $day, 1) RETURNING id
            """,
            ("$revision", I), ("$step", T), ("$code", T), ("$severity", T), ("$measured", R), ("$limit", R), ("$unit", T),
            ("$message", T), ("$subject", T), ("$at", T), ("$day", T));
        UnclosedFlags = Make("SELECT id, state, step, code FROM flag WHERE revision_ref = $old AND state <> 'closed' ORDER BY id", ("$old", I));
        CloseSuperseded = Make(SupersededClosing.Sql, SupersededClosing.Parameters);
        Audit = new AuditWriter(connection, transaction);
    }

    public PreparedCommand BeginFile { get; }

    public PreparedCommand EndFile { get; }

    private PreparedCommand RollBackToFile { get; }

    public PreparedCommand FindFile { get; }

    public PreparedCommand FindBatch { get; }

    public PreparedCommand InsertIngest { get; }

    /// <summary>Sets a file's outcome and batch count once all its batches are stored (they are known only then).</summary>
    public PreparedCommand FinishIngest { get; }

    public PreparedCommand InsertBatch { get; }

    public PreparedCommand InsertRevision { get; }

    public PreparedCommand Supersede { get; }

    public PreparedCommand LinkSuperseded { get; }

    public PreparedCommand RetireFlags { get; }

    public PreparedCommand RetireSteps { get; }

    public PreparedCommand InsertRawRows { get; }

    public PreparedCommand InsertStep { get; }

    public PreparedCommand InsertFlag { get; }

    public PreparedCommand UnclosedFlags { get; }

    public PreparedCommand CloseSuperseded { get; }

    public AuditWriter Audit { get; }

    /// <summary>Undoes everything of the current file and leaves its savepoint open.</summary>
    public void RollBackFile()
    {
        RollBackToFile.Execute();
        Audit.Forget();
    }

    public void Dispose()
    {
        Audit.Dispose();
        foreach (var command in _all)
        {
            command.Dispose();
        }
    }
}
