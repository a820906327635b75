using System.Text;
using BatchReconcile.Intake.Inbox;

namespace BatchReconcile.Intake.Tests.Inbox;

/// <summary>
/// The waiting API on the real clock with real file-system events. Short settle intervals keep the
/// tests quick; deadlines are generous and nothing asserts on speed.
/// </summary>
public sealed class InboxWatcherLiveTests : IDisposable
{
    private static readonly TimeSpan Settle = TimeSpan.FromMilliseconds(150);

    private readonly TempFolder _temp = new();
    private readonly string _inbox;

    public InboxWatcherLiveTests()
    {
        _inbox = _temp.Sub("inbox");
    }

    public void Dispose() => _temp.Dispose();

    [Fact]
    public async Task A_file_created_after_start_is_found_by_the_watcher_event()
    {
        // The rescan is an hour away: only the event can report the file within the deadline.
        using var watcher = new InboxWatcher(new InboxOptions(_inbox, Settle, TimeSpan.FromHours(1)), TimeProvider.System);
        watcher.Start();
        var wait = watcher.NextReadyAsync(cancellationToken: Within.Token());

        File.WriteAllText(Path.Combine(_inbox, "new.csv"), "batch\n");

        Assert.Equal("new.csv", Assert.Single(await wait).Name);
    }

    [Fact]
    public async Task The_rescan_finds_a_file_whose_event_never_came()
    {
        using var watcher = new InboxWatcher(
            new InboxOptions(_inbox, Settle, TimeSpan.FromMilliseconds(200), useFileSystemEvents: false),
            TimeProvider.System);
        watcher.Start();
        var wait = watcher.NextReadyAsync(cancellationToken: Within.Token());

        File.WriteAllText(Path.Combine(_inbox, "missed.csv"), "batch\n");

        Assert.Equal("missed.csv", Assert.Single(await wait).Name);
    }

    [Fact]
    public async Task A_file_written_slowly_in_place_is_handed_out_complete()
    {
        var path = Path.Combine(_inbox, "slow.csv");
        using var watcher = new InboxWatcher(new InboxOptions(_inbox, Settle, TimeSpan.FromMilliseconds(300)), TimeProvider.System);
        watcher.Start();
        var wait = watcher.NextReadyAsync(cancellationToken: Within.Token());

        var expected = 0L;
        using (var writer = new FileStream(path, FileMode.CreateNew, FileAccess.Write, FileShare.Read))
        {
            for (var i = 0; i < 10; i++)
            {
                var line = Encoding.UTF8.GetBytes($"AP-{i},ANL-200,S1,charge,NB,,12.5,kg\n");
                writer.Write(line);
                writer.Flush();
                expected += line.Length;
                await Task.Delay(40);
                Assert.False(wait.IsCompleted, "handed out while still being written");
            }
        }

        var ready = Assert.Single(await wait);
        Assert.Equal(expected, ready.Size);
        Assert.Equal(expected, new FileInfo(path).Length);
    }

    [Fact]
    public async Task The_stream_yields_in_arrival_order_and_keeps_watching_until_cancelled()
    {
        var at = new DateTime(2026, 11, 24, 6, 0, 0, DateTimeKind.Utc);
        foreach (var (name, minutes) in new[] { ("c.csv", 0), ("a.csv", 1), ("b.csv", 2) })
        {
            var path = Path.Combine(_inbox, name);
            File.WriteAllText(path, name);
            File.SetLastWriteTimeUtc(path, at.AddMinutes(minutes));
        }

        using var watcher = new InboxWatcher(new InboxOptions(_inbox, Settle, TimeSpan.FromMilliseconds(250)), TimeProvider.System);
        using var stop = new CancellationTokenSource(Within.Deadline);
        var names = new List<string>();

        var ended = await Assert.ThrowsAnyAsync<OperationCanceledException>(async () =>
        {
            await foreach (var file in watcher.ReadFilesAsync(stop.Token))
            {
                names.Add(file.Name);
                File.Delete(file.FullPath);
                watcher.Complete(file);
                if (names.Count == 3)
                {
                    File.WriteAllText(Path.Combine(_inbox, "late.csv"), "late");
                }
                else if (names.Count == 4)
                {
                    await stop.CancelAsync();
                }
            }
        });

        Assert.Equal(["c.csv", "a.csv", "b.csv", "late.csv"], names);
        Assert.Equal(stop.Token, ended.CancellationToken);
    }

    [Fact]
    public async Task Only_one_consumer_may_wait_at_a_time()
    {
        using var watcher = new InboxWatcher(new InboxOptions(_inbox, Settle, TimeSpan.FromHours(1)), TimeProvider.System);
        using var stop = new CancellationTokenSource();
        var first = watcher.NextReadyAsync(cancellationToken: stop.Token);

        await Assert.ThrowsAsync<InvalidOperationException>(() => watcher.NextReadyAsync());

        await stop.CancelAsync();
        await Assert.ThrowsAnyAsync<OperationCanceledException>(() => first);
    }
}
