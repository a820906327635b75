using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage.Tests.Support;

/// <summary>A real database file in a fresh temporary folder, deleted afterwards.</summary>
internal sealed class TempDatabase : IDisposable
{
    public TempDatabase()
    {
        Folder = Path.Combine(Path.GetTempPath(), "batchreconcile-storage-tests", Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(Folder);
        DatabasePath = System.IO.Path.Combine(Folder, "store.db");
    }

    public string Folder { get; }

    public string DatabasePath { get; }

    public BatchStore Open(StoreSettings? settings = null, TimeProvider? time = null) =>
        BatchStore.Open(DatabasePath, settings ?? new StoreSettings(), time ?? new FixedTime(Build.ProcessedAt));

    public SqliteConnection OpenRaw() => StoreConnectionFactory.Open(DatabasePath, new StoreSettings());

    public void Dispose()
    {
        SqliteConnection.ClearAllPools();
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
