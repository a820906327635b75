using BatchReconcile.Storage.Sql;

namespace BatchReconcile.Storage.Tests.Sql;

/// <summary>The ingest entries' detail is written by hand for speed; it must be the text the serialiser wrote before.</summary>
public sealed class FileDetailJsonTests
{
    public static TheoryData<string, string, int, int?> Cases => new()
    {
        { "plain.csv", "batch B-1", 1, null },
        { "no batches.csv", "-", 0, null },
        { "Büro <export> & \"Q4\".csv", "批次 'x' \u2028 \\ /", 3, null },
        { "large.csv", "B", 2, 1500 },
    };

    [Theory]
    [MemberData(nameof(Cases))]
    public void The_written_detail_equals_the_serialised_anonymous_object(string file, string batchStem, int listedCount, int? totalCount)
    {
        const string sha = "6f1ed002ab5595859014ebf0951522d9f2b5a5bd3d2e7f5d1f1e9f3c4a6b8d0e";
        var listed = Enumerable.Range(1, listedCount).Select(i => ($"{batchStem}-{i}", i % 2 == 0 ? "revision" : "new", i)).ToList();
        var anonymousList = listed.Select(b => new { batch = b.Item1, disposition = b.Item2, revision = b.Item3 });
        var expected = totalCount is { } total
            ? StoreJson.Detail(new { file, sha256 = sha, batches = anonymousList, batchCount = total, batchesNotListed = total - listedCount })
            : StoreJson.Detail(new { file, sha256 = sha, batches = anonymousList });

        var written = StoreJson.FileDetail(file, sha, listed, totalCount, totalCount - listedCount);

        Assert.Equal(expected, written);
    }
}
