using System.Globalization;
using System.Text.Json.Nodes;
using BatchReconcile.Cli;
using BatchReconcile.Hosting;
using BatchReconcile.Storage;
using BatchReconcile.Storage.Tests.Support;
using Microsoft.Data.Sqlite;
using Microsoft.Extensions.Hosting;
using Npgsql;

namespace BatchReconcile.Tests.Support;

/// <summary>
/// A throwaway data folder for in-process host tests, with the repository's config and a clock the test controls, on
/// either store: SQLite (the data folder's database file) or PostgreSQL (a site of its own on the tests' server,
/// <see cref="PostgresTestServer"/>, named in a copy of the repository's config). Deleted on dispose, the site's
/// schema with it.
/// </summary>
public sealed class HostSandbox : IDisposable
{
    private readonly TimeProvider _clock;

    public HostSandbox(TimeProvider clock, StoreProvider provider = StoreProvider.Sqlite)
    {
        _clock = clock;
        Provider = provider;
        Config = Path.Combine(RepositoryRoot, "config");
        if (provider == StoreProvider.Postgresql)
        {
            // The repository's config with the store and site changed: settings given in the file, not in variables
            // of the test process, so tests running side by side never see each other's store.
            SiteCode = PostgresTestServer.NewSiteCode();
            Config = Root + "-config";
            CopyFolder(Path.Combine(RepositoryRoot, "config"), Config);
            UseStoreIn(Config);
        }
    }

    /// <summary>
    /// Points the settings of a config folder (a copy of the repository's) at this sandbox's store: for PostgreSQL
    /// its site on the tests' server; the SQLite store needs nothing (it is the data folder's file).
    /// </summary>
    public void UseStoreIn(string config)
    {
        if (Provider != StoreProvider.Postgresql)
        {
            return;
        }

        var file = Path.Combine(config, "appsettings.json");
        var settings = JsonNode.Parse(File.ReadAllText(file))!;
        settings["Site"]!["Code"] = SiteCode;
        settings["Storage"]!["Provider"] = "postgresql";
        settings["Storage"]!["ConnectionString"] = PostgresTestServer.ConnectionString;
        File.WriteAllText(file, settings.ToJsonString());
    }

    public string Root { get; } = Path.Combine(Path.GetTempPath(), "batchreconcile-tests", Guid.NewGuid().ToString("N"));

    public StoreProvider Provider { get; }

    /// <summary>The config folder the host reads: the repository's, or the PostgreSQL copy (beside the data folder, which the demo wants empty).</summary>
    public string Config { get; }

    /// <summary>The site code of a PostgreSQL sandbox (its schema is <c>site_</c> and this code); the repository's site otherwise.</summary>
    public string SiteCode { get; } = "KB3";

    public static string RepositoryRoot { get; } = FindRepositoryRoot();

    /// <summary>Builds and validates the host on this data folder (not started).</summary>
    public IHost Start(bool service)
    {
        var context = new AppContextOptions(Config, Root);
        var host = AppHost.Build(context, service, quietConsole: true, time: _clock);
        AppHost.Validate(host.Services);
        return host;
    }

    /// <summary>The command line in process on this sandbox's config and data folder.</summary>
    public (int Exit, string Out, string Err) Run(params string[] args)
    {
        using var stdout = new StringWriter();
        using var stderr = new StringWriter();
        var exit = CommandLine.Run([.. args, "--config", Config, "--data", Root], stdout, stderr);
        return (exit, stdout.ToString(), stderr.ToString());
    }

    /// <summary>The sandbox's store opened directly, as the program opens it (the caller disposes it).</summary>
    public BatchStore OpenStore() => Provider == StoreProvider.Sqlite
        ? BatchStore.Open(Path.Combine(Root, "batchreconcile.db"), new StoreSettings())
        : BatchStore.OpenPostgres(PostgresTestServer.ConnectionString, SiteCode, new StoreSettings { Provider = StoreProvider.Postgresql });

    /// <summary>One value from the store, for what the commands do not show; the SQL is the test's own.</summary>
    public long Scalar(string sql)
    {
        using var connection = OpenRaw();
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        return Convert.ToInt64(command.ExecuteScalar(), CultureInfo.InvariantCulture);
    }

    /// <summary>
    /// Changes the store behind the program's back, as someone with the database's own tools could: for SQLite with
    /// the sqlite3 shell, for PostgreSQL on a connection of its own with triggers off (<c>session_replication_role =
    /// replica</c>; the test cluster's role is a superuser). SQLite's <c>DROP TRIGGER</c> statements and pragmas are
    /// left out on PostgreSQL.
    /// </summary>
    public void Tamper(string sql)
    {
        if (Provider == StoreProvider.Sqlite)
        {
            Sqlite3Shell.Run(Path.Combine(Root, "batchreconcile.db"), "PRAGMA busy_timeout = 5000; " + sql);
            return;
        }

        var postgres = System.Text.RegularExpressions.Regex.Replace(sql, @"(DROP TRIGGER(\s+IF EXISTS)?\s+\w+|PRAGMA[^;]*);", string.Empty);
        using var connection = OpenRaw();
        using var command = connection.CreateCommand();
        command.CommandText = "SET session_replication_role = replica; " + postgres;
        command.ExecuteNonQuery();
    }

    private System.Data.Common.DbConnection OpenRaw()
    {
        System.Data.Common.DbConnection connection = Provider == StoreProvider.Sqlite
            ? new SqliteConnection($"Data Source={Path.Combine(Root, "batchreconcile.db")};Mode=ReadWrite;Pooling=False")
            : new NpgsqlConnection(new NpgsqlConnectionStringBuilder(PostgresTestServer.ConnectionString) { SearchPath = "site_" + SiteCode.ToLowerInvariant(), Pooling = false }.ConnectionString);
        connection.Open();
        return connection;
    }

    /// <summary>Copies a folder with everything in it (a config folder a test changes).</summary>
    public static void CopyFolder(string from, string to)
    {
        Directory.CreateDirectory(to);
        foreach (var file in Directory.EnumerateFiles(from))
        {
            File.Copy(file, Path.Combine(to, Path.GetFileName(file)));
        }

        foreach (var folder in Directory.EnumerateDirectories(from))
        {
            CopyFolder(folder, Path.Combine(to, Path.GetFileName(folder)));
        }
    }

    private static string FindRepositoryRoot()
    {
        for (var dir = new DirectoryInfo(AppContext.BaseDirectory); dir is not null; dir = dir.Parent)
        {
            if (File.Exists(Path.Combine(dir.FullName, "BatchReconcile.sln")))
            {
                return dir.FullName;
            }
        }

        throw new InvalidOperationException("BatchReconcile.sln not found");
    }

    public void Dispose()
    {
        SqliteConnection.ClearAllPools();
        if (Provider == StoreProvider.Postgresql)
        {
            NpgsqlConnection.ClearAllPools();
            PostgresTestServer.DropSite(SiteCode);
        }

        try
        {
            Directory.Delete(Root, recursive: true);
            if (Provider == StoreProvider.Postgresql)
            {
                Directory.Delete(Config, recursive: true);
            }
        }
        catch (IOException)
        {
            // A file still held by a disposing host; the temp folder is cleaned up later.
        }
    }
}
