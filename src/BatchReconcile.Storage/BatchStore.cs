using System.Data.Common;
using BatchReconcile.Records.Exports;
using BatchReconcile.Storage.Ingest;
using BatchReconcile.Storage.Schema;
using BatchReconcile.Storage.Sql;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage;

/// <summary>
/// The store of batches, revisions, raw rows, step results, flags, the ingest log and the audit trail:
/// an embedded SQLite file (the default) or one site's schema in a shared PostgreSQL database
/// (<see cref="OpenPostgres"/>). One instance holds one connection; calls are serialised, so one instance
/// may be shared by the threads of a process. Other processes (CLI commands while the service runs) open
/// their own instance: SQLite's write-ahead log, or PostgreSQL's snapshots, let them read while the service writes.
/// </summary>
/// <remarks>The SQL is the same on both; what differs (opening, migrations, write locks, faults) is in
/// <see cref="StoreConnectionFactory"/>, <see cref="SchemaMigrator"/> and <see cref="PostgresStore"/>.</remarks>
public sealed partial class BatchStore : IDisposable
{
    private readonly TimeProvider _time;
    private readonly StoreSettings _settings;
    private readonly Lock _gate = new();
    private readonly PostgresTarget? _postgres;
    private DbConnection _connection;
    private PreparedCommand? _findFile;
    private bool _disposed;

    // Set when a fault may have left the connection unable to write even after the cause is gone (SQLite opens
    // a file it may not write read-only, and keeps it so): the next operation opens the database afresh.
    private bool _reopen;

    private BatchStore(DbConnection connection, StoreSettings settings, TimeProvider time, PostgresTarget? postgres = null)
    {
        _connection = connection;
        _settings = settings;
        _time = time;
        _postgres = postgres;
    }

    /// <summary>The store's own connection, for tests that look into the tables or watch what it does (commit hooks, query plans).</summary>
    internal DbConnection Connection => _connection;

    /// <summary>The database file, or for PostgreSQL where the site's schema is (server, database, schema; never the password).</summary>
    public string DatabasePath => _postgres?.Description ?? _connection.DataSource;

    /// <summary>The sites a PostgreSQL database holds (each with its schema), by code.</summary>
    /// <exception cref="StoreException">The server cannot be reached or refuses the login.</exception>
    public static IReadOnlyList<string> PostgresSites(StoreSettings settings)
    {
        ArgumentNullException.ThrowIfNull(settings);
        var target = PostgresTarget.From(settings.ConnectionString ?? string.Empty, "any", settings);
        try
        {
            return PostgresStore.Sites(target.ConnectionString);
        }
        catch (DbException e) when (StoreFaults.Describe(e) is { } reason)
        {
            throw new StoreException($"{target.Description}: {reason}", e) { Transient = true };
        }
    }

    /// <summary>True when a site code can name a site (and its PostgreSQL schema).</summary>
    public static bool IsValidSiteCode(string? code) => PostgresTarget.IsValidSiteCode(code);

    /// <summary>True when the store is a site's schema in PostgreSQL.</summary>
    public bool IsPostgres => _postgres is not null;

    /// <summary>
    /// Opens the store the settings name: the SQLite file <paramref name="databasePath"/> when
    /// <see cref="StoreSettings.Provider"/> is <see cref="StoreProvider.Sqlite"/>, else the schema of
    /// <paramref name="siteCode"/> in the PostgreSQL database of <see cref="StoreSettings.ConnectionString"/>.
    /// </summary>
    public static BatchStore Open(StoreSettings settings, string databasePath, string siteCode, TimeProvider? time = null)
    {
        ArgumentNullException.ThrowIfNull(settings);
        return settings.Provider == StoreProvider.Postgresql
            ? OpenPostgres(settings.ConnectionString ?? string.Empty, siteCode, settings, time)
            : Open(databasePath, settings, time);
    }

    /// <summary>Opens the schema of site <paramref name="siteCode"/> in a PostgreSQL database, creating and migrating it under an advisory lock.</summary>
    /// <exception cref="StoreException">The server cannot be reached, refuses the login, or holds a newer schema.</exception>
    public static BatchStore OpenPostgres(string connectionString, string siteCode, StoreSettings settings, TimeProvider? time = null)
    {
        ArgumentNullException.ThrowIfNull(settings);
        var target = PostgresTarget.From(connectionString, siteCode, settings);
        time ??= TimeProvider.System;
        var connection = PostgresStore.OpenAndMigrate(target, time);
        return new BatchStore(connection, settings, time, target);
    }

    /// <summary>Opens the database (creating it when missing) and applies any migrations it lacks.</summary>
    /// <exception cref="StoreException">The database is newer than this program, or cannot use WAL.</exception>
    public static BatchStore Open(string databasePath, StoreSettings settings, TimeProvider? time = null)
    {
        var directory = Path.GetDirectoryName(Path.GetFullPath(databasePath));
        if (!string.IsNullOrEmpty(directory))
        {
            Directory.CreateDirectory(directory);
        }

        SqliteConnection? connection = null;
        try
        {
            connection = StoreConnectionFactory.Open(databasePath, settings);
            time ??= TimeProvider.System;
            SchemaMigrator.MigrateToLatest(connection, time);
            return new BatchStore(connection, settings, time);
        }
        catch (SqliteException e) when (StoreFaults.Translate(e, Path.GetFullPath(databasePath)) is { } fault)
        {
            connection?.Dispose();
            throw fault;
        }
        catch
        {
            connection?.Dispose();
            throw;
        }
    }

    /// <summary>Runs a store operation, turning a fault of the database (<see cref="StoreFaults"/>) into a transient <see cref="StoreException"/>.</summary>
    private T Guarded<T>(Func<T> operation)
    {
        try
        {
            ReopenIfNeeded();
            return operation();
        }
        catch (DbException e) when (StoreFaults.Translate(e, DatabasePath) is { } fault)
        {
            lock (_gate)
            {
                _reopen |= StoreFaults.NeedsReopen(e);
            }

            throw fault;
        }
    }

    private void ReopenIfNeeded()
    {
        lock (_gate)
        {
            ThrowIfDisposed();
            if (!_reopen)
            {
                return;
            }

            Reopen();
        }
    }

    /// <summary>Replaces the connection with a fresh one to the same database (the caller holds the gate).</summary>
    private void Reopen()
    {
        DbConnection fresh = _postgres is { } target ? PostgresStore.Open(target) : StoreConnectionFactory.Open(_connection.DataSource, _settings);
        DropCachedStatements();
        _connection.Dispose();
        _connection = fresh;
        _reopen = false;
    }

    /// <summary>
    /// True when a file with this content has an ingest log entry. The host's crash rule: a file
    /// still in the inbox whose hash is known was committed before a crash and is only moved.
    /// </summary>
    public bool IsKnown(string sha256) => FindFile(sha256) is not null;

    /// <summary>The first ingest log entry of a file's content (its real outcome, not a later duplicate sighting).</summary>
    public KnownFile? FindFile(string sha256)
    {
        var sha = FileIngest.NormaliseSha256(sha256);
        lock (_gate)
        {
            ThrowIfDisposed();
            // Asked once per file before its group is committed: compiled once per connection.
            _findFile ??= new PreparedCommand(_connection, null, CommitStatements.FindFileSql, ("$sha256", SqliteType.Text));
            return ReadKnownFile(_findFile.Set("$sha256", sha));
        }
    }

    /// <summary>Previews what committing a file with this hash and these batches would do.</summary>
    public IngestPlan Classify(string sha256, IReadOnlyList<BatchRecord> batches)
    {
        ArgumentNullException.ThrowIfNull(batches);
        var sha = FileIngest.NormaliseSha256(sha256);
        lock (_gate)
        {
            ThrowIfDisposed();
            using var findFile = new PreparedCommand(_connection, null, CommitStatements.FindFileSql, ("$sha256", SqliteType.Text));
            var known = ReadKnownFile(findFile.Set("$sha256", sha));
            if (known is not null)
            {
                return new IngestPlan(known, []);
            }

            using var findBatch = new PreparedCommand(_connection, null, CommitStatements.FindBatchSql, ("$batch", SqliteType.Text));
            return new IngestPlan(null, batches.Select(b => PlanBatch(findBatch, b.BatchId, BatchContentHash.Compute(b)).Plan).ToList());
        }
    }

    public void Dispose()
    {
        lock (_gate)
        {
            if (_disposed)
            {
                return;
            }

            _disposed = true;
            DropCachedStatements();
            _connection.Dispose();
        }
    }

    private void DropCachedStatements()
    {
        _findFile?.Dispose();
        _findFile = null;
    }

    private static KnownFile? ReadKnownFile(PreparedCommand find) =>
        find.ReadFirst(static row => new KnownFile(
            row.GetInt64(0),
            row.GetString(1),
            row.GetString(2),
            IngestOutcomeText.Parse(row.GetString(3)),
            row.GetInt32(4),
            DbText.ParseTime(row.GetString(5))));

    /// <summary>Compares a batch with its current stored revision.</summary>
    private static (BatchPlan Plan, long? BatchRef, long? CurrentRevisionRef) PlanBatch(PreparedCommand findBatch, string batchId, string content)
    {
        var stored = findBatch.Set("$batch", batchId).ReadFirst(static row =>
            (Found: true, BatchRef: row.GetInt64(0), HasCurrent: !row.IsNull(1), RevisionRef: row.GetInt64(1), Revision: row.GetInt32(2), Content: row.NullableString(3)));
        if (!stored.Found)
        {
            return (new BatchPlan(batchId, BatchDisposition.New, 1, content), null, null);
        }

        if (!stored.HasCurrent)
        {
            // Kept as a bug rather than healed: the unique index allows at most one current revision
            // and the commit always writes one, so a batch without one means the file was edited by hand.
            throw new InvalidDataException($"Batch {batchId} is stored without a current revision.");
        }

        var plan = string.Equals(stored.Content, content, StringComparison.Ordinal)
            ? new BatchPlan(batchId, BatchDisposition.Unchanged, stored.Revision, content)
            : new BatchPlan(batchId, BatchDisposition.Revision, stored.Revision + 1, content);
        return (plan, stored.BatchRef, stored.RevisionRef);
    }

    /// <remarks>Called by every operation under the gate. A PostgreSQL connection that broke (the server restarted,
    /// the network dropped) is opened afresh here, so the next try after a fault works once the server answers;
    /// while it does not, this throws the transient <see cref="StoreException"/> of <see cref="PostgresStore.Open"/>.</remarks>
    private void ThrowIfDisposed()
    {
        ObjectDisposedException.ThrowIf(_disposed, this);
        if (_postgres is not null && _connection.State != System.Data.ConnectionState.Open)
        {
            Reopen();
        }
    }

    /// <summary>
    /// A transaction that writes: SQLite's BEGIN IMMEDIATE (the write lock first), or on PostgreSQL a
    /// transaction holding the site's write lock (<see cref="PostgresStore.BeginWrite"/>): one writer per
    /// site at a time, so the audit chain is extended by one instance at a time and never forks.
    /// </summary>
    private DbTransaction BeginWrite() => _connection is SqliteConnection sqlite
        ? sqlite.BeginTransaction(deferred: false)
        : PostgresStore.BeginWrite(_connection);

    /// <summary>A transaction that only reads, on one consistent snapshot.</summary>
    private DbTransaction BeginRead() => _connection is SqliteConnection sqlite
        ? sqlite.BeginTransaction(deferred: true)
        : PostgresStore.BeginRead(_connection);
}
