using BatchReconcile.Intake.Inbox;

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

    private static string Write(string folder, string name)
    {
        var path = Path.Combine(folder, name);
        File.WriteAllText(path, "batch,recipe\n");
        return path;
    }
}
