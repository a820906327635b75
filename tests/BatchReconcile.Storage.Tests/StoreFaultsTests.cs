using BatchReconcile.Storage.Tests.Support;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage.Tests;

/// <summary>
/// <see cref="StoreFaults.ReasonOf"/>: the services that retry (intake, digests) say a database fault in one line and
/// keep stack traces for everything else. Result codes from https://www.sqlite.org/rescode.html.
/// </summary>
public sealed class StoreFaultsTests
{
    [Theory]
    [InlineData(5, "locked by another process")]    // SQLITE_BUSY
    [InlineData(6, "locked by another process")]    // SQLITE_LOCKED
    [InlineData(517, "locked by another process")]  // SQLITE_BUSY_SNAPSHOT (extended: 5 | 2 << 8)
    [InlineData(13, "disk holding the database is full")]   // SQLITE_FULL
    [InlineData(8, "cannot be written")]             // SQLITE_READONLY
    [InlineData(266, "I/O error")]                   // SQLITE_IOERR_READ (10 | 1 << 8)
    [InlineData(19, null)]                           // SQLITE_CONSTRAINT: about the data, not the database
    [InlineData(1, null)]                            // SQLITE_ERROR: a bad statement, a bug to see with its stack
    public void A_database_fault_has_a_one_line_reason_and_a_fault_of_the_data_has_none(int code, string? expected)
    {
        var reason = StoreFaults.ReasonOf(new SqliteException("SQLite Error", code));

        if (expected is null)
        {
            Assert.Null(reason);
        }
        else
        {
            Assert.Contains(expected, reason, StringComparison.Ordinal);
        }
    }

    [Fact]
    public void A_translated_fault_keeps_its_message_and_other_exceptions_have_no_reason()
    {
        var translated = StoreFaults.Translate(new SqliteException("SQLite Error 5: 'database is locked'.", 5), "/data/store.db")!;

        Assert.Equal(translated.Message, StoreFaults.ReasonOf(translated));
        Assert.Null(StoreFaults.ReasonOf(new StoreException("revision 3 of KB3-NB-0158 is not the current one")));
        Assert.Null(StoreFaults.ReasonOf(new IOException("the inbox is gone")));
    }

    [Fact]
    public void A_write_refused_by_a_lock_held_in_another_connection_is_a_database_fault()
    {
        using var db = new TempDatabase();
        using var store = db.Open(new StoreSettings { BusyTimeoutSeconds = 0.05 });
        using var holder = db.OpenRaw();
        Db.Execute(holder, "BEGIN EXCLUSIVE");

        var refused = Assert.Throws<SqliteException>(() => Db.Execute(store.Connection, "CREATE TABLE probe (a INTEGER)"));

        Assert.Contains("locked by another process", StoreFaults.ReasonOf(refused), StringComparison.Ordinal);
        Db.Execute(holder, "ROLLBACK");
    }
}
