using System.Text.Json;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Storage.Ingest;
using BatchReconcile.Storage.Tests.Support;

namespace BatchReconcile.Storage.Tests.Ingest;

/// <summary>What is kept about a file as a whole: its flags read back for the log, and its audit entry.</summary>
public sealed class FileRecordTests
{
    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void A_files_flags_are_read_back_in_stored_order_with_their_batch_even_once_superseded(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();
        var first = Assert.Single(store.Commit([Build.File(
            "a.csv",
            Build.Ingest(Build.Batch("BZ-001"), Build.Day1, Build.Flag("S1"), Build.Flag("S2", FlagCode.BalanceGap, measured: 6.1, limit: 2.0, unit: "kg")),
            Build.Ingest(Build.Batch("BZ-002"), Build.Day1),
            Build.Ingest(Build.Batch("BZ-003"), Build.Day1, Build.Flag("S1")))]));
        var second = Assert.Single(store.Commit([Build.File("b.csv", Build.Ingest(Build.Batch("BZ-001", productKg: 96.5), Build.Day2, Build.Flag("S2")))]));

        var ofFirst = new List<(string Batch, long Id, string Step, FlagCode Code)>();
        store.ForEachFlagOfIngest(first.IngestId!.Value, (batch, flag) => ofFirst.Add((batch, flag.Id, flag.Flag.Step, flag.Flag.Code)));
        var ofSecond = new List<string>();
        store.ForEachFlagOfIngest(second.IngestId!.Value, (batch, _) => ofSecond.Add(batch));

        var ids = first.Batches.SelectMany(b => b.FlagIds).ToList();
        Assert.Equal(
            [("BZ-001", ids[0], "S1", FlagCode.YieldLow), ("BZ-001", ids[1], "S2", FlagCode.BalanceGap), ("BZ-003", ids[2], "S1", FlagCode.YieldLow)],
            ofFirst);
        Assert.Equal(["BZ-001"], ofSecond);
    }

    [Theory]
    [InlineData(BatchStore.MaxAuditedBatches, BatchStore.MaxAuditedBatches, null)]
    [InlineData(BatchStore.MaxAuditedBatches + 1, BatchStore.MaxAuditedBatches, 1)]
    public void A_files_audit_entry_lists_its_batches_up_to_the_limit_and_counts_the_rest(int batches, int listed, int? notListed)
    {
        using var db = new TempDatabase();
        using var store = db.Open();
        var file = Build.File("many.csv", Enumerable.Range(0, batches).Select(i => Build.Ingest(Build.Batch($"BZ-{i:D5}"), Build.Day1)).ToArray());

        Assert.Equal(IngestOutcome.Stored, Assert.Single(store.Commit([file])).Outcome);

        using var detail = JsonDocument.Parse(Db.Scalar(store.Connection, "SELECT detail FROM audit_event WHERE kind = 'ingest.stored'")!);
        var root = detail.RootElement;
        Assert.Equal(listed, root.GetProperty("batches").GetArrayLength());
        Assert.Equal("BZ-00000", root.GetProperty("batches")[0].GetProperty("batch").GetString());
        int? rest = root.TryGetProperty("batchesNotListed", out var restValue) ? restValue.GetInt32() : null;
        int? count = root.TryGetProperty("batchCount", out var countValue) ? countValue.GetInt32() : null;
        Assert.Equal((notListed, notListed is null ? null : batches), (rest, count));
        Assert.True(store.VerifyAudit().Intact);
    }
}
