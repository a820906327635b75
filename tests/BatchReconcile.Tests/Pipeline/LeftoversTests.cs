using System.Globalization;
using BatchReconcile.Hosting;
using BatchReconcile.Intake.Inbox;
using BatchReconcile.Pipeline;
using BatchReconcile.Storage;
using BatchReconcile.Storage.Ingest;
using BatchReconcile.Tests.Support;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Time.Testing;

namespace BatchReconcile.Tests.Pipeline;

/// <summary>Issue 10 item 10: what an interrupted run leaves, and an archived file brought back into the inbox.</summary>
public sealed class LeftoversTests : IDisposable
{
    private const string Sample = "2026-11-23T1705_KB3-NB-0158.csv";

    private readonly FakeTimeProvider _clock = new(DateTimeOffset.Parse("2026-11-28T07:00:00+01:00", CultureInfo.InvariantCulture));
    private readonly HostSandbox _sandbox;

    public LeftoversTests() => _sandbox = new HostSandbox(_clock);

    public void Dispose() => _sandbox.Dispose();

    [Fact]
    public void A_file_brought_back_into_the_inbox_after_archiving_is_a_duplicate_and_the_archive_keeps_one_copy()
    {
        using var host = _sandbox.Start(service: false);
        var pipeline = host.Services.GetRequiredService<IngestPipeline>();
        var folders = host.Services.GetRequiredService<DataFolders>();
        var first = Assert.Single(pipeline.Process([Arrive(folders)]));
        Assert.Equal(IngestOutcome.Stored, first.Outcome);

        // Linked (here: copied) back from the archive into the inbox under its own name.
        var again = Assert.Single(pipeline.Process([Arrive(folders, from: first.MovedTo)]));

        Assert.Equal(IngestOutcome.Duplicate, again.Outcome);
        Assert.Equal(first.MovedTo, again.MovedTo);
        Assert.Empty(Directory.EnumerateFileSystemEntries(folders.Inbox));
        Assert.Equal([Sample], Directory.EnumerateFiles(folders.Archive, "*", SearchOption.AllDirectories).Select(Path.GetFileName));
        var store = host.Services.GetRequiredService<BatchStore>();
        Assert.Equal(IngestOutcome.Stored, store.FindFile(first.Sha256)?.Outcome);
    }

    [Fact]
    public void Stale_temporaries_are_removed_when_the_pipeline_starts()
    {
        using var host = _sandbox.Start(service: false);
        var folders = host.Services.GetRequiredService<DataFolders>();
        Directory.CreateDirectory(folders.Quarantine);
        var stale = Path.Combine(folders.Quarantine, $".x.csv.report.txt.{Guid.NewGuid():N}.tmp");
        File.WriteAllText(stale, "half a report");
        File.SetLastWriteTimeUtc(stale, _clock.GetUtcNow().UtcDateTime.AddMinutes(-10));

        _ = host.Services.GetRequiredService<IngestPipeline>();

        Assert.False(File.Exists(stale));
    }

    private ReadyFile Arrive(DataFolders folders, string? from = null)
    {
        var path = Path.Combine(folders.Inbox, Sample);
        File.Copy(from ?? Path.Combine(HostSandbox.RepositoryRoot, "sample-data", "inbox", Sample), path);
        var length = new FileInfo(path).Length;
        return new ReadyFile(path, Sample, _clock.GetUtcNow(), length, _clock.GetUtcNow());
    }
}
