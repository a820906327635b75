using System.Data.Common;
using Microsoft.Data.Sqlite;
using Npgsql;

namespace BatchReconcile.Storage;

/// <summary>
/// Tells a fault of the database (locked, disk full, read-only, I/O) from a fault of what was being stored, and
/// says the former in words that tell an operator what to do.
/// </summary>
/// <remarks>
/// A fault of the store is never the file's fault: the file stays in the inbox and the service tries again
/// later (<c>docs/storage.md</c>, "When the database fails"). Only a fault of the data itself (a constraint the
/// program's own checks should have caught, a value too big) is charged to the file. Codes are SQLite's primary
/// result codes (the low byte of the extended code), https://www.sqlite.org/rescode.html, and PostgreSQL's
/// SQLSTATE codes by class (PostgreSQL 15 documentation, appendix A "PostgreSQL Error Codes").
/// </remarks>
public static class StoreFaults
{
    private const int Perm = 3, Busy = 5, Locked = 6, NoMem = 7, ReadOnly = 8, Interrupt = 9, IoErr = 10, Corrupt = 11,
        Full = 13, CantOpen = 14, Protocol = 15, Auth = 23, NotADb = 26;

    /// <summary>What is wrong with the database and what to do, or null when the error is about the data being written.</summary>
    public static string? Describe(DbException exception) => exception switch
    {
        SqliteException s => Describe(s),
        PostgresException p => DescribePostgres(p.SqlState),
        NpgsqlException => "the PostgreSQL server cannot be reached or closed the connection",
        _ => null,
    };

    /// <summary>
    /// A PostgreSQL error by its SQLSTATE: null for errors about the data (class 22 data exception, 23 integrity
    /// constraint violation, 42 syntax or access rule, P0 raised by a trigger), a reason for faults of the server.
    /// </summary>
    public static string? DescribePostgres(string sqlState)
    {
        ArgumentNullException.ThrowIfNull(sqlState);
        return sqlState switch
        {
            "28P01" or "28000" => "the PostgreSQL server refused the login (wrong user name or password in Storage:ConnectionString)",
            "3D000" => "the PostgreSQL database named in Storage:ConnectionString does not exist; create it (docs/configuration.md, \"Many sites\")",
            "42501" => "the PostgreSQL role lacks a privilege the store needs (docs/configuration.md, \"Many sites\", lists the grants)",
            "25006" => "the PostgreSQL server is read-only (a standby?); point Storage:ConnectionString at the primary",
            "53100" => "the disk of the PostgreSQL server is full; free space on it (the data stay in the inbox meanwhile)",
            "40001" or "40P01" => "PostgreSQL ended the transaction for a conflict with another instance (serialization failure or deadlock); it is tried again",
            "55P03" or "57014" => "a PostgreSQL lock or statement waited longer than the time-out; it is tried again",
            "XX001" or "XX002" => "the PostgreSQL server reports damaged data; ask its administrator (restore from a backup)",
            _ when sqlState.StartsWith("08", StringComparison.Ordinal) => "the connection to the PostgreSQL server failed",
            _ when sqlState.StartsWith("57P", StringComparison.Ordinal) => "the PostgreSQL server is shutting down, restarting or not yet accepting connections",
            _ when sqlState.StartsWith("53", StringComparison.Ordinal) => "the PostgreSQL server is out of resources (memory, connections or disk)",
            _ => null,
        };
    }

    private static string? Describe(SqliteException exception)
    {
        ArgumentNullException.ThrowIfNull(exception);
        return (exception.SqliteErrorCode & 0xFF) switch
        {
            Busy or Locked => "the database is locked by another process for longer than the busy timeout; it is tried again when the lock is released (look for a sqlite3 shell or backup holding it)",
            Full => "the disk holding the database is full; free space on it (the data stay in the inbox meanwhile)",
            ReadOnly or Perm or Auth => "the database cannot be written (read-only file or file system, or no permission); make it writable for the service's user",
            IoErr => "the database file could not be read or written (I/O error); check the disk and its mount",
            CantOpen => "the database file cannot be opened; check that its folder exists and is writable",
            NoMem => "SQLite ran out of memory",
            Interrupt => "the database operation was interrupted",
            Protocol => "the database's locking protocol failed (a network file system?); put the database on a local disk",
            Corrupt or NotADb => "the database file is damaged or is not a database; restore it from a backup (docs/storage.md)",
            _ => null,
        };
    }

    /// <summary>
    /// True when the connection should be opened again before the next try: SQLite opens a file it may not write
    /// read-only and keeps it so, and after an I/O error the open file may be the wrong one (a disk re-mounted).
    /// </summary>
    /// <remarks>A PostgreSQL connection that failed is opened afresh too (the pool hands out a new one).</remarks>
    public static bool NeedsReopen(DbException exception) => exception switch
    {
        SqliteException s => (s.SqliteErrorCode & 0xFF) is ReadOnly or Perm or Auth or IoErr or CantOpen,
        NpgsqlException => Describe(exception) is not null,
        _ => false,
    };

    /// <summary>The store's own exception for a database fault, or null when <paramref name="exception"/> is about the data.</summary>
    public static StoreException? Translate(DbException exception, string databasePath) =>
        Describe(exception) is { } reason
            ? new StoreException($"{databasePath}: {reason} ({Source(exception)})", exception) { Transient = true }
            : null;

    /// <summary>The provider's own words, without anything of the connection string.</summary>
    private static string Source(DbException exception) => exception switch
    {
        SqliteException => "SQLite: " + exception.Message.Replace("SQLite Error ", string.Empty, StringComparison.Ordinal),
        PostgresException p => $"PostgreSQL {p.SqlState}: {p.MessageText}",
        _ => "Npgsql: " + (exception.InnerException?.Message ?? exception.Message),
    };

    /// <summary>
    /// The one-line reason when <paramref name="exception"/> is a fault of the database (raw from SQLite or already
    /// translated), or null for anything else. Callers that retry say this reason without a stack trace.
    /// </summary>
    public static string? ReasonOf(Exception exception) => exception switch
    {
        DbException d => Describe(d),
        StoreException { Transient: true } s => s.Message,
        _ => null,
    };
}
