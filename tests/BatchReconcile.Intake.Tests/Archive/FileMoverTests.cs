using System.Text;
using BatchReconcile.Intake.Archive;
using Microsoft.Extensions.Time.Testing;

namespace BatchReconcile.Intake.Tests.Archive;

public sealed class FileMoverTests : IDisposable
{
    private readonly TempFolder _temp = new();
    private readonly string _inbox;
    private readonly FileMover _mover;

    public FileMoverTests()
    {
        _inbox = _temp.Sub("inbox");
        var time = new FakeTimeProvider(new DateTimeOffset(2026, 11, 24, 13, 5, 0, TimeSpan.Zero));
        var layout = new ArchiveLayout(Path.Combine(_temp.Path, "archive"), TimeZoneInfo.Utc);
        _mover = new FileMover(layout, Path.Combine(_temp.Path, "quarantine"), time);
    }

    public void Dispose() => _temp.Dispose();

    [Fact]
    public void Archiving_moves_the_file_byte_for_byte_into_the_dated_folder()
    {
        var source = WriteBytes("AP-2611-014.csv", 200_000, seed: 1);
        var before = FileHash.Sha256Of(source);

        var moved = _mover.MoveToArchive(source);

        Assert.Equal(Path.Combine(_temp.Path, "archive", "2026", "11", "24", "AP-2611-014.csv"), moved.DestinationPath);
        Assert.False(File.Exists(source));
        Assert.Equal(before, FileHash.Sha256Of(moved.DestinationPath));
        Assert.False(moved.CopiedAcrossVolumes);
        Assert.Empty(HiddenEntries(Path.GetDirectoryName(moved.DestinationPath)!));
        Assert.Empty(HiddenEntries(_inbox));
    }

    [Fact]
    public void A_name_clash_gets_a_numbered_suffix_and_the_existing_file_is_untouched()
    {
        var folder = Path.Combine(_temp.Path, "archive", "2026", "11", "24");
        var first = _mover.MoveToArchive(WriteText("daily.csv", "first")).DestinationPath;
        var second = _mover.MoveToArchive(WriteText("daily.csv", "second")).DestinationPath;
        var third = _mover.MoveToArchive(WriteText("daily.csv", "third")).DestinationPath;

        Assert.Equal(Path.Combine(folder, "daily.csv"), first);
        Assert.Equal(Path.Combine(folder, "daily (2).csv"), second);
        Assert.Equal(Path.Combine(folder, "daily (3).csv"), third);
        Assert.Equal(["first", "second", "third"], new[] { first, second, third }.Select(File.ReadAllText));
    }

    [Fact]
    public void A_duplicate_whose_copy_is_archived_is_removed_from_the_inbox_not_archived_as_name_2()
    {
        var archived = _mover.MoveToArchive(WriteText("KB3-PZ-0233.csv", "batch,recipe\n")).DestinationPath;
        // Linked back into the inbox after it was archived: same name, same bytes.
        var inboxPath = Path.Combine(_inbox, "KB3-PZ-0233.csv");
        File.Copy(archived, inboxPath);

        var (moved, alreadyArchived) = _mover.MoveDuplicate(inboxPath, FileHash.Sha256Of(inboxPath));

        Assert.True(alreadyArchived);
        Assert.Equal(archived, moved.DestinationPath);
        Assert.False(File.Exists(inboxPath));
        Assert.Equal(["KB3-PZ-0233.csv"], Directory.EnumerateFiles(Path.Combine(_temp.Path, "archive"), "*", SearchOption.AllDirectories).Select(Path.GetFileName));
    }

    [Fact]
    public void A_duplicate_found_under_a_numbered_name_in_an_earlier_day_is_recognised()
    {
        var earlier = Path.Combine(_temp.Path, "archive", "2026", "11", "02");
        Directory.CreateDirectory(earlier);
        File.WriteAllText(Path.Combine(earlier, "daily.csv"), "other content");
        File.WriteAllText(Path.Combine(earlier, "daily (2).csv"), "the content");
        File.WriteAllText(Path.Combine(earlier, "daily-extra.csv"), "the content"); // not a variant of the name
        var inboxPath = WriteText("daily.csv", "the content");

        var (moved, alreadyArchived) = _mover.MoveDuplicate(inboxPath, FileHash.Sha256Of(inboxPath));

        Assert.True(alreadyArchived);
        Assert.Equal(Path.Combine(earlier, "daily (2).csv"), moved.DestinationPath);
        Assert.False(File.Exists(inboxPath));
    }

    [Fact]
    public void A_duplicate_whose_only_copy_is_in_the_inbox_is_archived()
    {
        // As after a crash between storing the file and archiving it: the inbox holds the only copy.
        var inboxPath = WriteText("late.csv", "stored, never archived");
        var hash = FileHash.Sha256Of(inboxPath);

        var (moved, alreadyArchived) = _mover.MoveDuplicate(inboxPath, hash);

        Assert.False(alreadyArchived);
        Assert.Equal(hash, FileHash.Sha256Of(moved.DestinationPath));
        Assert.False(File.Exists(inboxPath));
    }

    [Fact]
    public void Stale_temporaries_of_an_interrupted_run_are_removed_and_nothing_else()
    {
        var now = new DateTime(2026, 11, 24, 13, 5, 0, DateTimeKind.Utc);
        var quarantine = Path.Combine(_temp.Path, "quarantine");
        var day = Path.Combine(_temp.Path, "archive", "2026", "11", "23");
        Directory.CreateDirectory(quarantine);
        Directory.CreateDirectory(day);
        string Make(string path, DateTime written)
        {
            File.WriteAllText(path, "x");
            File.SetLastWriteTimeUtc(path, written);
            return path;
        }

        var guid = Guid.NewGuid().ToString("N");
        var staleReport = Make(Path.Combine(quarantine, $".bad.csv.report.txt.{guid}.tmp"), now.AddMinutes(-5));
        var staleCopy = Make(Path.Combine(day, $".big.csv.{Guid.NewGuid():N}.tmp"), now.AddHours(-3));
        var inProgress = Make(Path.Combine(quarantine, $".other.csv.report.txt.{Guid.NewGuid():N}.tmp"), now.AddSeconds(-10));
        var notOurs = Make(Path.Combine(quarantine, ".notes.tmp"), now.AddDays(-1));
        var report = Make(Path.Combine(quarantine, "bad.csv.report.txt"), now.AddDays(-1));
        var exporterPart = Make(Path.Combine(_inbox, $".export.csv.{Guid.NewGuid():N}.tmp"), now.AddDays(-1)); // the exporter's, in the inbox
        var probe = Path.Combine(_inbox, ".intake-probe-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(probe);
        Directory.SetLastWriteTimeUtc(probe, now.AddMinutes(-5));

        var removed = _mover.RemoveStaleTemporaries(_inbox, TimeSpan.FromMinutes(1));

        Assert.Equal(new[] { staleReport, staleCopy, probe }.Order(), removed.Order());
        Assert.All(new[] { staleReport, staleCopy }, p => Assert.False(File.Exists(p)));
        Assert.False(Directory.Exists(probe));
        Assert.All(new[] { inProgress, notOurs, report, exporterPart }, p => Assert.True(File.Exists(p), p));
    }

    [Theory]
    [InlineData("a.csv", 2, "a (2).csv")]
    [InlineData("a.csv", 11, "a (11).csv")]
    [InlineData("noext", 2, "noext (2)")]
    [InlineData("a.csv.gz", 3, "a.csv (3).gz")]
    [InlineData("a.csv", 1, "a.csv")]
    public void Suffixes_go_before_the_extension(string name, int n, string expected)
    {
        Assert.Equal(expected, FileMover.WithSuffix(name, n));
    }

    [Fact]
    public void The_copy_path_keeps_bytes_and_time_and_leaves_no_temporary_file()
    {
        var source = WriteBytes("copied.csv", 300_000, seed: 2);
        var written = new DateTime(2026, 11, 23, 22, 0, 0, DateTimeKind.Utc);
        File.SetLastWriteTimeUtc(source, written);
        var before = FileHash.Sha256Of(source);
        var target = _temp.Sub("other-volume");

        var moved = _mover.MoveInto(source, target, forceCopy: true);

        Assert.True(moved.CopiedAcrossVolumes);
        Assert.False(File.Exists(source));
        Assert.Equal(before, FileHash.Sha256Of(moved.DestinationPath));
        Assert.Equal(written, File.GetLastWriteTimeUtc(moved.DestinationPath));
        Assert.Empty(HiddenEntries(target));
    }

    [Fact]
    public void A_move_to_another_file_system_is_detected_and_copied()
    {
        // /dev/shm is a tmpfs of its own on Linux; elsewhere there is no second file system to use.
        const string shm = "/dev/shm";
        if (!OperatingSystem.IsLinux() || !Directory.Exists(shm))
        {
            return;
        }

        var sourceFolder = Path.Combine(shm, "intake-tests-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(sourceFolder);
        try
        {
            var source = Path.Combine(sourceFolder, "remote.csv");
            File.WriteAllBytes(source, RandomBytes(50_000, seed: 3));
            var before = FileHash.Sha256Of(source);

            var moved = _mover.MoveToArchive(source);

            Assert.True(moved.CopiedAcrossVolumes);
            Assert.False(File.Exists(source));
            Assert.Equal(before, FileHash.Sha256Of(moved.DestinationPath));
            Assert.Empty(Directory.EnumerateFileSystemEntries(sourceFolder));
        }
        finally
        {
            Directory.Delete(sourceFolder, recursive: true);
        }
    }

    [Fact]
    public void Quarantine_moves_the_file_and_writes_the_report_beside_it()
    {
        var source = WriteText("bad.csv", "batch;recipe\n");
        const string report = "bad.csv line 1: the header splits only on ';' — re-export with commas (Δm 0.5 µg)\n";

        var quarantined = _mover.MoveToQuarantine(source, report);

        var folder = Path.Combine(_temp.Path, "quarantine");
        Assert.Equal(Path.Combine(folder, "bad.csv"), quarantined.File.DestinationPath);
        Assert.Equal(Path.Combine(folder, "bad.csv.report.txt"), quarantined.ReportPath);
        Assert.Equal("batch;recipe\n", File.ReadAllText(quarantined.File.DestinationPath));
        Assert.Equal(Encoding.UTF8.GetBytes(report), File.ReadAllBytes(quarantined.ReportPath));
        Assert.False(File.Exists(source));
        Assert.Empty(HiddenEntries(folder));
    }

    [Fact]
    public void A_second_quarantined_file_of_the_same_name_gets_its_own_report()
    {
        var first = _mover.MoveToQuarantine(WriteText("bad.csv", "one"), "report one");
        var second = _mover.MoveToQuarantine(WriteText("bad.csv", "two"), "report two");

        Assert.EndsWith("bad (2).csv", second.File.DestinationPath, StringComparison.Ordinal);
        Assert.Equal(second.File.DestinationPath + ".report.txt", second.ReportPath);
        Assert.Equal("report one", File.ReadAllText(first.ReportPath));
        Assert.Equal("report two", File.ReadAllText(second.ReportPath));
        Assert.Equal("one", File.ReadAllText(first.File.DestinationPath));
    }

    [Fact]
    public void A_report_left_without_its_file_by_a_crash_is_replaced()
    {
        var folder = Path.Combine(_temp.Path, "quarantine");
        Directory.CreateDirectory(folder);
        File.WriteAllText(Path.Combine(folder, "bad.csv.report.txt"), "stale report from an interrupted attempt");

        var quarantined = _mover.MoveToQuarantine(WriteText("bad.csv", "x"), "fresh report");

        Assert.Equal(Path.Combine(folder, "bad.csv"), quarantined.File.DestinationPath);
        Assert.Equal("fresh report", File.ReadAllText(quarantined.ReportPath));
    }

    private string WriteText(string name, string text)
    {
        var path = Path.Combine(_inbox, name);
        File.WriteAllText(path, text);
        return path;
    }

    private string WriteBytes(string name, int length, int seed)
    {
        var path = Path.Combine(_inbox, name);
        File.WriteAllBytes(path, RandomBytes(length, seed));
        return path;
    }

    private static byte[] RandomBytes(int length, int seed)
    {
        var bytes = new byte[length];
#pragma warning disable CA5394 // test data, not security
        new Random(seed).NextBytes(bytes);
#pragma warning restore CA5394
        return bytes;
    }

    private static IEnumerable<string> HiddenEntries(string folder) =>
        Directory.EnumerateFileSystemEntries(folder).Where(p => Path.GetFileName(p).StartsWith('.'));
}
