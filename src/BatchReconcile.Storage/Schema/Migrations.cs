namespace BatchReconcile.Storage.Schema;

/// <summary>
/// The schema's history, oldest first. A released migration is never edited: a change to the
/// schema is a new entry at the end, so that a database of any earlier version can be brought
/// up to date in order.
/// </summary>
public static class Migrations
{
    public static IReadOnlyList<Migration> All { get; } =
    [
        new(1, "core tables: ingest log, batches, revisions, raw rows, step results, flags", V1CoreTables),
        new(2, "query support: production day and recipe copied onto flags and step results, indexes", V2QuerySupport),
        new(3, "append-only audit trail", V3AuditTrail),
        new(4, "review trail: flag review state, hash-chained audit entries, digest records, day indexes", V4ReviewTrail, ReviewTrailBackfill.Run, V4Finish),
        new(5, "raw rows: one record per batch revision (header once, lines compressed) instead of one per row", V5RawRowsPerRevision, RawRowsRepack.Run, V5Finish),
        new(6, "recipe version source per batch revision; the limits and settings that decided each step's flags, per step result", V6DecidingLimits, RecipeVersionSourceBackfill.Run),
        new(7, "route yield and intermediate links per batch revision", V7RouteYield),
        new(8, "digest freshness: a change count per production day kept by triggers, and what each digest write covered", V8DigestFreshness),
        new(9, "solvent and water charged per step result", V9SolventAndWater),
        new(StepSeriesVersion, "across batches: recipe version and last output time copied onto step results, indexes for a step's or recipe's batches in production order, for batches by recipe and for the audit trail by time and kind", V10AcrossBatches),
    ];

    /// <summary>
    /// The migration that copies recipe_version and last_output_at onto step_result (the queries across batches:
    /// <c>StepSeries</c>, <c>StepsOfRecipe</c>). Named so that its tests follow it if it is renumbered.
    /// </summary>
    public const int StepSeriesVersion = 10;

    public static int Latest => All[^1].Version;

    // Times are TEXT in UTC ISO 8601 with a 'Z' (they sort as they compare); production days are
    // TEXT 'YYYY-MM-DD' in the plant's calendar; SHA-256 digests are lower-case hex.
    private const string V1CoreTables = """
        CREATE TABLE ingest_log (
            id           INTEGER PRIMARY KEY,
            file_name    TEXT    NOT NULL,
            sha256       TEXT    NOT NULL CHECK (length(sha256) = 64),
            outcome      TEXT    NOT NULL CHECK (outcome IN ('stored', 'revision', 'duplicate', 'quarantined')),
            error_count  INTEGER NOT NULL DEFAULT 0 CHECK (error_count >= 0),
            batch_count  INTEGER NOT NULL DEFAULT 0 CHECK (batch_count >= 0),
            received_at  TEXT    NOT NULL,
            processed_at TEXT    NOT NULL,
            report       TEXT
        );
        -- A file's content is taken once (stored, revision or quarantined); every later sighting
        -- is logged as a duplicate.
        CREATE UNIQUE INDEX ux_ingest_log_first_sighting ON ingest_log (sha256) WHERE outcome <> 'duplicate';
        CREATE INDEX ix_ingest_log_sha256 ON ingest_log (sha256);

        CREATE TABLE batch (
            id            INTEGER PRIMARY KEY,
            batch_id      TEXT NOT NULL UNIQUE,
            first_seen_at TEXT NOT NULL
        );

        CREATE TABLE batch_revision (
            id             INTEGER PRIMARY KEY,
            batch_ref      INTEGER NOT NULL REFERENCES batch (id),
            revision       INTEGER NOT NULL CHECK (revision >= 1),
            ingest_ref     INTEGER NOT NULL REFERENCES ingest_log (id),
            recipe         TEXT    NOT NULL,
            recipe_version INTEGER NOT NULL,
            content_sha256 TEXT    NOT NULL CHECK (length(content_sha256) = 64),
            production_day TEXT    NOT NULL CHECK (production_day GLOB '[0-9][0-9][0-9][0-9]-[0-9][0-9]-[0-9][0-9]'),
            last_output_at TEXT,
            stored_at      TEXT    NOT NULL,
            superseded_by  INTEGER REFERENCES batch_revision (id),
            superseded_at  TEXT,
            UNIQUE (batch_ref, revision),
            CHECK (superseded_by IS NULL OR superseded_at IS NOT NULL)
        );
        -- At most one current (not superseded) revision per batch. superseded_at is set first and
        -- superseded_by once the new revision has its id.
        CREATE UNIQUE INDEX ux_batch_revision_current ON batch_revision (batch_ref) WHERE superseded_at IS NULL;
        CREATE INDEX ix_batch_revision_ingest ON batch_revision (ingest_ref);

        CREATE TABLE raw_row (
            revision_ref INTEGER NOT NULL REFERENCES batch_revision (id),
            line         INTEGER NOT NULL CHECK (line >= 1),
            fields       TEXT    NOT NULL,
            PRIMARY KEY (revision_ref, line)
        ) WITHOUT ROWID;

        CREATE TABLE step_result (
            revision_ref            INTEGER NOT NULL REFERENCES batch_revision (id),
            step                    TEXT    NOT NULL,
            step_order              INTEGER NOT NULL,
            has_rows                INTEGER NOT NULL CHECK (has_rows IN (0, 1)),
            limiting_reactant       TEXT,
            extent_max_mol          REAL,
            theoretical_kg          REAL,
            actual_kg               REAL    NOT NULL,
            yield_pct               REAL,
            atom_economy_pct        REAL    NOT NULL,
            stoichiometric_factor   REAL,
            rme_pct                 REAL,
            mrp                     REAL,
            overall_rme_pct         REAL,
            pmi                     REAL,
            complete_e_factor       REAL,
            simple_e_factor         REAL,
            mass_in_kg              REAL    NOT NULL,
            reactant_mass_kg        REAL    NOT NULL,
            stoichiometric_mass_kg  REAL,
            recovered_kg            REAL    NOT NULL,
            mass_out_kg             REAL    NOT NULL,
            vented_kg               REAL    NOT NULL,
            vented_max_kg           REAL    NOT NULL,
            gap_kg                  REAL    NOT NULL,
            closure_pct             REAL,
            combined_uncertainty_kg REAL    NOT NULL,
            equivalents             TEXT    NOT NULL,
            ladder                  TEXT    NOT NULL,
            PRIMARY KEY (revision_ref, step)
        );

        -- Flag ids are shown to people (flags review 17); AUTOINCREMENT keeps them from ever being reused.
        CREATE TABLE flag (
            id           INTEGER PRIMARY KEY AUTOINCREMENT,
            revision_ref INTEGER NOT NULL,
            step         TEXT    NOT NULL,
            code         TEXT    NOT NULL,
            severity     TEXT    NOT NULL CHECK (severity IN ('critical', 'major', 'minor')),
            measured     REAL,
            limit_value  REAL,
            unit         TEXT    NOT NULL,
            message      TEXT    NOT NULL,
            subject      TEXT,
            state        TEXT    NOT NULL DEFAULT 'open',
            created_at   TEXT    NOT NULL,
            FOREIGN KEY (revision_ref, step) REFERENCES step_result (revision_ref, step)
        );
        CREATE INDEX ix_flag_revision ON flag (revision_ref, step);
        """;

    // The two questions asked every day - "flags of production day D" and "history of step S of
    // recipe R" - are answered from one index each, without a join to the revision table.
    private const string V2QuerySupport = """
        ALTER TABLE flag ADD COLUMN production_day TEXT NOT NULL DEFAULT '';
        ALTER TABLE flag ADD COLUMN is_current INTEGER NOT NULL DEFAULT 1 CHECK (is_current IN (0, 1));
        ALTER TABLE step_result ADD COLUMN recipe TEXT NOT NULL DEFAULT '';
        ALTER TABLE step_result ADD COLUMN production_day TEXT NOT NULL DEFAULT '';
        ALTER TABLE step_result ADD COLUMN is_current INTEGER NOT NULL DEFAULT 1 CHECK (is_current IN (0, 1));

        UPDATE flag SET
            production_day = (SELECT r.production_day FROM batch_revision r WHERE r.id = flag.revision_ref),
            is_current     = (SELECT r.superseded_at IS NULL FROM batch_revision r WHERE r.id = flag.revision_ref);
        UPDATE step_result SET
            recipe         = (SELECT r.recipe FROM batch_revision r WHERE r.id = step_result.revision_ref),
            production_day = (SELECT r.production_day FROM batch_revision r WHERE r.id = step_result.revision_ref),
            is_current     = (SELECT r.superseded_at IS NULL FROM batch_revision r WHERE r.id = step_result.revision_ref);

        CREATE INDEX ix_flag_day ON flag (production_day, is_current, severity);
        CREATE INDEX ix_step_result_history ON step_result (recipe, step, is_current, production_day);
        CREATE INDEX ix_batch_revision_day ON batch_revision (production_day);
        """;

    private const string V3AuditTrail = """
        CREATE TABLE audit_event (
            id      INTEGER PRIMARY KEY AUTOINCREMENT,
            at      TEXT NOT NULL,
            kind    TEXT NOT NULL,
            subject TEXT NOT NULL,
            detail  TEXT NOT NULL
        );
        CREATE INDEX ix_audit_event_subject ON audit_event (subject, id);
        CREATE TRIGGER audit_event_no_update BEFORE UPDATE ON audit_event
        BEGIN
            SELECT RAISE(ABORT, 'audit_event is append-only');
        END;
        CREATE TRIGGER audit_event_no_delete BEFORE DELETE ON audit_event
        BEGIN
            SELECT RAISE(ABORT, 'audit_event is append-only');
        END;
        """;

    private const string FlagReviewInvalid = """
        NEW.state NOT IN ('open', 'in-review', 'closed')
            OR ((NEW.state = 'closed') <> (NEW.outcome IS NOT NULL))
            OR (NEW.outcome = 'deviation' AND coalesce(NEW.deviation_ref, '') = '')
        """;

    // Entries written by version 3 get their hashes from ReviewTrailBackfill, which is why the
    // update trigger is dropped here and created again, unchanged, by V4Finish in the same transaction.
    private const string V4ReviewTrail = $"""
        ALTER TABLE audit_event ADD COLUMN actor TEXT NOT NULL DEFAULT 'system';
        ALTER TABLE audit_event ADD COLUMN from_state TEXT;
        ALTER TABLE audit_event ADD COLUMN to_state TEXT;
        ALTER TABLE audit_event ADD COLUMN note TEXT;
        ALTER TABLE audit_event ADD COLUMN deviation_ref TEXT;
        ALTER TABLE audit_event ADD COLUMN prev_hash TEXT;
        ALTER TABLE audit_event ADD COLUMN hash TEXT;
        DROP TRIGGER audit_event_no_update;
        -- The database itself refuses an entry that is not linked to the last one (a writer that
        -- forgot the chain); the content hash is computed by the program and checked by audit verify.
        CREATE TRIGGER audit_event_chained BEFORE INSERT ON audit_event
        WHEN NEW.hash IS NULL OR length(NEW.hash) <> 64
            OR NEW.prev_hash IS NOT coalesce((SELECT hash FROM audit_event ORDER BY id DESC LIMIT 1), '{GenesisHash}')
        BEGIN
            SELECT RAISE(ABORT, 'audit_event entries carry their own hash and the hash of the entry before them');
        END;

        ALTER TABLE flag ADD COLUMN outcome TEXT CHECK (outcome IN ('explained', 'deviation', 'corrected', 'superseded'));
        ALTER TABLE flag ADD COLUMN review_note TEXT;
        ALTER TABLE flag ADD COLUMN deviation_ref TEXT;
        ALTER TABLE flag ADD COLUMN reviewed_by TEXT;
        ALTER TABLE flag ADD COLUMN reviewed_at TEXT;
        CREATE TRIGGER flag_review_valid_insert BEFORE INSERT ON flag
        WHEN {FlagReviewInvalid}
        BEGIN
            SELECT RAISE(ABORT, 'flag review: unknown state, closed without outcome (or outcome while not closed), or deviation without reference');
        END;
        CREATE TRIGGER flag_review_valid_update BEFORE UPDATE OF state, outcome, deviation_ref ON flag
        WHEN {FlagReviewInvalid}
        BEGIN
            SELECT RAISE(ABORT, 'flag review: unknown state, closed without outcome (or outcome while not closed), or deviation without reference');
        END;

        -- Flags still waiting for a decision, by day: the digest's "open from earlier days" reads
        -- only these, however many closed flags the years have gathered.
        CREATE INDEX ix_flag_unresolved ON flag (production_day) WHERE is_current = 1 AND state <> 'closed';
        CREATE INDEX ix_step_result_day ON step_result (production_day, is_current, has_rows);

        -- One row per write of a day's digest; the first write of a day is unique.
        CREATE TABLE digest (
            id         INTEGER PRIMARY KEY AUTOINCREMENT,
            day        TEXT    NOT NULL CHECK (day GLOB '[0-9][0-9][0-9][0-9]-[0-9][0-9]-[0-9][0-9]'),
            written_at TEXT    NOT NULL,
            written_by TEXT    NOT NULL,
            is_rewrite INTEGER NOT NULL CHECK (is_rewrite IN (0, 1)),
            files      TEXT    NOT NULL,
            flag_count INTEGER NOT NULL CHECK (flag_count >= 0)
        );
        CREATE UNIQUE INDEX ux_digest_first_write ON digest (day) WHERE is_rewrite = 0;
        CREATE INDEX ix_digest_day ON digest (day, id);
        """;

    private const string V4Finish = """
        CREATE TRIGGER audit_event_no_update BEFORE UPDATE ON audit_event
        BEGIN
            SELECT RAISE(ABORT, 'audit_event is append-only');
        END;
        """;

    // Storing a batch wrote one record per row of its file, each with its column names: most of a
    // backlog's statements and a third of the database. The header is now kept once per revision.
    // header is a JSON array of names; lines a JSON array compressed with zlib (RawRowsJson), about a
    // fifth of its size: raw rows were more than half of the database.
    private const string V5RawRowsPerRevision = """
        CREATE TABLE raw_rows (
            revision_ref INTEGER PRIMARY KEY REFERENCES batch_revision (id),
            header       TEXT    NOT NULL,
            line_count   INTEGER NOT NULL CHECK (line_count >= 0),
            lines        BLOB    NOT NULL
        );
        """;

    private const string V5Finish = """
        DROP TABLE raw_row;
        """;

    // How each revision's recipe version was chosen, and every limit a step was judged by: readers
    // show these, never today's definitions. NULL is unknown (stored before this version), never 0.
    // Rows stored before are filled only from what the store itself holds: the limit a yield or
    // product-in-waste flag carries is the limit it broke; the source from the stored raw rows
    // (RecipeVersionSourceBackfill). The rest stays unknown: the definitions a row was reconciled
    // with were not recorded, and today's may differ.
    private const string V6DecidingLimits = """
        ALTER TABLE batch_revision ADD COLUMN recipe_version_source TEXT
            CHECK (recipe_version_source IN ('export', 'effective-date', 'newest'));

        ALTER TABLE step_result ADD COLUMN yield_min_pct REAL;
        ALTER TABLE step_result ADD COLUMN yield_max_pct REAL;
        ALTER TABLE step_result ADD COLUMN balance_tolerance_pct REAL;
        ALTER TABLE step_result ADD COLUMN coverage_factor REAL;
        ALTER TABLE step_result ADD COLUMN expanded_uncertainty_kg REAL;
        ALTER TABLE step_result ADD COLUMN equivalents_ranges TEXT;
        ALTER TABLE step_result ADD COLUMN product_in_waste_max_pct REAL;

        UPDATE step_result SET
            yield_min_pct = (SELECT f.limit_value FROM flag f
                             WHERE f.revision_ref = step_result.revision_ref AND f.step = step_result.step AND f.code = 'yield-low'),
            yield_max_pct = (SELECT f.limit_value FROM flag f
                             WHERE f.revision_ref = step_result.revision_ref AND f.step = step_result.step AND f.code = 'yield-high'),
            product_in_waste_max_pct = (SELECT f.limit_value FROM flag f
                             WHERE f.revision_ref = step_result.revision_ref AND f.step = step_result.step AND f.code = 'product-in-waste');
        """;

    // The route yield of a batch (docs/computation.md, "Route yield") and its step-to-step links. Revisions stored
    // before this version were never linked: their route is marked as not computed (shown so, never as a number) and
    // their links as unknown (NULL; '[]' means "no step charged an earlier step's product").
    private const string V7RouteYield = """
        ALTER TABLE batch_revision ADD COLUMN route_yield_pct REAL;
        ALTER TABLE batch_revision ADD COLUMN route_theoretical_kg REAL;
        ALTER TABLE batch_revision ADD COLUMN route_note TEXT;
        ALTER TABLE batch_revision ADD COLUMN step_links TEXT;
        UPDATE batch_revision SET route_note = 'not computed: stored before route yields were kept (schema version 7)';
        """;

    /// <summary>The note migration 7 gives revisions stored before it.</summary>
    public const string RouteNotComputedBefore7 = "not computed: stored before route yields were kept (schema version 7)";

    // What a day's digest shows changes when a batch revision is stored for the day, when a revision of
    // the day is replaced by one of another day, and when a review decision is made on a current flag
    // of the day. Triggers count these per day (the ingest path runs no extra statement of its own);
    // each digest write records the counts it was gathered at, and day_change.digested their sum for
    // the latest write. A day whose counts have grown past it is stale, found through a partial index
    // that holds only stale days. Counts of rows written before this migration are rebuilt from the
    // store's times (a decision's count is one per reviewed flag: only the last decision's time is kept).
    private const string V8DigestFreshness = """
        CREATE TABLE day_change (
            day       TEXT    PRIMARY KEY CHECK (day GLOB '[0-9][0-9][0-9][0-9]-[0-9][0-9]-[0-9][0-9]'),
            batches   INTEGER NOT NULL DEFAULT 0 CHECK (batches >= 0),
            revisions INTEGER NOT NULL DEFAULT 0 CHECK (revisions >= 0),
            withdrawn INTEGER NOT NULL DEFAULT 0 CHECK (withdrawn >= 0),
            reviews   INTEGER NOT NULL DEFAULT 0 CHECK (reviews >= 0),
            digested  INTEGER CHECK (digested >= 0)
        ) WITHOUT ROWID;
        CREATE INDEX ix_day_change_stale ON day_change (day)
            WHERE digested IS NOT NULL AND batches + revisions + withdrawn + reviews > digested;

        CREATE TRIGGER day_change_revision AFTER INSERT ON batch_revision
        BEGIN
            INSERT INTO day_change (day, batches, revisions) VALUES (NEW.production_day, NEW.revision = 1, NEW.revision > 1)
            ON CONFLICT (day) DO UPDATE SET batches = batches + excluded.batches, revisions = revisions + excluded.revisions;
        END;
        CREATE TRIGGER day_change_withdrawn AFTER UPDATE OF superseded_by ON batch_revision
        WHEN OLD.superseded_by IS NULL AND NEW.superseded_by IS NOT NULL
            AND (SELECT n.production_day FROM batch_revision n WHERE n.id = NEW.superseded_by) IS NOT NEW.production_day
        BEGIN
            INSERT INTO day_change (day, withdrawn) VALUES (NEW.production_day, 1)
            ON CONFLICT (day) DO UPDATE SET withdrawn = withdrawn + 1;
        END;
        CREATE TRIGGER day_change_review AFTER UPDATE OF state, outcome, deviation_ref, reviewed_by ON flag
        WHEN NEW.is_current = 1 AND (OLD.state IS NOT NEW.state OR OLD.outcome IS NOT NEW.outcome
            OR OLD.deviation_ref IS NOT NEW.deviation_ref OR OLD.reviewed_by IS NOT NEW.reviewed_by)
        BEGIN
            INSERT INTO day_change (day, reviews) VALUES (NEW.production_day, 1)
            ON CONFLICT (day) DO UPDATE SET reviews = reviews + 1;
        END;

        ALTER TABLE digest ADD COLUMN seen_batches INTEGER;
        ALTER TABLE digest ADD COLUMN seen_revisions INTEGER;
        ALTER TABLE digest ADD COLUMN seen_withdrawn INTEGER;
        ALTER TABLE digest ADD COLUMN seen_reviews INTEGER;
        ALTER TABLE digest ADD COLUMN reason TEXT;

        INSERT INTO day_change (day, batches, revisions)
            SELECT production_day, sum(revision = 1), sum(revision > 1) FROM batch_revision GROUP BY production_day;
        INSERT OR IGNORE INTO day_change (day) SELECT DISTINCT day FROM digest;
        UPDATE day_change SET
            withdrawn = (SELECT count(*) FROM batch_revision o JOIN batch_revision n ON n.id = o.superseded_by
                         WHERE o.production_day = day_change.day AND n.production_day <> o.production_day),
            reviews   = (SELECT count(*) FROM flag f
                         WHERE f.production_day = day_change.day AND f.is_current = 1 AND f.reviewed_at IS NOT NULL);
        UPDATE digest SET
            seen_batches   = (SELECT count(*) FROM batch_revision r
                              WHERE r.production_day = digest.day AND r.revision = 1 AND r.stored_at <= digest.written_at),
            seen_revisions = (SELECT count(*) FROM batch_revision r
                              WHERE r.production_day = digest.day AND r.revision > 1 AND r.stored_at <= digest.written_at),
            seen_withdrawn = (SELECT count(*) FROM batch_revision o JOIN batch_revision n ON n.id = o.superseded_by
                              WHERE o.production_day = digest.day AND n.production_day <> o.production_day AND o.superseded_at <= digest.written_at),
            seen_reviews   = (SELECT count(*) FROM flag f
                              WHERE f.production_day = digest.day AND f.is_current = 1 AND f.reviewed_at <= digest.written_at);
        UPDATE day_change SET digested =
            (SELECT d.seen_batches + d.seen_revisions + d.seen_withdrawn + d.seen_reviews FROM digest d WHERE d.day = day_change.day ORDER BY d.id DESC LIMIT 1);
        """;

    // Solvent and water charged per step (docs/computation.md). Rows stored before stay NULL (unknown): the rows are
    // kept, but the roles they were judged by come from the definitions of the time, which were not recorded. The
    // per-material parts of the ladder live in the ladder JSON; rungs stored before have none.
    private const string V9SolventAndWater = """
        ALTER TABLE step_result ADD COLUMN solvent_in_kg REAL;
        ALTER TABLE step_result ADD COLUMN water_in_kg REAL;
        """;

    // Questions across batches: a step's figures (or every step of a recipe) batch by batch in production order,
    // (production_day, last_output_at, batch_id), optionally of one recipe version. The revision's recipe version and
    // last output time are copied onto its step results, as production day and recipe were by migration 2: a revision
    // never changes them, so they stay as written; supersession only clears is_current. The history index gains
    // last_output_at so that the order comes from the index (only batches of the same day and output time are sorted);
    // a second index serves every step of a recipe. Batches of one recipe (current revisions only) and the audit trail
    // by time and by kind get their own indexes. Existing rows are filled from their revisions.
    private const string V10AcrossBatches = """
        ALTER TABLE step_result ADD COLUMN recipe_version INTEGER;
        ALTER TABLE step_result ADD COLUMN last_output_at TEXT;
        UPDATE step_result SET recipe_version = r.recipe_version, last_output_at = r.last_output_at
        FROM batch_revision r WHERE r.id = step_result.revision_ref;

        DROP INDEX ix_step_result_history;
        CREATE INDEX ix_step_result_history ON step_result (recipe, step, is_current, production_day, last_output_at);
        CREATE INDEX ix_step_result_recipe ON step_result (recipe, is_current, production_day, last_output_at);
        CREATE INDEX ix_batch_revision_recipe ON batch_revision (recipe, production_day) WHERE superseded_at IS NULL;
        CREATE INDEX ix_audit_event_at ON audit_event (at);
        CREATE INDEX ix_audit_event_kind ON audit_event (kind, at);
        """;

    private const string GenesisHash = "0000000000000000000000000000000000000000000000000000000000000000";
}
