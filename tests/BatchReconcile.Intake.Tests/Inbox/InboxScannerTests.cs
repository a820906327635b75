using BatchReconcile.Intake.Inbox;
using Microsoft.Extensions.Time.Testing;

namespace BatchReconcile.Intake.Tests.Inbox;

public sealed class InboxScannerTests : IDisposable
{
    private readonly TempFolder _temp = new();

    public void Dispose() => _temp.Dispose();

    [Theory]
    [InlineData(0)]
    [InlineData(100)]
    public async Task One_look_returns_complete_files_by_last_write_and_names_the_busy_ones(int settleMs)
    {
        var folder = _temp.Sub("exports");
        var at = new DateTime(2026, 11, 20, 7, 0, 0, DateTimeKind.Utc);
        File.SetLastWriteTimeUtc(Write(folder, "later.csv"), at.AddDays(1));
        File.SetLastWriteTimeUtc(Write(folder, "earlier.csv"), at);
        Write(folder, "unfinished.csv.part");
        var busy = Write(folder, "busy.csv");

        InboxScan scan;
        using (new FileStream(busy, FileMode.Open, FileAccess.Write, FileShare.Read))
        {
            scan = await InboxScanner.ScanOnceAsync(folder, TimeSpan.FromMilliseconds(settleMs), TimeProvider.System, Within.Token());
        }

        Assert.Equal(["earlier.csv", "later.csv"], scan.Ready.Select(f => f.Name));
        Assert.Equal(["busy.csv"], scan.NotReady);
    }

    [Fact]
    public async Task Symbolic_links_and_folders_are_never_read_but_are_listed()
    {
        var folder = _temp.Sub("mixed");
        var target = Write(_temp.Sub("elsewhere"), "real.csv");
        File.SetLastWriteTimeUtc(Write(folder, "export.csv"), new DateTime(2026, 11, 20, 7, 0, 0, DateTimeKind.Utc));
        File.CreateSymbolicLink(Path.Combine(folder, "linked.csv"), target);
        Directory.CreateSymbolicLink(Path.Combine(folder, "linked-folder"), _temp.Sub("elsewhere"));
        Directory.CreateDirectory(Path.Combine(folder, "2026-11"));
        Directory.CreateDirectory(Path.Combine(folder, ".hidden")); // hidden names are never read and not listed

        var scan = await InboxScanner.ScanOnceAsync(folder, TimeSpan.Zero, TimeProvider.System, Within.Token());

        Assert.Equal(["export.csv"], scan.Ready.Select(f => f.Name));
        Assert.Empty(scan.NotReady);
        Assert.Equal(
            [new IgnoredEntry("2026-11", IgnoredKind.Folder), new IgnoredEntry("linked-folder", IgnoredKind.SymbolicLink), new IgnoredEntry("linked.csv", IgnoredKind.SymbolicLink)],
            scan.Ignored);
        Assert.True(File.Exists(target));
    }

    [Fact]
    public void A_link_or_folder_is_reported_once_while_it_stays()
    {
        var folder = _temp.Sub("watched");
        Directory.CreateDirectory(Path.Combine(folder, "sub"));
        using var watcher = new InboxWatcher(new InboxOptions(folder, TimeSpan.Zero, TimeSpan.FromTicks(1), useFileSystemEvents: false), TimeProvider.System);

        watcher.TakeReady();
        var first = watcher.TakeNewlyIgnored();
        watcher.TakeReady();
        var second = watcher.TakeNewlyIgnored();
        Directory.Delete(Path.Combine(folder, "sub"));
        watcher.TakeReady();
        Directory.CreateDirectory(Path.Combine(folder, "sub"));
        watcher.TakeReady();
        var third = watcher.TakeNewlyIgnored();

        Assert.Equal([new IgnoredEntry("sub", IgnoredKind.Folder)], first);
        Assert.Empty(second);
        Assert.Equal([new IgnoredEntry("sub", IgnoredKind.Folder)], third); // gone and back: a new sighting
    }

    [Fact]
    public async Task Files_written_long_ago_are_returned_without_waiting_for_the_settle_interval()
    {
        var folder = _temp.Sub("old");
        var time = new FakeTimeProvider(new DateTimeOffset(2026, 11, 24, 8, 0, 0, TimeSpan.Zero));
        File.SetLastWriteTimeUtc(Write(folder, "second.csv"), new DateTime(2026, 11, 23, 22, 0, 0, DateTimeKind.Utc));
        File.SetLastWriteTimeUtc(Write(folder, "first.csv"), new DateTime(2026, 11, 23, 21, 0, 0, DateTimeKind.Utc));

        // The fake clock never moves: a scan that waited on it would never finish.
        var scan = ScanOnce(folder, TimeSpan.FromSeconds(2), time);

        Assert.True(scan.IsCompleted);
        Assert.Equal(["first.csv", "second.csv"], (await scan).Ready.Select(f => f.Name));
        Assert.Empty((await scan).NotReady);
    }

    [Fact]
    public async Task A_file_written_within_the_settle_interval_is_waited_for_until_it_is_settle_old()
    {
        var folder = _temp.Sub("mixed");
        var time = new FakeTimeProvider(new DateTimeOffset(2026, 11, 24, 8, 0, 0, TimeSpan.Zero));
        File.SetLastWriteTimeUtc(Write(folder, "old.csv"), time.GetUtcNow().UtcDateTime.AddHours(-1));
        File.SetLastWriteTimeUtc(Write(folder, "fresh.csv"), time.GetUtcNow().UtcDateTime.AddSeconds(-1.5));

        var scan = ScanOnce(folder, TimeSpan.FromSeconds(2), time);
        time.Advance(TimeSpan.FromSeconds(0.4));
        Assert.False(scan.IsCompleted);
        time.Advance(TimeSpan.FromSeconds(0.1));

        Assert.Equal(["old.csv", "fresh.csv"], (await scan.WaitAsync(Within.Deadline)).Ready.Select(f => f.Name));
    }

    private static Task<InboxScan> ScanOnce(string folder, TimeSpan settle, TimeProvider time) =>
        InboxScanner.ScanOnceAsync(folder, settle, time, Within.Token());

    private static string Write(string folder, string name)
    {
        var path = Path.Combine(folder, name);
        File.WriteAllText(path, "batch,recipe\n");
        return path;
    }
}
