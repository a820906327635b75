using BatchReconcile.Storage.Tests.Support;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage.Tests;

public sealed class ConnectionTests
{
    // PRAGMA synchronous reads back as a number: NORMAL = 1, FULL = 2 (sqlite.org/pragma.html#pragma_synchronous).
    [Theory]
    [InlineData(SynchronousMode.Full, 30.0, "2", "30000")]
    [InlineData(SynchronousMode.Normal, 2.5, "1", "2500")]
    public void The_store_connection_has_wal_foreign_keys_busy_timeout_and_the_synchronous_setting(
        SynchronousMode mode, double busySeconds, string synchronous, string busyMs)
    {
        using var db = new TempDatabase();
        using var store = db.Open(new StoreSettings { Synchronous = mode, BusyTimeoutSeconds = busySeconds });

        Assert.Equal("wal", Db.Scalar(store.Connection, "PRAGMA journal_mode"));
        Assert.Equal("1", Db.Scalar(store.Connection, "PRAGMA foreign_keys"));
        Assert.Equal(busyMs, Db.Scalar(store.Connection, "PRAGMA busy_timeout"));
        Assert.Equal(synchronous, Db.Scalar(store.Connection, "PRAGMA synchronous"));

        // temp_store MEMORY = 2 (sqlite.org/pragma.html#pragma_temp_store): the statement journals of the
        // per-file savepoints stay in memory instead of temporary files.
        Assert.Equal("2", Db.Scalar(store.Connection, "PRAGMA temp_store"));
        Assert.True(File.Exists(db.DatabasePath + "-wal"), "the write-ahead log file exists beside the database");
    }

    [Fact]
    public void Foreign_keys_are_enforced_not_only_declared()
    {
        using var db = new TempDatabase();
        using var store = db.Open();
        var refused = Assert.Throws<SqliteException>(() => Db.Execute(store.Connection, """
            INSERT INTO flag (revision_ref, step, code, severity, unit, message, created_at)
            VALUES (999, 'S1', 'yield-low', 'major', '%', 'no such revision', '2026-11-24T08:00:00.0000000Z')
            """));
        Assert.Contains("FOREIGN KEY", refused.Message, StringComparison.OrdinalIgnoreCase);
    }

    [Theory]
    [InlineData(-1.0)]
    [InlineData(double.NaN)]
    [InlineData(3601.0)]
    public void A_busy_timeout_out_of_range_is_reported_and_refused(double seconds)
    {
        var settings = new StoreSettings { BusyTimeoutSeconds = seconds };
        Assert.Contains("BusyTimeoutSeconds", Assert.Single(settings.Validate()), StringComparison.Ordinal);

        using var db = new TempDatabase();
        Assert.Throws<ArgumentException>(() => db.Open(settings));
        Assert.False(File.Exists(db.DatabasePath), "nothing is created with bad settings");
    }

    [Fact]
    public void Default_settings_are_full_sync_and_thirty_seconds()
    {
        var settings = new StoreSettings();
        Assert.Equal(SynchronousMode.Full, settings.Synchronous);
        Assert.Equal(TimeSpan.FromSeconds(30), settings.BusyTimeout);
        Assert.Empty(settings.Validate());
    }
}
