using System.Globalization;
using System.Text;
using BatchReconcile.Hosting;
using BatchReconcile.Intake.Inbox;
using BatchReconcile.Pipeline;
using BatchReconcile.Storage;
using BatchReconcile.Storage.Ingest;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Time.Testing;

using BatchReconcile.Tests.Support;

namespace BatchReconcile.Tests.Pipeline;

/// <summary>
/// A large export through the pipeline, which reads, reconciles and stores it batch by batch inside
/// the commit: every batch is stored, or, when its last row is bad, none is and the file is quarantined.
/// The export is generated from one valid demo file (sample-data/inbox, batch KB3-PZ-0227, 11 rows)
/// repeated under new batch ids.
/// </summary>
public sealed class LargeFileIngestTests : IDisposable
{
    private const int Batches = 20_000;
    private const int RowsPerBatch = 11;
    private const string SampleBatch = "KB3-PZ-0227";

    private readonly FakeTimeProvider _clock = new(DateTimeOffset.Parse("2026-11-28T07:00:00+01:00", CultureInfo.InvariantCulture));
    private readonly HostSandbox _sandbox;

    public LargeFileIngestTests() => _sandbox = new HostSandbox(_clock);

    [Fact]
    public void Every_batch_of_a_large_valid_export_is_stored()
    {
        using var host = Start();
        var file = WriteExport(host, "large.csv", badLastRow: false);

        var outcome = Assert.Single(host.Services.GetRequiredService<IngestPipeline>().Process([file]));

        Assert.Equal(IngestOutcome.Stored, outcome.Outcome);
        Assert.Empty(outcome.Errors);
        Assert.Equal(Enumerable.Range(0, Batches).Select(BatchId), outcome.Batches.Select(b => b.BatchId));
        Assert.All(outcome.Batches, b => Assert.Equal((BatchDisposition.New, 1), (b.Disposition, b.Revision)));

        var store = host.Services.GetRequiredService<BatchStore>();
        Assert.Equal(Batches, store.ListBatches().Count);
        Assert.Equal(RowsPerBatch, store.GetRawRows(BatchId(0)).Count);
        Assert.Equal(RowsPerBatch, store.GetRawRows(BatchId(Batches - 1)).Count);
        Assert.Equal(IngestOutcome.Stored, store.FindFile(outcome.Sha256)?.Outcome);
        Assert.True(File.Exists(outcome.MovedTo));
        Assert.False(File.Exists(file.FullPath));
        Assert.True(store.VerifyAudit().Intact);
    }

    [Fact]
    public void A_bad_last_row_of_a_large_export_stores_nothing_and_quarantines_the_file_with_the_error()
    {
        using var host = Start();
        var file = WriteExport(host, "large-bad-end.csv", badLastRow: true);
        var lastLine = 1 + (Batches * RowsPerBatch);

        var outcome = Assert.Single(host.Services.GetRequiredService<IngestPipeline>().Process([file]));

        Assert.Equal(IngestOutcome.Quarantined, outcome.Outcome);
        Assert.Empty(outcome.Batches);
        var error = Assert.Single(outcome.Errors);
        Assert.Equal((lastLine, "unit", "kgs"), (error.Line, error.Column, error.Value));

        var store = host.Services.GetRequiredService<BatchStore>();
        Assert.Empty(store.ListBatches());
        Assert.Null(store.GetLatestBatch(BatchId(0)));
        var known = store.FindFile(outcome.Sha256);
        Assert.Equal((IngestOutcome.Quarantined, 1), (known?.Outcome, known?.ErrorCount));

        Assert.True(File.Exists(outcome.MovedTo));
        Assert.NotNull(outcome.ReportPath);
        var report = File.ReadAllText(outcome.ReportPath);
        Assert.Contains(lastLine.ToString(CultureInfo.InvariantCulture), report, StringComparison.Ordinal);
        Assert.Contains("kgs", report, StringComparison.Ordinal);
        Assert.True(store.VerifyAudit().Intact);
    }

    private static string BatchId(int i) => "KB3-PZ-G" + i.ToString("D6", CultureInfo.InvariantCulture);

    private ReadyFile WriteExport(IHost host, string name, bool badLastRow)
    {
        var sample = File.ReadAllLines(Path.Combine(HostSandbox.RepositoryRoot, "sample-data", "inbox", "2026-11-23T1012_KB3-PZ-0227.csv"), Encoding.UTF8);
        var rows = sample.Skip(1).Where(l => l.Length > 0).ToArray();
        Assert.Equal(RowsPerBatch, rows.Length);

        var path = Path.Combine(host.Services.GetRequiredService<DataFolders>().Inbox, name);
        using (var writer = new StreamWriter(path, false, new UTF8Encoding(false)) { NewLine = "\n" })
        {
            writer.WriteLine(sample[0]);
            for (var i = 0; i < Batches; i++)
            {
                var id = BatchId(i);
                for (var r = 0; r < rows.Length; r++)
                {
                    var row = rows[r].Replace(SampleBatch, id, StringComparison.Ordinal);
                    if (badLastRow && i == Batches - 1 && r == rows.Length - 1)
                    {
                        // kg is a unit of the contract, kgs is not (docs/export-format.md).
                        row = row.Replace(",kg,", ",kgs,", StringComparison.Ordinal);
                    }

                    writer.WriteLine(row);
                }
            }
        }

        var info = new FileInfo(path);
        Assert.InRange(info.Length, 15_000_000, 30_000_000);
        return new ReadyFile(path, name, _clock.GetUtcNow(), info.Length, _clock.GetUtcNow());
    }

    private IHost Start() => _sandbox.Start(service: false);


    public void Dispose() => _sandbox.Dispose();
}
