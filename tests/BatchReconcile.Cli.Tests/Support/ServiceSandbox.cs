using System.Text.Json;

namespace BatchReconcile.Cli.Tests.Support;

/// <summary>
/// A temporary config and data folder for one test of the service (<c>run</c>), with the moves an
/// exporter makes (drop a finished file, write one slowly) and the looks a test takes afterwards.
/// Deletes everything on dispose, after killing a service still running.
/// </summary>
public sealed class ServiceSandbox : IDisposable
{
    /// <summary>Generous for a slow, shared 2-core machine; a healthy run takes a fraction of it.</summary>
    public static readonly TimeSpan Patience = TimeSpan.FromSeconds(120);

    private readonly TempFolder _temp = new("brc-service");
    private readonly List<ServiceProcess> _services = [];

    public ServiceSandbox(double settleSeconds = 0.3, double rescanSeconds = 1.0, int groupCommitMaxFiles = 64)
    {
        Config = TestConfig.Write(_temp.Sub("config"), settleSeconds, rescanSeconds, groupCommitMaxFiles);
        Data = new DataRoot(_temp.Sub("data"));
        Stage = _temp.Sub("stage");
        Directory.CreateDirectory(Stage);
        Directory.CreateDirectory(Data.Inbox);
    }

    public string Config { get; }

    public DataRoot Data { get; }

    /// <summary>A folder beside the data (same file system) where files are prepared before they are moved into the inbox.</summary>
    public string Stage { get; }

    /// <summary>Variables every process of the sandbox gets (the store's provider and connection, the site code).</summary>
    public Dictionary<string, string> Environment { get; } = [];

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
        var result = await ProgramRunner.RunAsync(args);
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
        Data.Rows("SELECT file_name, outcome FROM ingest_log ORDER BY id").Select(r => (r[0], r[1])).ToList();

    /// <summary>The ingest log entries of one file name, read through <c>audit list</c>-free SQL on the store the sandbox's environment names.</summary>
    public IReadOnlyList<(string File, string Outcome)> IngestLogOf(string fileName)
    {
        if (!Environment.TryGetValue("Storage__Provider", out var provider) || provider != "postgresql")
        {
            return IngestLog().Where(e => e.File == fileName).ToList();
        }

        var builder = new Npgsql.NpgsqlConnectionStringBuilder(Environment["Storage__ConnectionString"]) { SearchPath = "site_" + Environment["Site__Code"].ToLowerInvariant(), Pooling = false };
        using var connection = new Npgsql.NpgsqlConnection(builder.ConnectionString);
        connection.Open();
        using var command = new Npgsql.NpgsqlCommand("SELECT file_name, outcome FROM ingest_log WHERE file_name = @name ORDER BY id", connection);
        command.Parameters.AddWithValue("name", fileName);
        using var reader = command.ExecuteReader();
        var rows = new List<(string, string)>();
        while (reader.Read())
        {
            rows.Add((reader.GetString(0), reader.GetString(1)));
        }

        return rows;
    }

    public void Dispose()
    {
        foreach (var service in _services)
        {
            service.Dispose();
        }

        _temp.Dispose();
    }
}
