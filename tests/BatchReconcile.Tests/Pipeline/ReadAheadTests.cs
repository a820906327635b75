using BatchReconcile.Pipeline;
using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Records.Exports;
using BatchReconcile.Storage.Ingest;

namespace BatchReconcile.Tests.Pipeline;

/// <summary>
/// The read-ahead hands each file's batches to the store in order, on the store's thread, whatever
/// the store skips or however far the reader gets ahead; its faults reach the store as the store's own.
/// </summary>
public sealed class ReadAheadTests
{
    private static readonly DateOnly Day = new(2026, 11, 23);

    [Theory]
    [InlineData(1, 1)]
    [InlineData(3, 2)]
    [InlineData(5, ReadAhead.Capacity * 3)] // more than the queue holds: the reader waits for the store
    public void Every_file_gives_its_batches_in_order(int files, int batchesPerFile)
    {
        using var readAhead = new ReadAhead();
        for (var f = 0; f < files; f++)
        {
            var file = f;
            Assert.Equal(f, readAhead.Add(store => Produce(store, file, batchesPerFile)));
        }

        readAhead.Complete();
        for (var f = 0; f < files; f++)
        {
            var got = new List<string>();
            var end = readAhead.Consume(f, b => got.Add(b.BatchId));
            Assert.True(end.IsValid);
            Assert.Equal(Enumerable.Range(0, batchesPerFile).Select(b => Id(f, b)), got);
        }
    }

    [Fact]
    public void A_file_the_store_skips_is_dropped_and_the_next_one_is_whole()
    {
        using var readAhead = new ReadAhead();
        readAhead.Add(store => Produce(store, 0, 2));
        readAhead.Add(store => Produce(store, 1, ReadAhead.Capacity + 5)); // skipped: more than the queue holds
        readAhead.Add(store => Produce(store, 2, 3));
        readAhead.Complete();

        Assert.True(readAhead.Consume(0, _ => { }).IsValid);
        var got = new List<string>();
        Assert.True(readAhead.Consume(2, b => got.Add(b.BatchId)).IsValid);
        Assert.Equal([Id(2, 0), Id(2, 1), Id(2, 2)], got);
    }

    [Fact]
    public void A_reader_fault_reaches_the_store_when_it_asks_for_that_file_and_the_others_are_read()
    {
        using var readAhead = new ReadAhead();
        readAhead.Add(store =>
        {
            Produce(store, 0, 1);
            throw new IOException("disk read error in file 0");
        });
        readAhead.Add(store => Produce(store, 1, 1));
        readAhead.Add(_ => StreamedFileEnd.Rejected([new ExportError("f2.csv", 3, "quantity", "1,5", "decimal comma")], "report"));
        readAhead.Complete();

        var got = new List<string>();
        var fault = Assert.Throws<IOException>(() => readAhead.Consume(0, b => got.Add(b.BatchId)));
        Assert.Equal("disk read error in file 0", fault.Message);
        Assert.Equal([Id(0, 0)], got);
        Assert.True(readAhead.Consume(1, _ => { }).IsValid);
        var rejected = readAhead.Consume(2, _ => throw new InvalidOperationException("no batch expected"));
        Assert.Equal("decimal comma", Assert.Single(rejected.Errors).Reason);
    }

    [Fact]
    public void Files_are_asked_for_once_and_in_order()
    {
        using var readAhead = new ReadAhead();
        readAhead.Add(store => Produce(store, 0, 1));
        readAhead.Add(store => Produce(store, 1, 1));
        readAhead.Complete();

        readAhead.Consume(1, _ => { });
        Assert.Throws<InvalidOperationException>(() => readAhead.Consume(0, _ => { }));
        Assert.Throws<InvalidOperationException>(() => readAhead.Consume(1, _ => { }));
        Assert.Throws<InvalidOperationException>(() => readAhead.Consume(2, _ => { }));
    }

    [Fact]
    public async Task Disposing_stops_a_reader_that_waits_for_the_store_and_nothing_is_read_after()
    {
        var produced = 0;
        var readAhead = new ReadAhead();
        readAhead.Add(store =>
        {
            for (var b = 0; b < 10_000; b++)
            {
                store(Batch(Id(0, b)));
                Interlocked.Increment(ref produced);
            }

            return StreamedFileEnd.Valid;
        });
        readAhead.Complete();
        SpinWait.SpinUntil(() => Volatile.Read(ref produced) >= ReadAhead.Capacity, TimeSpan.FromSeconds(10));

        var disposing = Task.Run(readAhead.Dispose);
        Assert.True(await Task.WhenAny(disposing, Task.Delay(TimeSpan.FromSeconds(10))) == disposing, "Dispose did not return while the reader was blocked on a full queue");
        var afterDispose = Volatile.Read(ref produced);
        await Task.Delay(50);
        Assert.Equal(afterDispose, Volatile.Read(ref produced));
        Assert.True(afterDispose <= ReadAhead.Capacity + 1, $"the reader stopped at the full queue, not after {afterDispose} batches");
    }

    [Fact]
    public async Task Large_batches_are_held_up_to_the_row_bound_and_a_batch_past_it_alone_still_goes_through()
    {
        // Each batch holds a fifth of the bound, so at most five wait in the queue however small the batch count;
        // one batch of twice the bound is let through on its own rather than waiting forever.
        var row = new RecordRow(2, "B", "BZC-410", 1, "S1", EntryKind.Charge, "NBA", null, 1.0, 1.0, MassUnit.Kilogram, null, null, null, []);
        var fifth = Enumerable.Repeat(row, ReadAhead.MaxRowsHeld / 5).ToArray();
        var huge = Enumerable.Repeat(row, ReadAhead.MaxRowsHeld * 2).ToArray();
        BatchIngest Sized(string id, RecordRow[] rows) => new(new BatchOutcome(new BatchRecord(id, "BZC-410", 1, RecipeVersionSource.Export, null, rows, []), [], null), Day);
        var produced = 0;
        using var readAhead = new ReadAhead();
        readAhead.Add(store =>
        {
            for (var b = 0; b < 20; b++)
            {
                store(Sized(Id(0, b), fifth));
                Interlocked.Increment(ref produced);
            }

            return StreamedFileEnd.Valid;
        });
        readAhead.Add(store =>
        {
            store(Sized("huge", huge));
            return StreamedFileEnd.Valid;
        });
        readAhead.Complete();

        SpinWait.SpinUntil(() => Volatile.Read(ref produced) >= 5, TimeSpan.FromSeconds(10));
        await Task.Delay(100);
        Assert.Equal(5, Volatile.Read(ref produced));

        var first = new List<string>();
        Assert.Equal(StreamedFileEnd.Valid, readAhead.Consume(0, b => first.Add(b.BatchId)));
        Assert.Equal(20, first.Count);
        var second = new List<int>();
        Assert.Equal(StreamedFileEnd.Valid, readAhead.Consume(1, b => second.Add(b.Outcome.Batch.Rows.Count)));
        Assert.Equal([ReadAhead.MaxRowsHeld * 2], second);
    }

    private static StreamedFileEnd Produce(Action<BatchIngest> store, int file, int batches)
    {
        for (var b = 0; b < batches; b++)
        {
            store(Batch(Id(file, b)));
        }

        return StreamedFileEnd.Valid;
    }

    private static string Id(int file, int batch) => FormattableString.Invariant($"F{file}-B{batch}");

    private static BatchIngest Batch(string id) => new(new BatchOutcome(new BatchRecord(id, "BZC-410", 1, RecipeVersionSource.Export, null, [], []), [], null), Day);
}
