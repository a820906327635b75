using System.Diagnostics;
using System.Text.Json.Nodes;
using BatchReconcile.Cli.Tests.Ingestion;
using BatchReconcile.Cli.Tests.Support;

namespace BatchReconcile.Cli.Tests.Faults;

/// <summary>
/// Faults of the database while <c>run</c> has files (issue: keep running through faults): a lock held past the
/// busy timeout, a read-only database file, a full disk. The service must neither exit nor quarantine a valid
/// file; the files wait in the inbox and are stored once the fault is gone, without a restart.
/// </summary>
/// <remarks>
/// The read-only and full-disk cases need root (chattr +i, mount -t tmpfs), as CI runs; elsewhere they fail
/// with a message saying so rather than pass without testing anything.
/// </remarks>
[Collection(ServiceCollection.Name)]
[Trait("Category", "faults")]
public sealed class StoreFaultTests
{
    private const string Benzamide = "2026-11-23T1705_KB3-NB-0158.csv";

    [Fact]
    public async Task A_lock_held_past_the_busy_timeout_keeps_the_file_in_the_inbox_and_it_is_stored_when_the_lock_goes()
    {
        using var sandbox = new ServiceSandbox();
        SetBusyTimeout(sandbox, 1);
        using var service = await sandbox.StartAsync();
        sandbox.Drop("first.csv", ExportText.FromSample(Benzamide).WithBatchId("F-LOCK-1"));
        await sandbox.WaitUntilTakenAsync(1, service);

        // A person with the sqlite3 shell holds the write lock for 6 s, six times the busy timeout.
        // The shell waits for the lock itself (the service may be writing a digest) and says when it holds it.
        using var holder = Sqlite3(sandbox.Data.Database, ".timeout 30000\nBEGIN EXCLUSIVE;\nSELECT 'locked';\n.shell sleep 6\nCOMMIT;\n");
        var said = await holder.StandardOutput.ReadLineAsync().WaitAsync(ServiceSandbox.Patience);
        Assert.Equal("locked", said);
        sandbox.Drop("second.csv", ExportText.FromSample(Benzamide).WithBatchId("F-LOCK-2"));
        await Poll.UntilAsync(() => service.Stderr.Contains("The database refused a group", StringComparison.Ordinal), ServiceSandbox.Patience, () => service.Stderr);

        Assert.False(service.HasExited, service.Stderr);
        Assert.Contains("second.csv", sandbox.Data.InboxFiles());
        Assert.Empty(sandbox.Data.QuarantinedFiles());
        Assert.Contains("locked by another process", service.Stderr, StringComparison.Ordinal);

        await holder.WaitForExitAsync();
        await sandbox.WaitUntilTakenAsync(2, service);
        Assert.Empty(sandbox.Data.QuarantinedFiles());
        Assert.NotNull(await sandbox.ShowAsync("F-LOCK-2"));
        // The line is logged once the group is settled, just after its files were moved: wait for it.
        await Poll.UntilAsync(() => service.Stderr.Contains("intake resumed", StringComparison.Ordinal), ServiceSandbox.Patience, () => service.Stderr);
        Assert.Equal(1, Count(service.Stderr, "The database refused a group"));
        Assert.DoesNotContain("   at ", service.Stderr, StringComparison.Ordinal);
        Assert.Equal(0, (await ProgramRunner.RunAsync("audit", "verify", "--data", sandbox.Data.Path)).ExitCode);
    }

    [Fact]
    public async Task A_read_only_database_keeps_valid_files_out_of_quarantine_and_the_service_resumes_when_it_is_writable()
    {
        using var sandbox = new ServiceSandbox();
        using (var first = await sandbox.StartAsync())
        {
            sandbox.Drop("first.csv", ExportText.FromSample(Benzamide).WithBatchId("F-RO-1"));
            await sandbox.WaitUntilTakenAsync(1, first);
            Assert.Equal(0, await first.TerminateAsync(TimeSpan.FromSeconds(30)));
        }

        // The database file made immutable (as with a read-only mount) before the service starts again.
        RunRoot("chattr", "+i", sandbox.Data.Database);
        using var service = await sandbox.StartAsync();
        try
        {
            sandbox.Drop("second.csv", ExportText.FromSample(Benzamide).WithBatchId("F-RO-2"));
            await Poll.UntilAsync(() => service.Stderr.Contains("The database refused a group", StringComparison.Ordinal), ServiceSandbox.Patience, () => service.Stderr);
            await Task.Delay(TimeSpan.FromSeconds(2));

            Assert.False(service.HasExited, service.Stderr);
            Assert.Contains("second.csv", sandbox.Data.InboxFiles());
            Assert.Empty(sandbox.Data.QuarantinedFiles());
            Assert.Contains("cannot be written", service.Stderr, StringComparison.Ordinal);
        }
        finally
        {
            RunRoot("chattr", "-i", sandbox.Data.Database);
        }

        await sandbox.WaitUntilTakenAsync(2, service);
        Assert.Empty(sandbox.Data.QuarantinedFiles());
        Assert.NotNull(await sandbox.ShowAsync("F-RO-2"));
    }

    [Fact]
    public async Task A_full_disk_keeps_the_file_in_the_inbox_and_it_is_stored_once_space_is_freed()
    {
        using var temp = new TempFolder("brc-full");
        var mount = temp.Sub("small");
        Directory.CreateDirectory(mount);
        RunRoot("mount", "-t", "tmpfs", "-o", "size=6m", "tmpfs", mount);
        try
        {
            var config = TestConfig.Write(temp.Sub("config"));
            var data = new DataRoot(Path.Combine(mount, "data"));
            Directory.CreateDirectory(data.Inbox);
            using var service = await ServiceProcess.StartAsync(config, data.Path);
            ExportText.FromSample(Benzamide).WithBatchId("F-FULL-1").WriteTo(Path.Combine(data.Inbox, "first.csv"));
            await Poll.UntilAsync(() => data.ArchivedFiles().Count == 1, ServiceSandbox.Patience, () => service.Stderr);

            // Fill what is left of the 6 MB, then hand in a file: the write-ahead log cannot grow.
            var staged = Path.Combine(mount, "second.csv.part");
            ExportText.FromSample(Benzamide).WithBatchId("F-FULL-2").WriteTo(staged);
            var filler = Path.Combine(mount, "filler.bin");
            Fill(filler);
            File.Move(staged, Path.Combine(data.Inbox, "second.csv"));
            await Poll.UntilAsync(() => service.Stderr.Contains("The database refused a group", StringComparison.Ordinal) || service.HasExited, ServiceSandbox.Patience, () => service.Stderr);

            Assert.False(service.HasExited, service.Stderr);
            Assert.Contains("second.csv", data.InboxFiles());
            Assert.Empty(data.QuarantinedFiles());
            Assert.Contains("disk holding the database is full", service.Stderr, StringComparison.Ordinal);

            File.Delete(filler);
            await Poll.UntilAsync(() => data.ArchivedFiles().Count == 2, ServiceSandbox.Patience, () => service.Stderr);
            Assert.Empty(data.QuarantinedFiles());
            await Poll.UntilAsync(() => service.Stderr.Contains("intake resumed", StringComparison.Ordinal), ServiceSandbox.Patience, () => service.Stderr);
            await service.TerminateAsync(TimeSpan.FromSeconds(30));
        }
        finally
        {
            RunRoot("umount", "-l", mount);
        }
    }

    private static void SetBusyTimeout(ServiceSandbox sandbox, double seconds)
    {
        var path = Path.Combine(sandbox.Config, "appsettings.json");
        var settings = JsonNode.Parse(File.ReadAllText(path))!.AsObject();
        settings["Storage"]!["BusyTimeoutSeconds"] = seconds;
        File.WriteAllText(path, settings.ToJsonString());
    }

    private static void Fill(string path)
    {
        var block = new byte[64 * 1024];
        using var stream = new FileStream(path, FileMode.Create, FileAccess.Write);
        try
        {
            while (true)
            {
                stream.Write(block);
                stream.Flush(flushToDisk: true);
            }
        }
        catch (IOException)
        {
            // The file system is full: that was the point.
        }
    }

    private static Process Sqlite3(string database, string script)
    {
        var start = new ProcessStartInfo("sqlite3") { RedirectStandardInput = true, RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        start.ArgumentList.Add(database);
        var process = Process.Start(start) ?? throw new InvalidOperationException("the sqlite3 shell is needed: apt-get install sqlite3");
        process.StandardInput.Write(script);
        process.StandardInput.Close();
        return process;
    }

    private static void RunRoot(string program, params string[] args)
    {
        var start = new ProcessStartInfo(program) { RedirectStandardError = true, UseShellExecute = false };
        foreach (var arg in args)
        {
            start.ArgumentList.Add(arg);
        }

        using var process = Process.Start(start) ?? throw new InvalidOperationException($"{program} did not start");
        var error = process.StandardError.ReadToEnd();
        process.WaitForExit();
        Assert.True(process.ExitCode == 0,
            $"'{program} {string.Join(' ', args)}' failed ({error.Trim()}); this fault test needs root (chattr, mount), as CI runs it");
    }

    private static int Count(string text, string part)
    {
        var count = 0;
        for (var at = text.IndexOf(part, StringComparison.Ordinal); at >= 0; at = text.IndexOf(part, at + part.Length, StringComparison.Ordinal))
        {
            count++;
        }

        return count;
    }
}
