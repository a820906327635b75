using BatchReconcile.Intake.Inbox;
using Microsoft.Extensions.Time.Testing;

namespace BatchReconcile.Intake.Tests.Inbox;

/// <summary>
/// Settle and order logic driven step by step with a fake clock (TakeReady never waits), on real
/// files in a real folder.
/// </summary>
public sealed class InboxWatcherTests : IDisposable
{
    private static readonly TimeSpan Settle = TimeSpan.FromSeconds(2);
    private static readonly TimeSpan Rescan = TimeSpan.FromMilliseconds(100);

    private readonly TempFolder _temp = new();
    private readonly FakeTimeProvider _time = new(new DateTimeOffset(2026, 11, 24, 8, 0, 0, TimeSpan.Zero));
    private readonly string _inbox;

    public InboxWatcherTests()
    {
        _inbox = _temp.Sub("inbox");
    }

    public void Dispose() => _temp.Dispose();

    [Fact]
    public void Ignores_part_tmp_dot_files_and_subfolders()
    {
        Write("good.csv", "x");
        Write("slow.csv.part", "x");
        Write("scratch.TMP", "x");
        Write(".hidden.csv", "x");
        Directory.CreateDirectory(Path.Combine(_inbox, "sub"));
        File.WriteAllText(Path.Combine(_inbox, "sub", "nested.csv"), "x");
        using var watcher = Watcher();

        Assert.Empty(watcher.TakeReady());
        _time.Advance(Settle);
        var ready = watcher.TakeReady();

        Assert.Equal(["good.csv"], ready.Select(f => f.Name));
        Assert.Empty(watcher.PendingNames());
    }

    [Fact]
    public void A_growing_file_is_ready_only_after_a_full_quiet_settle_interval()
    {
        var path = Write("slow.csv", "batch,recipe\n");
        using var watcher = Watcher();
        Assert.Empty(watcher.TakeReady());

        for (var chunk = 0; chunk < 5; chunk++)
        {
            _time.Advance(Settle * 0.6);
            File.AppendAllText(path, "AP-1,ANL-200\n");
            Assert.Empty(watcher.TakeReady());
        }

        _time.Advance(Settle * 0.6);
        Assert.Empty(watcher.TakeReady());
        _time.Advance(Settle * 0.4);
        var ready = Assert.Single(watcher.TakeReady());

        Assert.Equal(new FileInfo(path).Length, ready.Size);
    }

    [Fact]
    public void A_rewrite_of_the_same_size_restarts_the_settle_interval()
    {
        var path = Write("same.csv", "aaaa");
        using var watcher = Watcher();
        Assert.Empty(watcher.TakeReady());

        _time.Advance(Settle * 0.9);
        File.WriteAllText(path, "bbbb");
        File.SetLastWriteTimeUtc(path, File.GetLastWriteTimeUtc(path).AddSeconds(5));
        Assert.Empty(watcher.TakeReady());
        _time.Advance(Settle * 0.9);
        Assert.Empty(watcher.TakeReady());
        _time.Advance(Settle * 0.1);

        Assert.Single(watcher.TakeReady());
    }

    [Fact]
    public void A_file_held_open_by_a_writer_is_not_ready_until_it_is_closed()
    {
        var path = Write("held.csv", "batch\n");
        using var watcher = Watcher();
        var writer = new FileStream(path, FileMode.Open, FileAccess.Write, FileShare.Read);
        try
        {
            Assert.Empty(watcher.TakeReady());
            _time.Advance(Settle);
            Assert.Empty(watcher.TakeReady());
            Assert.Equal(["held.csv"], watcher.PendingNames());
        }
        finally
        {
            writer.Dispose();
        }

        _time.Advance(Settle);
        Assert.Single(watcher.TakeReady());
    }

    [Fact]
    public void Files_come_out_in_the_order_they_were_first_seen_not_by_name()
    {
        using var watcher = Watcher();
        Assert.Empty(watcher.TakeReady());
        var seenAt = new List<DateTimeOffset>();
        foreach (var name in new[] { "z.csv", "a.csv", "m.csv" })
        {
            Write(name, name);
            _time.Advance(Rescan);
            seenAt.Add(_time.GetUtcNow());
            Assert.Empty(watcher.TakeReady());
        }

        _time.Advance(Settle);
        var ready = watcher.TakeReady();

        Assert.Equal(["z.csv", "a.csv", "m.csv"], ready.Select(f => f.Name));
        Assert.Equal(seenAt, ready.Select(f => f.ArrivedAt));
    }

    [Fact]
    public void A_backlog_found_at_start_is_ordered_by_last_write_time_then_name()
    {
        var at = new DateTime(2026, 11, 23, 10, 0, 0, DateTimeKind.Utc);
        File.SetLastWriteTimeUtc(Write("b.csv", "b"), at);
        File.SetLastWriteTimeUtc(Write("a.csv", "a"), at.AddMinutes(5));
        File.SetLastWriteTimeUtc(Write("c.csv", "c"), at.AddHours(-1));
        File.SetLastWriteTimeUtc(Write("d.csv", "d"), at.AddMinutes(5));
        using var watcher = Watcher();

        // All were last written long before the clock's now, so the first look already takes them.
        var ready = watcher.TakeReady();

        Assert.Equal(["c.csv", "b.csv", "a.csv", "d.csv"], ready.Select(f => f.Name));
        Assert.All(ready, f => Assert.Equal(File.GetLastWriteTimeUtc(f.FullPath), f.ArrivedAt.UtcDateTime));
    }

    [Fact]
    public void A_file_in_flight_is_not_handed_out_twice()
    {
        Write("one.csv", "1");
        using var watcher = Watcher();
        watcher.TakeReady();
        _time.Advance(Settle);
        Assert.Single(watcher.TakeReady());

        for (var i = 0; i < 5; i++)
        {
            _time.Advance(Settle + Rescan);
            Assert.Empty(watcher.TakeReady());
        }
    }

    [Fact]
    public void A_completed_file_still_in_the_inbox_comes_back_as_a_new_arrival()
    {
        Write("kept.csv", "1");
        using var watcher = Watcher();
        watcher.TakeReady();
        _time.Advance(Settle);
        var first = Assert.Single(watcher.TakeReady());

        watcher.Complete(first);
        _time.Advance(Rescan);
        var rescannedAt = _time.GetUtcNow();
        Assert.Empty(watcher.TakeReady());
        _time.Advance(Settle);
        var again = Assert.Single(watcher.TakeReady());

        Assert.Equal("kept.csv", again.Name);
        Assert.Equal(rescannedAt, again.ArrivedAt);
    }

    [Fact]
    public void A_new_file_under_the_name_of_a_moved_one_is_a_new_arrival()
    {
        var path = Write("daily.csv", "first");
        using var watcher = Watcher();
        watcher.TakeReady();
        _time.Advance(Settle);
        var first = Assert.Single(watcher.TakeReady());

        File.Move(path, Path.Combine(_temp.Sub("elsewhere"), "daily.csv"));
        watcher.Complete(first);
        Write("daily.csv", "second export");
        _time.Advance(Rescan);
        Assert.Empty(watcher.TakeReady());
        _time.Advance(Settle);
        var second = Assert.Single(watcher.TakeReady());

        Assert.Equal("second export".Length, second.Size);
    }

    [Fact]
    public void After_a_restart_a_file_still_in_the_inbox_is_handed_out_again()
    {
        Write("unfinished.csv", "1");
        using (var before = Watcher())
        {
            before.TakeReady();
            _time.Advance(Settle);
            Assert.Single(before.TakeReady());
        }

        using var after = Watcher();
        after.TakeReady();
        _time.Advance(Settle);

        Assert.Equal("unfinished.csv", Assert.Single(after.TakeReady()).Name);
    }

    [Fact]
    public void At_most_max_files_are_taken_and_the_rest_follow_without_waiting()
    {
        foreach (var name in new[] { "1.csv", "2.csv", "3.csv" })
        {
            Write(name, name);
        }

        using var watcher = Watcher();
        watcher.TakeReady();
        _time.Advance(Settle);

        Assert.Equal(2, watcher.TakeReady(2).Count);
        Assert.Single(watcher.TakeReady(2));
    }

    [Fact]
    public async Task A_part_file_renamed_to_csv_is_picked_up_from_the_rename_event()
    {
        var part = Write("AP-7.csv.part", "batch\nAP-7\n");
        // Rescans an hour apart on the fake clock, so only the watcher's event can find the file.
        using var watcher = new InboxWatcher(new InboxOptions(_inbox, Settle, TimeSpan.FromHours(1)), _time);
        watcher.Start();
        _time.Advance(Settle);
        Assert.Empty(watcher.TakeReady());

        File.Move(part, Path.Combine(_inbox, "AP-7.csv"));
        IReadOnlyList<ReadyFile> ready = [];
        await Within.UntilAsync(
            () =>
            {
                _time.Advance(Settle);
                ready = watcher.TakeReady();
                return ready.Count > 0;
            },
            "the renamed file to be ready");

        Assert.Equal("AP-7.csv", Assert.Single(ready).Name);
    }

    [Fact]
    public void An_old_file_renamed_into_the_inbox_is_ready_on_first_sight()
    {
        using var watcher = Watcher();
        watcher.Start();
        var part = Write("AP-9.csv.part", "batch\nAP-9\n");
        File.SetLastWriteTimeUtc(part, _time.GetUtcNow().UtcDateTime.AddHours(-3));
        Assert.Empty(watcher.TakeReady());

        File.Move(part, Path.Combine(_inbox, "AP-9.csv"));
        _time.Advance(Rescan);

        // Only the rescan interval passed, far less than the settle interval.
        Assert.Equal("AP-9.csv", Assert.Single(watcher.TakeReady()).Name);
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(0.5)]
    [InlineData(1.9)]
    public void A_recently_written_file_waits_until_its_last_write_is_settle_old(double ageSeconds)
    {
        var path = Write("recent.csv", "batch\n");
        File.SetLastWriteTimeUtc(path, _time.GetUtcNow().UtcDateTime.AddSeconds(-ageSeconds));
        using var watcher = Watcher();
        Assert.Empty(watcher.TakeReady());

        var remaining = Settle - TimeSpan.FromSeconds(ageSeconds);
        _time.Advance(remaining - TimeSpan.FromMilliseconds(50));
        Assert.Empty(watcher.TakeReady());
        _time.Advance(TimeSpan.FromMilliseconds(50));

        Assert.Single(watcher.TakeReady());
    }

    [Theory]
    [InlineData(1)]
    [InlineData(3600)]
    public void A_last_write_time_in_the_future_counts_as_just_written(int aheadSeconds)
    {
        var path = Write("ahead.csv", "batch\n");
        File.SetLastWriteTimeUtc(path, _time.GetUtcNow().UtcDateTime.AddSeconds(aheadSeconds));
        using var watcher = Watcher();
        Assert.Empty(watcher.TakeReady());

        _time.Advance(Settle * 0.9);
        Assert.Empty(watcher.TakeReady());
        _time.Advance(Settle * 0.1);

        Assert.Single(watcher.TakeReady());
    }

    [Fact]
    public void A_slow_writer_whose_writes_stamp_the_current_time_is_never_taken_early()
    {
        var path = Write("slow.csv", "batch,recipe\n");
        File.SetLastWriteTimeUtc(path, _time.GetUtcNow().UtcDateTime);
        using var watcher = Watcher();
        Assert.Empty(watcher.TakeReady());

        for (var chunk = 0; chunk < 5; chunk++)
        {
            _time.Advance(Settle * 0.9);
            File.AppendAllText(path, "AP-1,ANL-200\n");
            File.SetLastWriteTimeUtc(path, _time.GetUtcNow().UtcDateTime);
            Assert.Empty(watcher.TakeReady());
        }

        _time.Advance(Settle * 0.9);
        Assert.Empty(watcher.TakeReady());
        _time.Advance(Settle * 0.1);

        Assert.Equal(new FileInfo(path).Length, Assert.Single(watcher.TakeReady()).Size);
    }

    [Theory]
    [InlineData(3600)]
    [InlineData(0)]
    public void Draining_a_backlog_in_groups_costs_a_few_looks_per_file(int ageSeconds)
    {
        const int files = 1000;
        const int group = 64;
        var written = _time.GetUtcNow().UtcDateTime.AddSeconds(-ageSeconds);
        var expected = new List<string>();
        for (var i = 0; i < files; i++)
        {
            var name = $"f{(files - i).ToString("D4", System.Globalization.CultureInfo.InvariantCulture)}.csv";
            File.SetLastWriteTimeUtc(Write(name, "batch\n"), written.AddMilliseconds(-(files - i)));
            expected.Add(name);
        }

        var probe = new CountingProbe();
        using var watcher = new InboxWatcher(new InboxOptions(_inbox, Settle, Rescan, useFileSystemEvents: false), _time, probe);
        var taken = watcher.TakeReady(group).Select(f => f.Name).ToList();
        if (ageSeconds < Settle.TotalSeconds)
        {
            Assert.Empty(taken);
            _time.Advance(Settle);
        }

        Drain(watcher, taken);

        Assert.Equal(expected, taken);
        // Per file: one stat at discovery, one stat when its settle time is due (young backlog only), one
        // exclusive open when found ready, one stat and one open when handed out. Looking at every waiting
        // file for every group instead would cost about files * files / group looks (over 15,000 here).
        Assert.InRange(probe.Looks, files, 5 * files);
    }

    private void Drain(InboxWatcher watcher, List<string> taken)
    {
        for (var calls = 0; calls < 100; calls++)
        {
            var batch = watcher.TakeReady(64);
            Assert.True(batch.Count <= 64);
            taken.AddRange(batch.Select(f => f.Name));
            // Time passes while the consumer stores each group, so rescans run during the drain too.
            _time.Advance(Rescan);
            if (batch.Count == 0)
            {
                break;
            }
        }
    }

    private InboxWatcher Watcher() =>
        new(new InboxOptions(_inbox, Settle, Rescan, useFileSystemEvents: false), _time);

    private string Write(string name, string text)
    {
        var path = Path.Combine(_inbox, name);
        File.WriteAllText(path, text);
        return path;
    }
}
