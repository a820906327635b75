namespace BatchReconcile.Storage.Sql;

/// <summary>The read queries' SQL, kept apart so that tests can ask SQLite how it runs them.</summary>
internal static class StoreQueries
{
    public const string Revision = """
        SELECT r.id, r.revision, r.recipe, r.recipe_version, r.production_day, r.last_output_at, r.stored_at,
               r.superseded_at, n.revision, r.content_sha256, i.file_name, i.sha256,
               (SELECT count(*) FROM batch_revision x WHERE x.batch_ref = b.id),
               r.route_yield_pct, r.route_theoretical_kg, r.route_note, r.step_links, r.recipe_version_source
        FROM batch b
        JOIN batch_revision r ON r.batch_ref = b.id
        JOIN ingest_log i ON i.id = r.ingest_ref
        LEFT JOIN batch_revision n ON n.id = r.superseded_by
        WHERE b.batch_id = $batch AND (($revision IS NULL AND r.superseded_at IS NULL) OR r.revision = $revision)
        """;

    /// <summary>The columns of a step result, in the order <c>BatchStore.ReadStep</c> reads them (prefix <c>s.</c>).</summary>
    public const string StepColumns = """
        s.step, s.has_rows, s.limiting_reactant, s.extent_max_mol, s.theoretical_kg, s.actual_kg, s.yield_pct, s.atom_economy_pct,
        s.stoichiometric_factor, s.rme_pct, s.mrp, s.overall_rme_pct, s.pmi, s.complete_e_factor, s.simple_e_factor,
        s.mass_in_kg, s.reactant_mass_kg, s.stoichiometric_mass_kg, s.recovered_kg, s.mass_out_kg, s.vented_kg,
        s.vented_max_kg, s.gap_kg, s.closure_pct, s.combined_uncertainty_kg, s.equivalents, s.ladder,
        s.yield_min_pct, s.yield_max_pct, s.balance_tolerance_pct, s.coverage_factor, s.expanded_uncertainty_kg,
        s.equivalents_ranges, s.product_in_waste_max_pct, s.solvent_in_kg, s.water_in_kg
        """;

    /// <summary>The columns of a flag, in the order <c>BatchStore.ReadFlag</c> reads them (prefix <c>f.</c>).</summary>
    public const string FlagColumns = """
        f.id, f.step, f.code, f.severity, f.measured, f.limit_value, f.unit, f.message, f.subject, f.state, f.production_day,
        f.is_current, f.created_at, f.outcome, f.review_note, f.deviation_ref, f.reviewed_by, f.reviewed_at
        """;

    public const string StepsOfRevision = $"""
        SELECT {StepColumns}
        FROM step_result s WHERE s.revision_ref = $revision ORDER BY s.step_order
        """;

    public const string FlagsOfRevision = $"""
        SELECT {FlagColumns}
        FROM flag f WHERE f.revision_ref = $revision ORDER BY f.id
        """;

    /// <summary>The flags stored with one file's revisions, in the order they were stored, each with its batch id (last column).</summary>
    public const string FlagsOfIngest = $"""
        SELECT {FlagColumns}, b.batch_id
        FROM batch_revision r
        JOIN batch b ON b.id = r.batch_ref
        JOIN flag f ON f.revision_ref = r.id
        WHERE r.ingest_ref = $ingest ORDER BY f.id
        """;

    /// <summary>Current steps of a day that carry a flag; reads the day's steps from <c>ix_step_result_day</c>.</summary>
    public const string FlaggedStepsOfDay = $"""
        SELECT b.batch_id, r.revision, r.recipe, r.recipe_version, r.recipe_version_source, s.revision_ref, {StepColumns}
        FROM step_result s
        JOIN batch_revision r ON r.id = s.revision_ref
        JOIN batch b ON b.id = r.batch_ref
        WHERE s.production_day = $day AND s.is_current = 1
          AND EXISTS (SELECT 1 FROM flag x WHERE x.revision_ref = s.revision_ref AND x.step = s.step)
        ORDER BY b.batch_id, s.step_order
        """;

    public const string FlagsOfDay = $"""
        SELECT {FlagColumns}, f.revision_ref
        FROM flag f WHERE f.production_day = $day AND f.is_current = 1 ORDER BY f.id
        """;

    /// <summary>The recipe steps that ran on a day (current revisions), in recipe and step order.</summary>
    public const string RecipeStepsOfDay = """
        SELECT s.recipe, s.step, min(s.step_order)
        FROM step_result s
        WHERE s.production_day = $day AND s.is_current = 1
        GROUP BY s.recipe, s.step
        ORDER BY s.recipe, 3, s.step
        """;

    public const string RawRowsOfRevision = "SELECT header, lines FROM raw_rows WHERE revision_ref = $revision";

    public const string StepHistory = StepHistorySelect + "\n" + StepHistoryOrder;

    /// <summary>As <see cref="StepHistory"/>, up to and including the day <c>$day</c>.</summary>
    public const string StepHistoryUpTo = StepHistorySelect + "\n  AND s.production_day <= $day\n" + StepHistoryOrder;

    private const string StepHistorySelect = """
        SELECT b.batch_id, r.revision, s.production_day, r.last_output_at, s.yield_pct, s.actual_kg, s.theoretical_kg,
               s.pmi, s.gap_kg, s.closure_pct,
               (SELECT count(*) FROM flag f WHERE f.revision_ref = s.revision_ref AND f.step = s.step),
               s.yield_min_pct, s.yield_max_pct
        FROM step_result s
        JOIN batch_revision r ON r.id = s.revision_ref
        JOIN batch b ON b.id = r.batch_ref
        WHERE s.recipe = $recipe AND s.step = $step AND s.is_current = 1
        """;

    private const string StepHistoryOrder = """
        ORDER BY s.production_day DESC, r.last_output_at DESC, b.batch_id DESC
        LIMIT $limit
        """;

    public const string CountsOfDay = """
        SELECT
            (SELECT count(*) FROM batch_revision WHERE production_day = $day AND superseded_at IS NULL),
            (SELECT count(*) FROM flag WHERE production_day = $day AND is_current = 1 AND severity = 'critical'),
            (SELECT count(*) FROM flag WHERE production_day = $day AND is_current = 1 AND severity = 'major'),
            (SELECT count(*) FROM flag WHERE production_day = $day AND is_current = 1 AND severity = 'minor'),
            (SELECT count(*) FROM flag WHERE production_day = $day AND is_current = 1 AND state <> 'closed'),
            (SELECT count(*) FROM step_result WHERE production_day = $day AND is_current = 1 AND has_rows = 1)
        """;

    /// <summary>
    /// Flags, optionally of one day, of current revisions only, or not yet closed. The filters are
    /// written into the text (never values) rather than as "$day IS NULL OR ...", which would keep
    /// SQLite from using the day index.
    /// </summary>
    public static string Flags(bool byDay, bool currentOnly, bool unresolvedOnly) =>
        FlagListSelect
        + "\nWHERE 1 = 1"
        + (byDay ? " AND f.production_day = $day" : string.Empty)
        + (currentOnly ? " AND f.is_current = 1" : string.Empty)
        + (unresolvedOnly ? " AND f.state <> 'closed'" : string.Empty)
        + FlagListOrder;

    /// <summary>
    /// Flags of current revisions not yet closed from days before <c>$day</c>. The conditions are
    /// those of the partial index <c>ix_flag_unresolved</c>, word for word, so that SQLite uses it.
    /// </summary>
    public const string UnresolvedBefore = FlagListSelect
        + "\nWHERE f.is_current = 1 AND f.state <> 'closed' AND f.production_day < $day"
        + FlagListOrder;

    private const string FlagListSelect = """
        SELECT f.id, b.batch_id, r.revision, f.step, f.code, f.severity, f.state, f.production_day, f.message,
               f.measured, f.limit_value, f.unit, f.subject, f.is_current, r.recipe,
               f.outcome, f.review_note, f.deviation_ref, f.reviewed_by, f.reviewed_at
        FROM flag f
        JOIN batch_revision r ON r.id = f.revision_ref
        JOIN batch b ON b.id = r.batch_ref
        """;

    private const string FlagListOrder = """

        ORDER BY f.production_day,
                 CASE f.severity WHEN 'critical' THEN 0 WHEN 'major' THEN 1 ELSE 2 END,
                 b.batch_id, f.id
        """;

    public static string Batches(bool byDay) =>
        """
        SELECT b.batch_id, r.revision, r.recipe, r.recipe_version, r.production_day,
               (SELECT count(*) FROM flag f WHERE f.revision_ref = r.id),
               (SELECT count(*) FROM step_result s WHERE s.revision_ref = r.id), r.route_yield_pct, r.route_note
        FROM batch_revision r
        JOIN batch b ON b.id = r.batch_ref
        WHERE r.superseded_at IS NULL
        """
        + (byDay ? " AND r.production_day = $day" : string.Empty)
        + """

        ORDER BY r.production_day, b.batch_id
        """;
}
