using System.Runtime.ExceptionServices;
using System.Collections.Concurrent;
using BatchReconcile.Storage.Ingest;

namespace BatchReconcile.Pipeline;

/// <summary>
/// Reads and reconciles the files of a group on a second thread, in order, while the store writes
/// the batches of earlier files: the store asks for a file's batches (<see cref="Consume"/>) when it
/// reaches it, and by then they are usually read.
/// </summary>
/// <remarks>
/// <para>One queue for the whole group, in file order, bounded to <see cref="Capacity"/> batches, so memory
/// does not grow with the group or with a large file: the reader waits while the store catches up.</para>
/// <para>The store may skip a file (same bytes as an earlier file of the group: it is never read); what
/// was read of it is dropped when the store asks for a later file. A fault of the reader (an I/O error)
/// is handed to the store, on its thread, when it asks for that file, as if the store had read the file
/// itself. Nothing here writes: the store still decides, in one transaction, what is kept.</para>
/// <para><see cref="Dispose"/> stops the reader and waits for it, so no file is read after the group is
/// settled (moved to the archive or quarantine).</para>
/// </remarks>
public sealed class ReadAhead : IDisposable
{
    /// <summary>Batches read ahead of the store at most.</summary>
    public const int Capacity = 32;

    // Blocking queues rather than channels: both sides are threads that wait, and a channel would wake
    // them through the thread pool for every batch.
    private readonly BlockingCollection<Func<Action<BatchIngest>, StreamedFileEnd>> _jobs = [];
    private readonly BlockingCollection<Item> _read = new(Capacity);
    private readonly CancellationTokenSource _stop = new();
    private readonly Thread _reader;
    private int _added;
    private int _next;
    private bool _disposed;

    public ReadAhead()
    {
        // A thread of its own rather than the pool: it blocks while the queue is full.
        _reader = new Thread(ReadAll) { IsBackground = true, Name = "read-ahead" };
        _reader.Start();
    }

    /// <summary>Queues a file's reading; returns the number to <see cref="Consume"/> it by (0, 1, 2 ... in order).</summary>
    /// <param name="read">Reads the file, handing each reconciled batch to its argument, and says how the file ended.</param>
    public int Add(Func<Action<BatchIngest>, StreamedFileEnd> read)
    {
        ArgumentNullException.ThrowIfNull(read);
        ObjectDisposedException.ThrowIf(_disposed, this);
        _jobs.Add(read);
        return _added++;
    }

    /// <summary>No more files in this group: the reader stops when it has read them.</summary>
    public void Complete() => _jobs.CompleteAdding();

    /// <summary>
    /// Hands the batches of file <paramref name="index"/> to <paramref name="storeBatch"/> as they are read
    /// and returns how the file ended; called by the store, in file order (files may be skipped).
    /// </summary>
    public StreamedFileEnd Consume(int index, Action<BatchIngest> storeBatch)
    {
        ArgumentNullException.ThrowIfNull(storeBatch);
        ObjectDisposedException.ThrowIf(_disposed, this);
        if (index < _next || index >= _added)
        {
            throw new InvalidOperationException($"File {index} of the group cannot be read now (next is {_next}, {_added} added); files are read once, in order.");
        }

        _next = index + 1;
        while (true)
        {
            var item = Take();
            if (item.File < index)
            {
                continue; // the rest of a file the store skipped
            }

            if (item.File > index)
            {
                throw new InvalidOperationException($"Read file {item.File} while file {index} was expected.");
            }

            if (item.Batch is { } batch)
            {
                storeBatch(batch);
            }
            else if (item.Fault is { } fault)
            {
                fault.Throw();
            }
            else
            {
                return item.End!;
            }
        }
    }

    /// <summary>Stops the reader (a file it is reading is left half-read, nothing is stored) and waits for it.</summary>
    public void Dispose()
    {
        if (_disposed)
        {
            return;
        }

        _disposed = true;
        _jobs.CompleteAdding();
        _stop.Cancel();
        _reader.Join();
        _stop.Dispose();
        _jobs.Dispose();
        _read.Dispose();
    }

    private Item Take() =>
        _read.TryTake(out var item, Timeout.Infinite)
            ? item
            : throw new InvalidOperationException("The read-ahead stopped before the file was read.");

    private void ReadAll()
    {
        var token = _stop.Token;
        var file = 0;
        try
        {
            foreach (var read in _jobs.GetConsumingEnumerable(token))
            {
                var current = file++;
                Item end;
                try
                {
                    end = new Item(current, null, read(batch => _read.Add(new Item(current, batch, null, null), token)), null);
                }
                catch (OperationCanceledException) when (token.IsCancellationRequested)
                {
                    throw;
                }
                catch (Exception e)
                {
                    end = new Item(current, null, null, ExceptionDispatchInfo.Capture(e));
                }

                _read.Add(end, token);
            }
        }
        catch (OperationCanceledException) when (token.IsCancellationRequested)
        {
            // Stopped by Dispose: the store has what it asked for.
        }
        finally
        {
            _read.CompleteAdding();
        }
    }

    /// <summary>One thing read: a batch of <paramref name="File"/>, or how it ended (<paramref name="End"/> or <paramref name="Fault"/>).</summary>
    private sealed record Item(int File, BatchIngest? Batch, StreamedFileEnd? End, ExceptionDispatchInfo? Fault);
}
