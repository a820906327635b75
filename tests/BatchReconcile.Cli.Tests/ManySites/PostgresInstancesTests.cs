using System.Diagnostics;
using System.Globalization;
using BatchReconcile.Cli.Tests.Ingestion;
using BatchReconcile.Cli.Tests.Support;
using BatchReconcile.Storage.Tests.Support;
using Npgsql;
using Xunit.Abstractions;

namespace BatchReconcile.Cli.Tests.ManySites;

/// <summary>
/// Several real <c>run</c> processes on one PostgreSQL store: two on one site and inbox, one per site side by
/// side, and one whose database server is stopped and started again in the middle of a backlog.
/// </summary>
[Collection(ServiceCollection.Name)]
public sealed class PostgresInstancesTests(ITestOutputHelper output)
{
    private const string Benzamide = "2026-11-23T1705_KB3-NB-0158.csv";

    [Fact]
    public async Task Two_instances_on_one_site_and_inbox_store_a_backlog_of_500_files_each_exactly_once()
    {
        const int files = 500;
        using var sandbox = new ServiceSandbox(settleSeconds: 0.3, rescanSeconds: 0.5, groupCommitMaxFiles: 32);
        var site = sandbox.UsePostgres(PostgresTestServer.ConnectionString);
        try
        {
            using var first = await sandbox.StartAsync();
            using var second = await sandbox.StartAsync();
            var export = ExportText.FromSample(Benzamide);
            for (var i = 0; i < files; i++)
            {
                sandbox.Drop(Name(i), export.WithBatchId(Batch(i)));
            }

            await sandbox.WaitUntilTakenAsync(files, first);
            Assert.False(second.HasExited, second.Stderr);

            Assert.Equal(files, sandbox.Scalar("SELECT count(*) FROM ingest_log"));
            Assert.Equal(files, sandbox.Scalar("SELECT count(DISTINCT sha256) FROM ingest_log WHERE outcome = 'stored'"));
            Assert.Equal(files, sandbox.Scalar("SELECT count(*) FROM batch"));
            Assert.Equal(files, sandbox.Scalar("SELECT count(*) FROM batch_revision"));
            Assert.Equal(files, sandbox.Data.ArchivedFiles().Count);
            Assert.Empty(sandbox.Data.QuarantinedFiles());

            // Each batch was stored by one of the two, as their own logs say.
            var byFirst = StoredLines(first.Stderr);
            var bySecond = StoredLines(second.Stderr);
            output.WriteLine($"first instance stored {byFirst.Count} files, second {bySecond.Count}; left to the other: {Count(first.Stderr, "left to that instance")} + {Count(second.Stderr, "left to that instance")}");
            Assert.Equal(files, byFirst.Count + bySecond.Count);
            Assert.Empty(byFirst.Intersect(bySecond));

            var verify = await ProgramRunner.RunWithAsync(sandbox.Environment, "audit", "verify", "--config", sandbox.Config, "--data", sandbox.Data.Path);
            Assert.True(verify.ExitCode == 0, verify.Stdout + verify.Stderr);
            Assert.StartsWith("audit trail intact: ", verify.Stdout, StringComparison.Ordinal);
            Assert.Equal(files, sandbox.Scalar("SELECT count(*) FROM audit_event WHERE kind LIKE 'ingest.%'"));
            Assert.Equal(files, sandbox.Scalar("SELECT count(*) FROM audit_event WHERE kind = 'ingest.stored'"));
            Assert.Equal(0, await first.TerminateAsync(TimeSpan.FromSeconds(60)));
            Assert.Equal(0, await second.TerminateAsync(TimeSpan.FromSeconds(60)));
        }
        finally
        {
            PostgresTestServer.DropSite(site);
        }
    }

    [Fact]
    public async Task One_instance_per_site_on_its_own_inbox_keeps_each_sites_batches_files_and_trail_apart()
    {
        using var north = new ServiceSandbox(rescanSeconds: 0.5);
        using var south = new ServiceSandbox(rescanSeconds: 0.5);
        var northSite = north.UsePostgres(PostgresTestServer.ConnectionString);
        var southSite = south.UsePostgres(PostgresTestServer.ConnectionString);
        try
        {
            using var northService = await north.StartAsync();
            using var southService = await south.StartAsync();
            var export = ExportText.FromSample(Benzamide);
            for (var i = 0; i < 20; i++)
            {
                north.Drop(Name(i), export.WithBatchId("N-" + Batch(i)));
                south.Drop(Name(i), export.WithBatchId("S-" + Batch(i)));
            }

            // The very same bytes at both sites: each site stores its own copy (idempotency is per site).
            north.Drop("shared.csv", export.WithBatchId("SHARED-1"));
            south.Drop("shared.csv", export.WithBatchId("SHARED-1"));
            await north.WaitUntilTakenAsync(21, northService);
            await south.WaitUntilTakenAsync(21, southService);

            foreach (var (sandbox, prefix) in new[] { (north, "N-"), (south, "S-") })
            {
                var list = await ProgramRunner.RunWithAsync(sandbox.Environment, "batches", "list", "--json", "--config", sandbox.Config, "--data", sandbox.Data.Path);
                Assert.True(list.ExitCode == 0, list.Stderr);
                using var json = System.Text.Json.JsonDocument.Parse(list.Stdout);
                var ids = json.RootElement.EnumerateArray().Select(b => b.GetProperty("batch").GetString()!).ToList();
                Assert.Equal(21, ids.Count);
                Assert.All(ids, id => Assert.True(id.StartsWith(prefix, StringComparison.Ordinal) || id == "SHARED-1", id));
                Assert.Equal([("shared.csv", "stored")], sandbox.IngestLogOf("shared.csv"));
                var verify = await ProgramRunner.RunWithAsync(sandbox.Environment, "audit", "verify", "--config", sandbox.Config, "--data", sandbox.Data.Path);
                Assert.True(verify.ExitCode == 0, verify.Stdout + verify.Stderr);
                Assert.StartsWith("audit trail intact: ", verify.Stdout, StringComparison.Ordinal);
            }

            foreach (var sandbox in new[] { north, south })
            {
                Assert.Equal(21, sandbox.Scalar("SELECT count(*) FROM ingest_log"));
                Assert.Equal(21, sandbox.Scalar("SELECT count(*) FROM audit_event WHERE kind = 'ingest.stored'"));
            }
        }
        finally
        {
            PostgresTestServer.DropSite(northSite);
            PostgresTestServer.DropSite(southSite);
        }
    }

    [Fact]
    public async Task The_server_stopped_mid_backlog_leaves_the_files_in_the_inbox_and_intake_resumes_when_it_is_back()
    {
        const int files = 300;
        using var cluster = await OwnCluster.StartAsync();
        using var sandbox = new ServiceSandbox(settleSeconds: 0.3, rescanSeconds: 0.5, groupCommitMaxFiles: 16);
        sandbox.UsePostgres(cluster.ConnectionString);
        using var service = await sandbox.StartAsync();
        var export = ExportText.FromSample(Benzamide);
        for (var i = 0; i < files; i++)
        {
            sandbox.Drop(Name(i), export.WithBatchId(Batch(i)));
        }

        await Poll.UntilAsync(() => sandbox.Data.ArchivedFiles().Count >= 30, ServiceSandbox.Patience, () => service.Stderr);
        await cluster.StopServerAsync();
        var archivedWhileDown = sandbox.Data.ArchivedFiles().Count;
        await Poll.UntilAsync(() => service.Stderr.Contains("The database refused a group", StringComparison.Ordinal), ServiceSandbox.Patience, () => service.Stderr);
        await Task.Delay(TimeSpan.FromSeconds(3));

        Assert.False(service.HasExited, service.Stderr);
        Assert.Equal(archivedWhileDown, sandbox.Data.ArchivedFiles().Count);
        Assert.Equal(files - archivedWhileDown, sandbox.Data.InboxCandidates().Count);
        Assert.Empty(sandbox.Data.QuarantinedFiles());
        Assert.DoesNotContain("   at ", service.Stderr, StringComparison.Ordinal);
        output.WriteLine($"{archivedWhileDown} of {files} files stored before the server stopped");

        await cluster.StartServerAsync();
        await sandbox.WaitUntilTakenAsync(files, service);

        Assert.Equal(files, sandbox.Scalar("SELECT count(*) FROM ingest_log WHERE outcome = 'stored'"));
        Assert.Equal(files, sandbox.Scalar("SELECT count(*) FROM ingest_log"));
        Assert.Equal(files, sandbox.Scalar("SELECT count(*) FROM batch_revision"));
        Assert.Empty(sandbox.Data.QuarantinedFiles());
        Assert.Contains("intake resumed", service.Stderr, StringComparison.Ordinal);
        var verify = await ProgramRunner.RunWithAsync(sandbox.Environment, "audit", "verify", "--config", sandbox.Config, "--data", sandbox.Data.Path);
        Assert.True(verify.ExitCode == 0, verify.Stdout + verify.Stderr);
        Assert.Equal(0, await service.TerminateAsync(TimeSpan.FromSeconds(60)));
    }

    [Fact]
    public async Task A_wrong_password_or_an_unreachable_server_at_start_exits_2_with_the_reason_and_never_the_password()
    {
        using var sandbox = new ServiceSandbox();
        var builder = new NpgsqlConnectionStringBuilder(PostgresTestServer.ConnectionString) { Password = "not-the-password-4711" };
        sandbox.UsePostgres(builder.ConnectionString);
        var wrong = await ProgramRunner.RunWithAsync(sandbox.Environment, "run", "--config", sandbox.Config, "--data", sandbox.Data.Path);

        builder.Port = FreePort();
        sandbox.Environment["Storage__ConnectionString"] = builder.ConnectionString;
        var unreachable = await ProgramRunner.RunWithAsync(sandbox.Environment, "batches", "list", "--config", sandbox.Config, "--data", sandbox.Data.Path);

        Assert.Equal(2, wrong.ExitCode);
        Assert.Contains("refused the login", wrong.Stderr, StringComparison.Ordinal);
        Assert.Equal(2, unreachable.ExitCode);
        Assert.Contains("cannot be reached", unreachable.Stderr, StringComparison.Ordinal);
        foreach (var result in new[] { wrong, unreachable })
        {
            Assert.DoesNotContain("not-the-password-4711", result.Stdout + result.Stderr, StringComparison.Ordinal);
            Assert.DoesNotContain("   at ", result.Stderr, StringComparison.Ordinal);
        }
    }

    private static string Name(int i) => "backlog-" + i.ToString("D4", CultureInfo.InvariantCulture) + ".csv";

    private static string Batch(int i) => "MS-" + i.ToString("D4", CultureInfo.InvariantCulture);

    private static HashSet<string> StoredLines(string stderr) =>
        stderr.Split('\n').Where(l => l.Contains(" batch MS-", StringComparison.Ordinal) && l.Contains(" new as revision 1", StringComparison.Ordinal))
            .Select(l => l[l.IndexOf(" batch MS-", StringComparison.Ordinal)..].Split(' ')[2]).ToHashSet(StringComparer.Ordinal);

    private static int Count(string text, string what) => text.Split('\n').Count(l => l.Contains(what, StringComparison.Ordinal));

    private static int FreePort()
    {
        using var listener = new System.Net.Sockets.TcpListener(System.Net.IPAddress.Loopback, 0);
        listener.Start();
        return ((System.Net.IPEndPoint)listener.LocalEndpoint).Port;
    }

    /// <summary>A cluster of this test alone (scripts/pg-cluster), whose server the test stops and starts.</summary>
    private sealed class OwnCluster : IDisposable
    {
        private readonly string _folder;

        private OwnCluster(string folder, string connectionString)
        {
            _folder = folder;
            ConnectionString = connectionString;
        }

        public string ConnectionString { get; }

        public static async Task<OwnCluster> StartAsync()
        {
            var folder = Path.Combine(Path.GetTempPath(), "brc-pg-" + Guid.NewGuid().ToString("N")[..12]);
            await RunAsync(Path.Combine(RepoPaths.Root, "scripts", "pg-cluster"), "start", folder);
            var line = File.ReadAllLines(Path.Combine(folder, "env")).Single();
            var admin = line[(line.IndexOf('=', StringComparison.Ordinal) + 1)..];
            return new OwnCluster(folder, new NpgsqlConnectionStringBuilder(admin) { Database = "postgres" }.ConnectionString);
        }

        public Task StopServerAsync() => PgCtlAsync("-m", "fast", "-w", "stop");

        public Task StartServerAsync() => PgCtlAsync("-l", Path.Combine(_folder, "log"), "-w", "start");

        public void Dispose()
        {
            NpgsqlConnection.ClearAllPools();
            RunAsync(Path.Combine(RepoPaths.Root, "scripts", "pg-cluster"), "stop", _folder).GetAwaiter().GetResult();
        }

        /// <summary>pg_ctl on the cluster's data folder, as the user who owns it (PostgreSQL never runs as root).</summary>
        private async Task PgCtlAsync(params string[] args)
        {
            var bin = (await RunAsync(Path.Combine(RepoPaths.Root, "scripts", "pg-cluster"), "bindir")).Trim();
            var data = Path.Combine(_folder, "data");
            var pgCtl = Path.Combine(bin, "pg_ctl");
            var command = Environment.UserName == "root"
                ? new[] { "runuser", "-u", (await RunAsync("stat", "-c", "%U", data)).Trim(), "--", pgCtl, "-D", data }
                : new[] { pgCtl, "-D", data };
            await RunAsync(command[0], [.. command.Skip(1), .. args]);
        }

        private static async Task<string> RunAsync(string file, params string[] args)
        {
            var start = new ProcessStartInfo(file) { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
            foreach (var arg in args)
            {
                start.ArgumentList.Add(arg);
            }

            using var process = Process.Start(start) ?? throw new InvalidOperationException($"{file} did not start");
            var stdout = process.StandardOutput.ReadToEndAsync();
            var stderr = process.StandardError.ReadToEndAsync();
            await process.WaitForExitAsync();
            if (process.ExitCode != 0)
            {
                throw new InvalidOperationException($"{file} {string.Join(' ', args)} exited {process.ExitCode}: {await stderr}");
            }

            return await stdout;
        }
    }
}
