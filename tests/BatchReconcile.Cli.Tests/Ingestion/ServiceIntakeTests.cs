using System.Text.Json;
using BatchReconcile.Cli.Tests.Support;

namespace BatchReconcile.Cli.Tests.Ingestion;

/// <summary>
/// <c>run</c> as a real process on a temporary config and data folder, fed the way exporters write:
/// slowly in place, via <c>.part</c> and a rename, many files at once, a resend and a re-export; on either store.
/// </summary>
[Collection(ServiceCollection.Name)]
public abstract class ServiceIntakeTests(bool postgres)
{
    private const string Benzamide = "2026-11-23T1705_KB3-NB-0158.csv";

    [Fact]
    public async Task A_file_written_slowly_in_place_is_stored_once_and_complete()
    {
        // Pauses between chunks are a sixth of the settle interval; the whole write takes twice as long as it.
        const double settle = 1.5;
        using var sandbox = new ServiceSandbox(settleSeconds: settle, postgres: postgres);
        var export = ExportText.FromSample(Benzamide).WithBatchId("E2E-SLOW-1");
        var expected = await CheckStepsAsync(sandbox, export);
        using var service = await sandbox.StartAsync();

        var path = Path.Combine(sandbox.Data.Inbox, "slow-export.csv");
        var bytes = export.Bytes;
        const int chunks = 12;
        for (var i = 0; i < chunks; i++)
        {
            var from = bytes.Length * i / chunks;
            var to = bytes.Length * (i + 1) / chunks;
            // Open, append, close: a plain writer that takes no lock, so only the settle interval protects it.
            using (var stream = new FileStream(path, FileMode.Append, FileAccess.Write, FileShare.ReadWrite | FileShare.Delete))
            {
                stream.Write(bytes, from, to - from);
            }

            await Task.Delay(TimeSpan.FromSeconds(settle / 6));
        }

        await sandbox.WaitUntilTakenAsync(1, service);

        Assert.Equal([("slow-export.csv", "stored")], sandbox.IngestLog());
        Assert.Equal(["slow-export.csv"], sandbox.Data.ArchivedFiles());
        Assert.Empty(sandbox.Data.QuarantinedFiles());
        var shown = await ShowRequiredAsync(sandbox, "E2E-SLOW-1");
        Assert.Equal(1, shown.GetProperty("revision").GetInt32());
        Assert.Equal(1, shown.GetProperty("revisions").GetInt32());
        Assert.Equal(expected, JsonCanonical.Text(shown.GetProperty("steps")));
        Assert.Equal(export.DataRowCount, sandbox.Scalar("SELECT coalesce(sum(line_count), 0) FROM raw_rows"));
    }

    [Fact]
    public async Task A_file_written_as_part_and_renamed_is_stored_and_the_part_is_never_read()
    {
        const double settle = 0.3;
        using var sandbox = new ServiceSandbox(settleSeconds: settle, postgres: postgres);
        var export = ExportText.FromSample(Benzamide).WithBatchId("E2E-PART-1");
        using var service = await sandbox.StartAsync();

        // Half the file, a pause of several settle intervals (a reader of .part files would take it
        // now, cut off), then the rest.
        var part = Path.Combine(sandbox.Data.Inbox, "renamed-export.csv.part");
        var bytes = export.Bytes;
        File.WriteAllBytes(part, bytes[..(bytes.Length / 2)]);
        await Task.Delay(TimeSpan.FromSeconds(settle * 4));
        using (var stream = new FileStream(part, FileMode.Append, FileAccess.Write))
        {
            stream.Write(bytes, bytes.Length / 2, bytes.Length - (bytes.Length / 2));
        }

        // A later, complete file: once it has been taken, the older, settled .part has been passed over.
        sandbox.Drop("sentinel.csv", ExportText.FromSample(Benzamide).WithBatchId("E2E-PART-SENTINEL"));
        await sandbox.WaitUntilTakenAsync(1, service);
        Assert.Equal([("sentinel.csv", "stored")], sandbox.IngestLog());
        Assert.Equal(bytes, File.ReadAllBytes(part));

        File.Move(part, Path.Combine(sandbox.Data.Inbox, "renamed-export.csv"));
        await sandbox.WaitUntilTakenAsync(2, service);

        Assert.Equal([("sentinel.csv", "stored"), ("renamed-export.csv", "stored")], sandbox.IngestLog());
        Assert.Equal(["renamed-export.csv", "sentinel.csv"], sandbox.Data.ArchivedFiles());
        Assert.Empty(sandbox.Data.QuarantinedFiles());
        Assert.Empty(sandbox.Data.InboxFiles());
        var shown = await ShowRequiredAsync(sandbox, "E2E-PART-1");
        Assert.Equal(1, shown.GetProperty("revision").GetInt32());
        Assert.Equal("renamed-export.csv", shown.GetProperty("sourceFile").GetString());
    }

    [Fact]
    public async Task Forty_files_dropped_together_are_all_stored_each_exactly_once()
    {
        const int count = 40;
        using var sandbox = new ServiceSandbox(postgres: postgres);
        var sample = ExportText.FromSample(Benzamide);
        var names = Enumerable.Range(1, count).Select(i => $"many-{i:D3}.csv").ToList();
        foreach (var (name, i) in names.Select((n, i) => (n, i + 1)))
        {
            sample.WithBatchId($"E2E-MANY-{i:D3}").WriteTo(Path.Combine(sandbox.Stage, name));
        }

        using var service = await sandbox.StartAsync();
        foreach (var name in names)
        {
            File.Move(Path.Combine(sandbox.Stage, name), Path.Combine(sandbox.Data.Inbox, name));
        }

        await sandbox.WaitUntilTakenAsync(count, service);

        var log = sandbox.IngestLog();
        Assert.Equal(names, log.Select(l => l.File).Order(StringComparer.Ordinal));
        Assert.All(log, l => Assert.Equal("stored", l.Outcome));
        Assert.Equal(names, sandbox.Data.ArchivedFiles());
        Assert.Empty(sandbox.Data.QuarantinedFiles());
        Assert.Equal(count, sandbox.Scalar("SELECT COUNT(*) FROM batch"));
        Assert.Equal(count, sandbox.Scalar("SELECT COUNT(*) FROM batch_revision"));
        Assert.Equal(1, sandbox.Scalar("SELECT MAX(revision) FROM batch_revision"));
        Assert.Equal(count * sample.DataRowCount, sandbox.Scalar("SELECT coalesce(sum(line_count), 0) FROM raw_rows"));
        foreach (var id in new[] { "E2E-MANY-001", $"E2E-MANY-{count:D3}" })
        {
            Assert.Equal(1, (await ShowRequiredAsync(sandbox, id)).GetProperty("revision").GetInt32());
        }
    }

    [Fact]
    public async Task A_byte_identical_resend_is_archived_as_a_duplicate_and_not_stored_again()
    {
        using var sandbox = new ServiceSandbox(postgres: postgres);
        var export = ExportText.FromSample(Benzamide).WithBatchId("E2E-DUP-1");
        using var service = await sandbox.StartAsync();

        sandbox.Drop("dup-export.csv", export);
        await sandbox.WaitUntilTakenAsync(1, service);
        sandbox.Drop("dup-export-resend.csv", export);
        await sandbox.WaitUntilTakenAsync(2, service);

        Assert.Equal([("dup-export.csv", "stored"), ("dup-export-resend.csv", "duplicate")], sandbox.IngestLog());
        Assert.Equal(["dup-export-resend.csv", "dup-export.csv"], sandbox.Data.ArchivedFiles());
        var shown = await ShowRequiredAsync(sandbox, "E2E-DUP-1");
        Assert.Equal(1, shown.GetProperty("revision").GetInt32());
        Assert.Equal(1, shown.GetProperty("revisions").GetInt32());
        Assert.Equal("dup-export.csv", shown.GetProperty("sourceFile").GetString());
        Assert.Equal(1, sandbox.Scalar("SELECT COUNT(*) FROM batch_revision"));
        Assert.Equal(export.DataRowCount, sandbox.Scalar("SELECT coalesce(sum(line_count), 0) FROM raw_rows"));
    }

    [Fact]
    public async Task A_re_export_with_one_quantity_changed_becomes_revision_2_and_supersedes_revision_1()
    {
        using var sandbox = new ServiceSandbox(postgres: postgres);
        var first = ExportText.FromSample(Benzamide).WithBatchId("E2E-REV-1");
        // Line 18: product drum 1, 85.8 kg of N-benzylbenzamide, re-keyed as 95.8 kg.
        Assert.Contains(",product,NBB,,85.8,kg,99.6,", first.Line(18), StringComparison.Ordinal);
        var second = first.WithField(18, "quantity", "95.8");
        using var service = await sandbox.StartAsync();

        sandbox.Drop("rev-export.csv", first);
        await sandbox.WaitUntilTakenAsync(1, service);
        sandbox.Drop("rev-export-corrected.csv", second);
        await sandbox.WaitUntilTakenAsync(2, service);

        Assert.Equal([("rev-export.csv", "stored"), ("rev-export-corrected.csv", "revision")], sandbox.IngestLog());
        var latest = await ShowRequiredAsync(sandbox, "E2E-REV-1");
        var earlier = await ShowRequiredAsync(sandbox, "E2E-REV-1", 1);
        Assert.Equal(2, latest.GetProperty("revision").GetInt32());
        Assert.Equal(2, latest.GetProperty("revisions").GetInt32());
        Assert.True(latest.GetProperty("current").GetBoolean());
        Assert.Equal("rev-export-corrected.csv", latest.GetProperty("sourceFile").GetString());
        Assert.Equal(1, earlier.GetProperty("revision").GetInt32());
        Assert.False(earlier.GetProperty("current").GetBoolean());
        Assert.Equal("rev-export.csv", earlier.GetProperty("sourceFile").GetString());
        // 10.0 kg more product at the drum's assay of 99.6 % (line 18): 9.96 kg more actual product.
        var more = latest.GetProperty("steps")[0].GetProperty("actualKg").GetDouble() - earlier.GetProperty("steps")[0].GetProperty("actualKg").GetDouble();
        Assert.Equal(9.96, more, 0.002);
        Assert.Equal(1, sandbox.Scalar("SELECT COUNT(*) FROM batch_revision WHERE superseded_by IS NOT NULL"));
    }

    /// <summary>The steps as <c>check --json</c> reconciles the complete file: what a correct ingest must store.</summary>
    private static async Task<string> CheckStepsAsync(ServiceSandbox sandbox, ExportText export)
    {
        var path = Path.Combine(sandbox.Stage, "complete-for-check.csv");
        export.WriteTo(path);
        var result = await ProgramRunner.RunAsync("check", path, "--json", "--config", sandbox.Config, "--data", Path.Combine(sandbox.Stage, "check-data"));
        Assert.True(result.ExitCode == 0, $"check of the complete file: exit {result.ExitCode}; {result.Stderr}");
        File.Delete(path);
        using var doc = JsonDocument.Parse(result.Stdout);
        // Canonical form: neither indentation nor the order of keys is part of the comparison.
        return JsonCanonical.Text(Assert.Single(doc.RootElement.GetProperty("batches").EnumerateArray()).GetProperty("steps"));
    }

    private static async Task<JsonElement> ShowRequiredAsync(ServiceSandbox sandbox, string batch, int? revision = null) =>
        await sandbox.ShowAsync(batch, revision) ?? throw new Xunit.Sdk.XunitException($"batch {batch} is not stored");
}

/// <summary>The tests above on the embedded store.</summary>
public sealed class ServiceIntakeTestsOnSqlite() : ServiceIntakeTests(postgres: false);

/// <summary>The tests above on PostgreSQL (a site of its own on the tests' server).</summary>
public sealed class ServiceIntakeTestsOnPostgresql() : ServiceIntakeTests(postgres: true);
