using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage;

/// <summary>
/// Tells a fault of the database (locked, disk full, read-only, I/O) from a fault of what was being stored, and
/// says the former in words that tell an operator what to do.
/// </summary>
/// <remarks>
/// A fault of the store is never the file's fault: the file stays in the inbox and the service tries again
/// later (<c>docs/storage.md</c>, "When the database fails"). Only a fault of the data itself (a constraint the
/// program's own checks should have caught, a value too big) is charged to the file. Codes are SQLite's primary
/// result codes (the low byte of the extended code), https://www.sqlite.org/rescode.html.
/// </remarks>
public static class StoreFaults
{
    private const int Perm = 3, Busy = 5, Locked = 6, NoMem = 7, ReadOnly = 8, Interrupt = 9, IoErr = 10, Corrupt = 11,
        Full = 13, CantOpen = 14, Protocol = 15, Auth = 23, NotADb = 26;

    /// <summary>What is wrong with the database and what to do, or null when the error is about the data being written.</summary>
    public static string? Describe(SqliteException exception)
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
    public static bool NeedsReopen(SqliteException exception) =>
        (exception.SqliteErrorCode & 0xFF) is ReadOnly or Perm or Auth or IoErr or CantOpen;

    /// <summary>The store's own exception for a database fault, or null when <paramref name="exception"/> is about the data.</summary>
    public static StoreException? Translate(SqliteException exception, string databasePath) =>
        Describe(exception) is { } reason
            ? new StoreException($"{databasePath}: {reason} (SQLite: {exception.Message.Replace("SQLite Error ", string.Empty, StringComparison.Ordinal)})", exception) { Transient = true }
            : null;

    /// <summary>
    /// The one-line reason when <paramref name="exception"/> is a fault of the database (raw from SQLite or already
    /// translated), or null for anything else. Callers that retry say this reason without a stack trace.
    /// </summary>
    public static string? ReasonOf(Exception exception) => exception switch
    {
        SqliteException s => Describe(s),
        StoreException { Transient: true } s => s.Message,
        _ => null,
    };
}
