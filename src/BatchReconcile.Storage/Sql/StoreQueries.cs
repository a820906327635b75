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
        ORDER BY s.production_day DESC, s.last_output_at DESC, b.batch_id DESC
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

    /// <summary>
    /// Current batch revisions, filtered; in production order (day, last output, batch) or, with
    /// <paramref name="byBatchId"/>, by day and batch id. A recipe is read from <c>ix_batch_revision_recipe</c>,
    /// whose condition (<c>superseded_at IS NULL</c>) the query repeats word for word; days alone from
    /// <c>ix_batch_revision_day</c>. Only the filters asked for are written into the text.
    /// </summary>
    public static string Batches(bool from, bool to, bool recipe, bool flaggedOnly, bool byBatchId = false) =>
        """
        SELECT b.batch_id, r.revision, r.recipe, r.recipe_version, r.production_day,
               (SELECT count(*) FROM flag f WHERE f.revision_ref = r.id),
               (SELECT count(*) FROM step_result s WHERE s.revision_ref = r.id), r.route_yield_pct, r.route_note,
               (SELECT count(*) FROM flag f WHERE f.revision_ref = r.id AND f.state <> 'closed'), r.last_output_at
        FROM batch_revision r
        JOIN batch b ON b.id = r.batch_ref
        WHERE r.superseded_at IS NULL
        """
        + (recipe ? " AND r.recipe = $recipe" : string.Empty)
        + (from ? " AND r.production_day >= $from" : string.Empty)
        + (to ? " AND r.production_day <= $to" : string.Empty)
        + (flaggedOnly ? " AND EXISTS (SELECT 1 FROM flag x WHERE x.revision_ref = r.id AND x.state <> 'closed')" : string.Empty)
        + (byBatchId ? "\nORDER BY r.production_day, b.batch_id" : "\nORDER BY r.production_day, r.last_output_at, b.batch_id");

    /// <summary>
    /// One figure of one recipe step, current revisions, in production order, read from <c>ix_step_result_history</c>
    /// (recipe, step, current, day, last output): only batches of the same day and output time are sorted, by batch id.
    /// <paramref name="valueColumn"/> is one of <see cref="Queries.StepMeasure"/>'s fixed column names.
    /// </summary>
    public static string StepSeries(string valueColumn, bool from, bool to, bool version) =>
        $"""
        SELECT b.batch_id, r.revision, s.recipe_version, s.production_day, s.last_output_at, {valueColumn},
               (SELECT count(*) FROM flag f WHERE f.revision_ref = s.revision_ref AND f.step = s.step AND f.state <> 'closed')
        FROM step_result s
        JOIN batch_revision r ON r.id = s.revision_ref
        JOIN batch b ON b.id = r.batch_ref
        WHERE s.recipe = $recipe AND s.step = $step AND s.is_current = 1
        """
        + DayAndVersion(from, to, version)
        + ProductionOrderByIndex;

    /// <summary>The columns <see cref="StepsOfRecipe"/> gives before <see cref="StepColumns"/>.</summary>
    public const int StepsOfRecipeLead = 12;

    /// <summary>
    /// Every current step result of a recipe with its batch, in production order and step order, read from
    /// <c>ix_step_result_recipe</c> (recipe, current, day, last output).
    /// </summary>
    public static string StepsOfRecipe(bool from, bool to, bool version, Queries.StepParts parts = Queries.StepParts.All) =>
        $"""
        SELECT b.batch_id, r.revision, s.recipe_version, s.production_day, s.last_output_at, s.step_order,
               r.route_yield_pct, r.route_theoretical_kg, r.route_note,
               (SELECT count(*) FROM flag f WHERE f.revision_ref = s.revision_ref AND f.step = s.step),
               (SELECT count(*) FROM flag f WHERE f.revision_ref = s.revision_ref AND f.step = s.step AND f.state <> 'closed'),
               s.revision_ref,
               {StepColumnsOf(parts)}
        FROM step_result s
        JOIN batch_revision r ON r.id = s.revision_ref
        JOIN batch b ON b.id = r.batch_ref
        WHERE s.recipe = $recipe AND s.is_current = 1
        """
        + DayAndVersion(from, to, version)
        + ProductionOrderByIndex;

    /// <summary>
    /// The rows whose loss ladders <c>LossTotalsOfRecipe</c> sums: revision, step, step order, mass in and the ladder JSON
    /// of a recipe's current step rows in a period, from <c>ix_step_result_recipe</c> (named, so that the planner cannot
    /// take the history index and read every day of the recipe).
    /// </summary>
    public static string LossRows(bool from, bool to) =>
        "SELECT s.revision_ref, s.step, s.step_order, s.mass_in_kg, s.ladder FROM step_result s INDEXED BY ix_step_result_recipe"
        + " WHERE s.recipe = $recipe AND s.is_current = 1"
        + DayAndVersion(from, to, version: false);

    /// <summary>
    /// Every current step result (optionally of one recipe, optionally of a range of days), in production order:
    /// <c>export steps</c>. With a recipe it reads <c>ix_step_result_recipe</c>; without, days from <c>ix_step_result_day</c>.
    /// </summary>
    public static string StepsForExport(bool recipe, bool from, bool to) =>
        $"""
        SELECT b.batch_id, r.revision, s.recipe_version, s.production_day, s.last_output_at, s.step_order,
               r.route_yield_pct, r.route_theoretical_kg, r.route_note,
               (SELECT count(*) FROM flag f WHERE f.revision_ref = s.revision_ref AND f.step = s.step),
               (SELECT count(*) FROM flag f WHERE f.revision_ref = s.revision_ref AND f.step = s.step AND f.state <> 'closed'),
               s.recipe,
               {StepColumns}
        FROM step_result s
        JOIN batch_revision r ON r.id = s.revision_ref
        JOIN batch b ON b.id = r.batch_ref
        WHERE s.is_current = 1
        """
        + (recipe ? " AND s.recipe = $recipe" : string.Empty)
        + DayAndVersion(from, to, version: false)
        + ProductionOrderByIndex;

    /// <summary>
    /// The steps of a recipe (any version, current revisions), by the step order of the newest batch that has each.
    /// Walks the distinct steps through <c>ix_step_result_history</c> one seek at a time instead of reading every row. The
    /// order is filtered in an outer query because PostgreSQL, unlike SQLite, does not let WHERE name a column alias.
    /// </summary>
    public const string RecipeSteps = """
        WITH RECURSIVE steps (step) AS (
            SELECT (SELECT min(step) FROM step_result WHERE recipe = $recipe)
            UNION ALL
            SELECT (SELECT min(x.step) FROM step_result x WHERE x.recipe = $recipe AND x.step > steps.step)
            FROM steps WHERE steps.step IS NOT NULL
        )
        SELECT step, step_order FROM (
            SELECT step, (SELECT s.step_order FROM step_result s WHERE s.recipe = $recipe AND s.step = steps.step AND s.is_current = 1
                          ORDER BY s.production_day DESC LIMIT 1) AS step_order
            FROM steps
            WHERE step IS NOT NULL) AS ordered
        WHERE step_order IS NOT NULL
        ORDER BY step_order, step
        """;

    /// <summary>
    /// The production order as far as the indexes hold it: day, then last output time. SQLite then reads the index in
    /// order and sorts nothing; rows of the same day and output time (rare: a batch's own steps, or batches without an
    /// output time) are put in batch and step order by the store (<c>BatchStore.ProductionOrder</c>).
    /// </summary>
    private const string ProductionOrderByIndex = "\nORDER BY s.production_day, s.last_output_at";

    /// <summary><see cref="StepColumns"/> with the JSON columns not asked for read as constants (empty, or NULL for the ranges).</summary>
    private static string StepColumnsOf(Queries.StepParts parts)
    {
        var columns = StepColumns;
        if (!parts.HasFlag(Queries.StepParts.Equivalents))
        {
            columns = Replace(Replace(columns, "s.equivalents,", "'{}',"), "s.equivalents_ranges,", "NULL,");
        }

        return parts.HasFlag(Queries.StepParts.Ladder) ? columns : Replace(columns, "s.ladder,", "'[]',");
    }

    private static string Replace(string text, string column, string constant) =>
        text.Contains(column, StringComparison.Ordinal) ? text.Replace(column, constant, StringComparison.Ordinal)
        : throw new InvalidOperationException($"{column} is not among the step columns.");

    private static string DayAndVersion(bool from, bool to, bool version) =>
        (from ? " AND s.production_day >= $from" : string.Empty)
        + (to ? " AND s.production_day <= $to" : string.Empty)
        + (version ? " AND s.recipe_version = $version" : string.Empty);

    /// <summary>Audit entries by time and kind, oldest first; the kind from <c>ix_audit_event_kind</c>, time alone from <c>ix_audit_event_at</c>.</summary>
    public static string Audit(bool from, bool to, bool kind) =>
        $"SELECT {BatchReconcile.Storage.Audit.AuditWriter.Columns} FROM audit_event WHERE 1 = 1"
        + (kind ? " AND (kind = $kind OR (kind >= $kindPrefix AND kind < $kindEnd))" : string.Empty)
        + (from ? " AND at >= $from" : string.Empty)
        + (to ? " AND at < $to" : string.Empty)
        + " ORDER BY id";

    public const string AuditKinds = "SELECT DISTINCT kind FROM audit_event ORDER BY kind";

    public const string AuditEntry = $"SELECT {BatchReconcile.Storage.Audit.AuditWriter.Columns} FROM audit_event WHERE id = $id";

    /// <summary>A flag's revision and batch, for <c>GetFlag</c>.</summary>
    public const string FlagHeader = $"""
        SELECT {FlagColumns}, f.revision_ref, b.batch_id, r.revision, r.recipe, r.recipe_version, r.production_day, n.revision
        FROM flag f
        JOIN batch_revision r ON r.id = f.revision_ref
        JOIN batch b ON b.id = r.batch_ref
        LEFT JOIN batch_revision n ON n.id = r.superseded_by
        WHERE f.id = $id
        """;

    public const string StepOfRevision = $"""
        SELECT {StepColumns}
        FROM step_result s WHERE s.revision_ref = $revision AND s.step = $step
        """;

    public const string FlagsOfStep = $"""
        SELECT {FlagColumns}
        FROM flag f WHERE f.revision_ref = $revision AND f.step = $step ORDER BY f.id
        """;
}
