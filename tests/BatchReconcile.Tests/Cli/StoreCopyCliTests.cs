using System.Globalization;
using System.Text.Json;
using System.Text.Json.Nodes;
using BatchReconcile.Cli;
using BatchReconcile.Storage;
using BatchReconcile.Storage.Tests.Support;
using BatchReconcile.Tests.Support;
using Microsoft.Data.Sqlite;
using Npgsql;

namespace BatchReconcile.Tests.Cli;

/// <summary>
/// <c>store copy --to postgresql</c> in process: the demo plant's exports (sample-data/inbox) ingested into SQLite, then copied
/// into a site of its own on the tests' PostgreSQL server (<c>BATCHRECONCILE_TEST_POSTGRES</c>, as the storage tests use). The
/// connection string reaches the command through a variable of this test's own (<c>--connection-string-env</c>), so no other
/// test's settings change.
/// </summary>
public sealed class StoreCopyCliTests : IDisposable
{
    private readonly HostSandbox _sandbox = new(TimeProvider.System);
    private readonly string _site = PostgresTestServer.NewSiteCode();
    private readonly string _variable = "BATCHRECONCILE_COPY_TEST_" + Guid.NewGuid().ToString("N")[..12].ToUpperInvariant();
    private readonly string _connectionString;
    private readonly string _config;

    public StoreCopyCliTests()
    {
        _connectionString = PostgresTestServer.ConnectionString;
        Environment.SetEnvironmentVariable(_variable, _connectionString);

        // The repository's config with this test's own site code.
        _config = Path.Combine(_sandbox.Root, "config");
        HostSandbox.CopyFolder(Path.Combine(HostSandbox.RepositoryRoot, "config"), _config);
        var settings = Path.Combine(_config, "appsettings.json");
        var json = JsonNode.Parse(File.ReadAllText(settings))!;
        json["Site"]!["Code"] = _site;
        File.WriteAllText(settings, json.ToJsonString());

        var drop = Path.Combine(_sandbox.Root, "drop");
        Directory.CreateDirectory(drop);
        foreach (var file in Directory.EnumerateFiles(Path.Combine(HostSandbox.RepositoryRoot, "sample-data", "inbox"), "*.csv"))
        {
            File.Copy(file, Path.Combine(drop, Path.GetFileName(file)));
        }

        var ingest = Run("ingest", drop, "--json");
        Assert.True(ingest.Exit is 0 or 3, ingest.Err);
    }

    private string Data => Path.Combine(_sandbox.Root, "data");

    private string Database => Path.Combine(Data, "batchreconcile.db");

    public void Dispose()
    {
        Environment.SetEnvironmentVariable(_variable, null);
        SqliteConnection.ClearAllPools();
        NpgsqlConnection.ClearAllPools();
        PostgresTestServer.DropSite(_site);

        _sandbox.Dispose();
    }

    [Fact]
    public void Store_copy_moves_the_sqlite_store_into_the_sites_schema_verifies_it_and_refuses_a_second_copy()
    {
        var before = File.ReadAllBytes(Database);

        var copy = Run("store", "copy", "--to", "postgresql", "--connection-string-env", _variable, "--json");

        Assert.True(copy.Exit == 0, copy.Err);
        var result = JsonDocument.Parse(copy.Out).RootElement;
        Assert.Equal(Database, result.GetProperty("source").GetString());
        Assert.Contains($"schema site_{_site}", result.GetProperty("target").GetString(), StringComparison.Ordinal);
        var tables = result.GetProperty("tables").EnumerateArray().ToDictionary(t => t.GetProperty("table").GetString()!, t => t.GetProperty("rows").GetInt64());
        Assert.Equal(["ingest_log", "batch", "batch_revision", "raw_rows", "step_result", "flag", "audit_event", "digest", "day_change"], tables.Keys);
        foreach (var (table, rows) in tables)
        {
            Assert.Equal(SqliteCount(table), rows);
        }

        Assert.True(tables["batch_revision"] > tables["batch"], "the sample holds re-exports");
        Assert.Equal(tables.Values.Sum(), result.GetProperty("rows").GetInt64());
        Assert.True(result.GetProperty("triggersSkipped").GetBoolean());
        var verification = result.GetProperty("verification");
        Assert.True(verification.GetProperty("intact").GetBoolean(), verification.GetProperty("message").GetString());
        Assert.Equal(tables["audit_event"], verification.GetProperty("entries").GetInt64());

        // The same chain as the source's: its last hash is what audit verify of the SQLite store says.
        var sourceVerify = Run("audit", "verify");
        Assert.Equal(0, sourceVerify.Exit);
        Assert.Equal($"audit trail intact: {tables["audit_event"]} entries, last hash {verification.GetProperty("lastHash").GetString()}", sourceVerify.Out.Trim());
        Assert.Equal(before, File.ReadAllBytes(Database));

        // Read through the store on PostgreSQL, the copy answers as the source does.
        using (var sqlite = BatchStore.Open(Database, new StoreSettings()))
        using (var postgres = BatchStore.OpenPostgres(_connectionString, _site, new StoreSettings()))
        {
            Assert.Equal(JsonSerializer.Serialize(sqlite.ListFlags(includeSuperseded: true)), JsonSerializer.Serialize(postgres.ListFlags(includeSuperseded: true)));
            Assert.Equal(JsonSerializer.Serialize(sqlite.ListBatches()), JsonSerializer.Serialize(postgres.ListBatches()));
        }

        var again = Run("store", "copy", "--to", "postgresql", "--connection-string-env", _variable);

        Assert.Equal(ExitCodes.BadInput, again.Exit);
        Assert.Equal(string.Empty, again.Out);
        Assert.StartsWith($"batchreconcile: store copy refused: PostgreSQL ", again.Err, StringComparison.Ordinal);
        Assert.Contains($"schema site_{_site} (user ", again.Err, StringComparison.Ordinal);
        Assert.Contains($"already holds {tables["ingest_log"]} files, {tables["batch"]} batches and {tables["audit_event"]} audit entries", again.Err, StringComparison.Ordinal);
        var password = new NpgsqlConnectionStringBuilder(_connectionString).Password;
        if (!string.IsNullOrEmpty(password))
        {
            Assert.DoesNotContain(password, copy.Out + copy.Err + again.Out + again.Err, StringComparison.Ordinal);
        }
    }

    [Fact]
    public void Store_copy_says_what_is_missing_or_wrong_with_exit_2()
    {
        var to = Run("store", "copy", "--to", "sqlite", "--connection-string-env", _variable);
        Assert.Equal((ExitCodes.BadInput, "batchreconcile: --to 'sqlite': a store can be copied only to postgresql"), (to.Exit, to.Err.Trim()));

        var unset = Run("store", "copy", "--to", "postgresql", "--connection-string-env", _variable + "_UNSET");
        Assert.Equal(ExitCodes.BadInput, unset.Exit);
        Assert.Equal($"batchreconcile: --connection-string-env {_variable}_UNSET: that environment variable is not set or empty", unset.Err.Trim());

        var noData = CommandLine.Run(
            ["store", "copy", "--to", "postgresql", "--connection-string-env", _variable, "--config", _config, "--data", Path.Combine(_sandbox.Root, "nothing")],
            new StringWriter(CultureInfo.InvariantCulture), new StringWriter(CultureInfo.InvariantCulture));
        Assert.Equal(ExitCodes.BadInput, noData);
        Assert.False(File.Exists(Path.Combine(_sandbox.Root, "nothing", "batchreconcile.db")));
    }

    private (int Exit, string Out, string Err) Run(params string[] args)
    {
        using var stdout = new StringWriter(CultureInfo.InvariantCulture);
        using var stderr = new StringWriter(CultureInfo.InvariantCulture);
        var exit = CommandLine.Run([.. args, "--config", _config, "--data", Data], stdout, stderr);
        return (exit, stdout.ToString(), stderr.ToString());
    }

    private long SqliteCount(string table)
    {
        using var connection = new SqliteConnection($"Data Source={Database};Mode=ReadOnly;Pooling=False");
        connection.Open();
        using var command = connection.CreateCommand();
        command.CommandText = $"SELECT count(*) FROM {table}";
        return Convert.ToInt64(command.ExecuteScalar(), CultureInfo.InvariantCulture);
    }
}
