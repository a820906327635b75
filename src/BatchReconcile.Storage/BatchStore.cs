using BatchReconcile.Records.Exports;
using BatchReconcile.Storage.Ingest;
using BatchReconcile.Storage.Schema;
using BatchReconcile.Storage.Sql;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage;

/// <summary>
/// The SQLite store of batches, revisions, raw rows, step results, flags, the ingest log and the
/// audit trail. One instance holds one connection; calls are serialised, so one instance may be
/// shared by the threads of a process. Other processes (CLI commands while the service runs) open
/// their own instance: the write-ahead log lets them read while the service writes.
/// </summary>
public sealed partial class BatchStore : IDisposable
{
    private readonly TimeProvider _time;
    private readonly StoreSettings _settings;
    private readonly Lock _gate = new();
    private SqliteConnection _connection;
    private PreparedCommand? _findFile;
    private bool _disposed;

    // Set when a fault may have left the connection unable to write even after the cause is gone (SQLite opens
    // a file it may not write read-only, and keeps it so): the next operation opens the database afresh.
    private bool _reopen;

    private BatchStore(SqliteConnection connection, StoreSettings settings, TimeProvider time)
    {
        _connection = connection;
        _settings = settings;
        _time = time;
    }

    /// <summary>The store's own connection, for tests that watch what it does (commit hooks, query plans).</summary>
    internal SqliteConnection Connection => _connection;

    /// <summary>The database file.</summary>
    public string DatabasePath => _connection.DataSource;

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
        catch (SqliteException e) when (StoreFaults.Translate(e, DatabasePath) is { } fault)
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

            var fresh = StoreConnectionFactory.Open(_connection.DataSource, _settings);
            DropCachedStatements();
            _connection.Dispose();
            _connection = fresh;
            _reopen = false;
        }
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

    private void ThrowIfDisposed() => ObjectDisposedException.ThrowIf(_disposed, this);
}
