using System.Globalization;
using System.Text.Json;
using BatchReconcile.Storage.Tests.Support;
using Npgsql;

namespace BatchReconcile.Cli.Tests.Support;

/// <summary>
/// A temporary config and data folder for one test of the service (<c>run</c>), with the moves an
/// exporter makes (drop a finished file, write one slowly) and the looks a test takes afterwards.
/// The store is the data folder's SQLite file, or a PostgreSQL site named in the processes' environment
/// (<see cref="UsePostgres"/>). Deletes everything on dispose, after killing a service still running.
/// </summary>
public sealed class ServiceSandbox : IDisposable
{
    /// <summary>Generous for a slow, shared 2-core machine; a healthy run takes a fraction of it.</summary>
    public static readonly TimeSpan Patience = TimeSpan.FromSeconds(120);

    private readonly TempFolder _temp = new("brc-service");
    private readonly List<ServiceProcess> _services = [];
    private readonly bool _dropSite;

    /// <param name="postgres">The store is a new site on the tests' PostgreSQL server (<see cref="PostgresTestServer"/>),
    /// dropped on dispose; otherwise the data folder's SQLite file.</param>
    public ServiceSandbox(double settleSeconds = 0.3, double rescanSeconds = 1.0, int groupCommitMaxFiles = 64, bool postgres = false)
    {
        Config = TestConfig.Write(_temp.Sub("config"), settleSeconds, rescanSeconds, groupCommitMaxFiles);
        Data = new DataRoot(_temp.Sub("data"));
        Stage = _temp.Sub("stage");
        Directory.CreateDirectory(Stage);
        Directory.CreateDirectory(Data.Inbox);
        if (postgres)
        {
            UsePostgres(PostgresTestServer.ConnectionString);
            _dropSite = true;
        }
    }

    public string Config { get; }

    public DataRoot Data { get; }

    /// <summary>A folder beside the data (same file system) where files are prepared before they are moved into the inbox.</summary>
    public string Stage { get; }

    /// <summary>Variables every process of the sandbox gets (the store's provider and connection, the site code).</summary>
    public Dictionary<string, string> Environment { get; } = [];

    /// <summary>The site code of a PostgreSQL store, or null for the SQLite file.</summary>
    public string? Site { get; private set; }

    private string? ConnectionString { get; set; }

    /// <summary>
    /// Every process of the sandbox stores into a new site on the PostgreSQL server of <paramref name="connectionString"/>
    /// (by the variables <c>Storage__Provider</c>, <c>Storage__ConnectionString</c>, <c>Site__Code</c>); returns the site's code.
    /// The caller drops the site, unless the sandbox made it itself.
    /// </summary>
    public string UsePostgres(string connectionString)
    {
        Site = PostgresTestServer.NewSiteCode();
        ConnectionString = connectionString;
        Environment["Storage__Provider"] = "postgresql";
        Environment["Storage__ConnectionString"] = connectionString;
        Environment["Site__Code"] = Site;
        return Site;
    }

    /// <summary>One value from the store (read-only SQL of the test's own).</summary>
    public long Scalar(string sql) => Site is null
        ? Data.Scalar(sql)
        : Convert.ToInt64(Rows(sql).Single().Single(), CultureInfo.InvariantCulture);

    /// <summary>Rows of a query on the store, each as its columns' text.</summary>
    public IReadOnlyList<string[]> Rows(string sql)
    {
        if (Site is null)
        {
            return Data.Rows(sql);
        }

        var builder = new NpgsqlConnectionStringBuilder(ConnectionString) { SearchPath = "site_" + Site.ToLowerInvariant(), Pooling = false };
        using var connection = new NpgsqlConnection(builder.ConnectionString);
        connection.Open();
        using var command = new NpgsqlCommand(sql, connection);
        using var reader = command.ExecuteReader();
        var rows = new List<string[]>();
        while (reader.Read())
        {
            var row = new string[reader.FieldCount];
            for (var i = 0; i < row.Length; i++)
            {
                row[i] = reader.IsDBNull(i) ? "" : Convert.ToString(reader.GetValue(i), CultureInfo.InvariantCulture) ?? "";
            }

            rows.Add(row);
        }

        return rows;
    }

    public async Task<ServiceProcess> StartAsync(bool waitUntilWatching = true)
    {
        var service = await ServiceProcess.StartAsync(Config, Data.Path, waitUntilWatching, Environment);
        _services.Add(service);
        return service;
    }

    /// <summary>Writes the file beside the inbox and renames it in: it appears there complete, at once.</summary>
    public void Drop(string name, ExportText export)
    {
        var staged = Path.Combine(Stage, name);
        export.WriteTo(staged);
        File.Move(staged, Path.Combine(Data.Inbox, name));
    }

    /// <summary>
    /// Waits until the inbox holds no readable file and at least <paramref name="count"/> files were taken
    /// (archived or quarantined; the test then checks which).
    /// </summary>
    public async Task WaitUntilTakenAsync(int count, ServiceProcess service)
    {
        await Poll.UntilAsync(
            () => service.HasExited || (Taken() >= count && Data.InboxCandidates().Count == 0),
            Patience,
            () => $"{Data.ArchivedFiles().Count} of {count} archived, inbox [{string.Join(", ", Data.InboxCandidates().Take(5))} ...], quarantine [{string.Join(", ", Data.QuarantinedFiles())}]; stderr:\n{service.Stderr}");
        if (service.HasExited)
        {
            throw new InvalidOperationException($"the service exited while files were waiting; stderr:\n{service.Stderr}");
        }
    }

    private int Taken() => Data.ArchivedFiles().Count + Data.QuarantinedFiles().Count(f => !f.EndsWith(".report.txt", StringComparison.Ordinal));

    /// <summary><c>batches show BATCH [--revision N] --json</c>; the root element, or null when the batch is not stored (exit 2).</summary>
    public async Task<JsonElement?> ShowAsync(string batch, int? revision = null)
    {
        string[] args = revision is { } r
            ? ["batches", "show", batch, "--revision", r.ToString(System.Globalization.CultureInfo.InvariantCulture), "--json", "--data", Data.Path]
            : ["batches", "show", batch, "--json", "--data", Data.Path];
        var result = await ProgramRunner.RunWithAsync(Environment, args);
        if (result.ExitCode == 2)
        {
            return null;
        }

        if (result.ExitCode != 0)
        {
            throw new InvalidOperationException($"batches show {batch} exited {result.ExitCode}: {result.Stderr}");
        }

        using var doc = JsonDocument.Parse(result.Stdout);
        return doc.RootElement.Clone();
    }

    /// <summary>The ingest log, oldest first: (file name, outcome).</summary>
    public IReadOnlyList<(string File, string Outcome)> IngestLog() =>
        Rows("SELECT file_name, outcome FROM ingest_log ORDER BY id").Select(r => (r[0], r[1])).ToList();

    /// <summary>The ingest log entries of one file name.</summary>
    public IReadOnlyList<(string File, string Outcome)> IngestLogOf(string fileName) =>
        IngestLog().Where(e => e.File == fileName).ToList();

    public void Dispose()
    {
        foreach (var service in _services)
        {
            service.Dispose();
        }

        if (_dropSite)
        {
            NpgsqlConnection.ClearAllPools();
            PostgresTestServer.DropSite(Site!);
        }

        _temp.Dispose();
    }
}
