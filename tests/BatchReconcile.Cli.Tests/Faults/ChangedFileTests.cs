using System.Security.Cryptography;
using BatchReconcile.Cli.Tests.Support;

namespace BatchReconcile.Cli.Tests.Faults;

/// <summary>
/// A file replaced while it is processed (issue: keep running through faults, defect 3): what is stored, what is
/// logged as its SHA-256 and what is archived must be the same bytes, and the new content is left to be taken as a
/// new arrival. Real process, since the race is between the exporter and the program.
/// </summary>
[Trait("Category", "faults")]
public sealed class ChangedFileTests
{
    private const string Benzamide = "2026-11-23T1705_KB3-NB-0158.csv";

    [Fact]
    public async Task A_large_file_replaced_by_a_rename_while_it_is_read_is_archived_as_the_bytes_that_were_stored()
    {
        using var temp = new TempFolder("brc-changed");
        var config = TestConfig.Write(temp.Sub("config"));
        var folder = temp.Sub("exports");
        Directory.CreateDirectory(folder);
        var sample = ExportText.FromSample(Benzamide);
        var big = sample.WithBatchId("CHG-0001");
        for (var i = 2; i <= 1500; i++)
        {
            big = big.Then(sample.WithBatchId($"CHG-{i:D4}"));
        }

        var path = Path.Combine(folder, "big.csv");
        big.WriteTo(path);
        var original = Sha(File.ReadAllBytes(path));
        var replacement = sample.WithBatchId("CHG-NEW");
        var staged = Path.Combine(temp.Path, "replacement.csv");
        var data = new DataRoot(temp.Sub("data"));

        var ingest = ProgramRunner.RunAsync("ingest", path, "--config", config, "--data", data.Path);
        // The program reads a large file under a hidden second name; once that exists, the exporter renames a new file over it.
        await Poll.UntilAsync(() => ingest.IsCompleted || Directory.EnumerateFiles(folder, ".reading-*").Any(), TimeSpan.FromSeconds(60), () => "no reading link appeared");
        replacement.WriteTo(staged);
        File.Move(staged, path, overwrite: true);
        var result = await ingest;

        Assert.True(result.ExitCode == 0, result.Stderr);
        var archived = Assert.Single(Directory.EnumerateFiles(data.Archive, "*", SearchOption.AllDirectories));
        Assert.Equal("big.csv", Path.GetFileName(archived));
        Assert.Equal(original, Sha(File.ReadAllBytes(archived)));
        Assert.Equal(original, Assert.Single(data.Rows("SELECT sha256 FROM ingest_log"))[0]);
        Assert.Equal(1500L, data.Scalar("SELECT count(*) FROM batch"));
        // The new content was not taken: it waits where it is, as a new arrival, and no hidden name is left behind.
        Assert.Equal(Sha(replacement.Bytes), Sha(File.ReadAllBytes(path)));
        Assert.Empty(Directory.EnumerateFiles(folder, ".reading-*"));
        Assert.Contains("was replaced after it was read", result.Stderr, StringComparison.Ordinal);
    }

    private static string Sha(byte[] bytes) => Convert.ToHexStringLower(SHA256.HashData(bytes));
}
