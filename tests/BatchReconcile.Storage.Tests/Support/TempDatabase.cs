using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage.Tests.Support;

/// <summary>
/// A real store, deleted afterwards: a database file in a fresh temporary folder, or (for
/// <see cref="StoreProvider.Postgresql"/>) a site schema of its own on the tests' PostgreSQL server.
/// </summary>
internal sealed class TempDatabase : IDisposable
{
    public TempDatabase(StoreProvider provider = StoreProvider.Sqlite)
    {
        Provider = provider;
        Folder = Path.Combine(Path.GetTempPath(), "batchreconcile-storage-tests", Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(Folder);
        DatabasePath = System.IO.Path.Combine(Folder, "store.db");
        SiteCode = PostgresTestServer.NewSiteCode();
    }

    public StoreProvider Provider { get; }

    public string Folder { get; }

    public string DatabasePath { get; }

    /// <summary>The site of a PostgreSQL store (its schema is <c>site_</c> and this code).</summary>
    public string SiteCode { get; }

    public BatchStore Open(StoreSettings? settings = null, TimeProvider? time = null) =>
        Provider == StoreProvider.Postgresql
            ? BatchStore.OpenPostgres(PostgresTestServer.ConnectionString, SiteCode, settings ?? new StoreSettings(), time ?? new FixedTime(Build.ProcessedAt))
            : BatchStore.Open(DatabasePath, settings ?? new StoreSettings(), time ?? new FixedTime(Build.ProcessedAt));

    public SqliteConnection OpenRaw() => Provider == StoreProvider.Sqlite
        ? StoreConnectionFactory.Open(DatabasePath, new StoreSettings())
        : throw new InvalidOperationException("OpenRaw is for SQLite stores.");

    public void Dispose()
    {
        SqliteConnection.ClearAllPools();
        if (Provider == StoreProvider.Postgresql)
        {
            Npgsql.NpgsqlConnection.ClearAllPools();
            PostgresTestServer.DropSite(SiteCode);
        }

        try
        {
            Directory.Delete(Folder, recursive: true);
        }
        catch (IOException)
        {
            // A leftover temp folder is harmless; failing the test for it would hide the real result.
        }
    }
}
