namespace BatchReconcile.Storage.Sql;

/// <summary>The read queries' SQL, kept apart so that tests can ask SQLite how it runs them.</summary>
internal static class StoreQueries
{
    public const string Revision = """
        SELECT r.id, r.revision, r.recipe, r.recipe_version, r.production_day, r.last_output_at, r.stored_at,
               r.superseded_at, n.revision, r.content_sha256, i.file_name, i.sha256,
               (SELECT count(*) FROM batch_revision x WHERE x.batch_ref = b.id)
        FROM batch b
        JOIN batch_revision r ON r.batch_ref = b.id
        JOIN ingest_log i ON i.id = r.ingest_ref
        LEFT JOIN batch_revision n ON n.id = r.superseded_by
        WHERE b.batch_id = $batch AND (($revision IS NULL AND r.superseded_at IS NULL) OR r.revision = $revision)
        """;

    public const string StepsOfRevision = """
        SELECT step, has_rows, limiting_reactant, extent_max_mol, theoretical_kg, actual_kg, yield_pct, atom_economy_pct,
               stoichiometric_factor, rme_pct, mrp, overall_rme_pct, pmi, complete_e_factor, simple_e_factor,
               mass_in_kg, reactant_mass_kg, stoichiometric_mass_kg, recovered_kg, mass_out_kg, vented_kg,
               vented_max_kg, gap_kg, closure_pct, combined_uncertainty_kg, equivalents, ladder
        FROM step_result WHERE revision_ref = $revision ORDER BY step_order
        """;

    public const string FlagsOfRevision = """
        SELECT id, step, code, severity, measured, limit_value, unit, message, subject, state, production_day, is_current, created_at
        FROM flag WHERE revision_ref = $revision ORDER BY id
        """;

    public const string RawRowsOfRevision = "SELECT line, fields FROM raw_row WHERE revision_ref = $revision ORDER BY line";

    public const string StepHistory = """
        SELECT b.batch_id, r.revision, s.production_day, r.last_output_at, s.yield_pct, s.actual_kg, s.theoretical_kg,
               s.pmi, s.gap_kg, s.closure_pct,
               (SELECT count(*) FROM flag f WHERE f.revision_ref = s.revision_ref AND f.step = s.step)
        FROM step_result s
        JOIN batch_revision r ON r.id = s.revision_ref
        JOIN batch b ON b.id = r.batch_ref
        WHERE s.recipe = $recipe AND s.step = $step AND s.is_current = 1
        ORDER BY s.production_day DESC, r.last_output_at DESC, b.batch_id DESC
        LIMIT $limit
        """;

    public const string CountsOfDay = """
        SELECT
            (SELECT count(*) FROM batch_revision WHERE production_day = $day AND superseded_at IS NULL),
            (SELECT count(*) FROM flag WHERE production_day = $day AND is_current = 1 AND severity = 'critical'),
            (SELECT count(*) FROM flag WHERE production_day = $day AND is_current = 1 AND severity = 'major'),
            (SELECT count(*) FROM flag WHERE production_day = $day AND is_current = 1 AND severity = 'minor'),
            (SELECT count(*) FROM flag WHERE production_day = $day AND is_current = 1 AND state <> 'closed')
        """;

    /// <summary>
    /// Flags, optionally of one day, of current revisions only, or not yet closed. The filters are
    /// written into the text (never values) rather than as "$day IS NULL OR ...", which would keep
    /// SQLite from using the day index.
    /// </summary>
    public static string Flags(bool byDay, bool currentOnly, bool unresolvedOnly) =>
        """
        SELECT f.id, b.batch_id, r.revision, f.step, f.code, f.severity, f.state, f.production_day, f.message,
               f.measured, f.limit_value, f.unit, f.subject, f.is_current
        FROM flag f
        JOIN batch_revision r ON r.id = f.revision_ref
        JOIN batch b ON b.id = r.batch_ref
        WHERE 1 = 1
        """
        + (byDay ? " AND f.production_day = $day" : string.Empty)
        + (currentOnly ? " AND f.is_current = 1" : string.Empty)
        + (unresolvedOnly ? " AND f.state <> 'closed'" : string.Empty)
        + """

        ORDER BY f.production_day,
                 CASE f.severity WHEN 'critical' THEN 0 WHEN 'major' THEN 1 ELSE 2 END,
                 b.batch_id, f.id
        """;

    public static string Batches(bool byDay) =>
        """
        SELECT b.batch_id, r.revision, r.recipe, r.recipe_version, r.production_day,
               (SELECT count(*) FROM flag f WHERE f.revision_ref = r.id)
        FROM batch_revision r
        JOIN batch b ON b.id = r.batch_ref
        WHERE r.superseded_at IS NULL
        """
        + (byDay ? " AND r.production_day = $day" : string.Empty)
        + """

        ORDER BY r.production_day, b.batch_id
        """;
}
