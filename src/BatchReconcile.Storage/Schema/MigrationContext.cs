using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage.Schema;

/// <summary>What the code part of a <see cref="Migration"/> works with: the open transaction and the time the migration runs.</summary>
public sealed record MigrationContext(SqliteConnection Connection, SqliteTransaction Transaction, DateTimeOffset Now);
