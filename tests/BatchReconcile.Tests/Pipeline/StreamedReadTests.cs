using BatchReconcile.Intake;
using BatchReconcile.Records.Definitions.Loading;
using BatchReconcile.Records.Exports.Reading;
using BatchReconcile.Tests.Support;

namespace BatchReconcile.Tests.Pipeline;

/// <summary>
/// A large export read the way the pipeline reads one (through the hashing stream that proves the parsed bytes are
/// the hashed ones) is still streamed: each batch is handed over as soon as its last row is read, not all at the end
/// of the file. Holding them made the 200 MB benchmark file peak at 1.9 GB. The export repeats one demo batch
/// (sample-data/inbox, KB3-PZ-0227) under new ids.
/// </summary>
public sealed class StreamedReadTests : IDisposable
{
    private readonly string _folder = Directory.CreateTempSubdirectory("brc-stream-").FullName;

    [Fact]
    public void Batches_are_handed_over_while_the_file_is_still_being_read_and_the_hash_is_of_the_parsed_pass()
    {
        var sample = File.ReadAllLines(Path.Combine(HostSandbox.RepositoryRoot, "sample-data", "inbox", "2026-11-23T1012_KB3-PZ-0227.csv"));
        var path = Path.Combine(_folder, "large.csv");
        using (var writer = new StreamWriter(path))
        {
            writer.Write(sample[0] + "\n");
            for (var i = 0; i < 2000; i++)
            {
                foreach (var row in sample.Skip(1))
                {
                    writer.Write(row.Replace("KB3-PZ-0227", $"STR-{i:D4}", StringComparison.Ordinal) + "\n");
                }
            }
        }

        var catalog = ProcessDefinitionLoader.LoadFolder(Path.Combine(HostSandbox.RepositoryRoot, "config", "processes")).Catalog!;
        var zone = TimeZoneInfo.FindSystemTimeZoneById("Europe/Berlin");
        var file = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 81920, FileOptions.SequentialScan);
        using var hashing = new HashingReadStream(file);
        var positions = new List<long>();

        var scan = ExportReader.Scan(hashing, "large.csv", catalog, zone, _ => positions.Add(file.Position));

        Assert.True(scan.IsValid, string.Join("; ", scan.Errors.Select(e => e.Reason)));
        Assert.Equal(2000, positions.Count);
        // The first batch came long before the end of the second pass (the file is about 2 MB; the reader buffers 80 KB).
        Assert.True(positions[0] < file.Length / 4, $"first batch handed over at byte {positions[0]} of {file.Length}");
        Assert.Equal(FileHash.Sha256Of(path), hashing.FinishHash());
    }

    public void Dispose() => Directory.Delete(_folder, recursive: true);
}
