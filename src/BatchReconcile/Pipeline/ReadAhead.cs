using System.Runtime.ExceptionServices;
using BatchReconcile.Storage.Ingest;

namespace BatchReconcile.Pipeline;

/// <summary>
/// Reads and reconciles the files of a group on a second thread, in order, while the store writes
/// the batches of earlier files: the store asks for a file's batches (<see cref="Consume"/>) when it
/// reaches it, and by then they are usually read.
/// </summary>
/// <remarks>
/// <para>One queue for the whole group, in file order, bounded to <see cref="Capacity"/> batches and
/// <see cref="MaxRowsHeld"/> rows, so memory does not grow with the group or with a large file: the reader
/// waits while the store catches up.</para>
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
    /// <remarks>Enough for a whole group of small files, so the reader never waits for the store while the group
    /// is being hashed; <see cref="MaxRowsHeld"/> bounds the memory when the batches are large.</remarks>
    public const int Capacity = 1024;

    /// <summary>Rows held in batches read ahead at most (one batch is always let through, however large).</summary>
    public const int MaxRowsHeld = 50_000;

    // One lock and Monitor waits rather than blocking collections: those spin (sched_yield) before they
    // block, and with two threads on two cores the spinning took the CPU from the store's thread. Each
    // side wakes the other only when the other waits.
    private readonly object _gate = new();
    private readonly Queue<Func<Action<BatchIngest>, StreamedFileEnd>> _jobs = new();
    private readonly Queue<Item> _read = new();
    private readonly Thread _reader;
    private bool _jobsComplete;
    private bool _readComplete;
    private bool _stopping;
    private bool _readerWaits;
    private bool _storeWaits;
    private int _rowsHeld;
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
        lock (_gate)
        {
            if (_jobsComplete)
            {
                throw new InvalidOperationException("The group is complete; no more files can be added.");
            }

            _jobs.Enqueue(read);
            if (_readerWaits)
            {
                Monitor.PulseAll(_gate);
            }
        }

        return _added++;
    }

    /// <summary>No more files in this group: the reader stops when it has read them.</summary>
    public void Complete()
    {
        lock (_gate)
        {
            _jobsComplete = true;
            Monitor.PulseAll(_gate);
        }
    }

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
        lock (_gate)
        {
            _stopping = true;
            Monitor.PulseAll(_gate);
        }

        _reader.Join();
    }

    private Item Take()
    {
        lock (_gate)
        {
            while (_read.Count == 0 && !_readComplete)
            {
                _storeWaits = true;
                Monitor.Wait(_gate);
                _storeWaits = false;
            }

            if (_read.Count == 0)
            {
                throw new InvalidOperationException("The read-ahead stopped before the file was read.");
            }

            var item = _read.Dequeue();
            _rowsHeld -= item.Rows;
            // Woken with room for half the queue again, not for every batch taken.
            if (_readerWaits && (_read.Count == 0 || (_read.Count <= Capacity / 2 && _rowsHeld <= MaxRowsHeld / 2)))
            {
                Monitor.PulseAll(_gate);
            }

            return item;
        }
    }

    /// <summary>Queues what was read; waits while the queue is full. False when the read-ahead is stopping.</summary>
    private bool Put(Item item)
    {
        lock (_gate)
        {
            while (!_stopping && _read.Count > 0 && (_read.Count >= Capacity || _rowsHeld + item.Rows > MaxRowsHeld))
            {
                _readerWaits = true;
                Monitor.Wait(_gate);
                _readerWaits = false;
            }

            if (_stopping)
            {
                return false;
            }

            _read.Enqueue(item);
            _rowsHeld += item.Rows;
            if (_storeWaits)
            {
                Monitor.PulseAll(_gate);
            }

            return true;
        }
    }

    private Func<Action<BatchIngest>, StreamedFileEnd>? NextJob()
    {
        lock (_gate)
        {
            while (_jobs.Count == 0 && !_jobsComplete && !_stopping)
            {
                _readerWaits = true;
                Monitor.Wait(_gate);
                _readerWaits = false;
            }

            return _stopping || _jobs.Count == 0 ? null : _jobs.Dequeue();
        }
    }

    private void ReadAll()
    {
        var file = 0;
        try
        {
            while (NextJob() is { } read)
            {
                var current = file++;
                Item end;
                try
                {
                    end = new Item(current, null, read(batch =>
                    {
                        if (!Put(new Item(current, batch, null, null)))
                        {
                            throw new OperationCanceledException();
                        }
                    }), null);
                }
                catch (OperationCanceledException) when (Volatile.Read(ref _stopping))
                {
                    return; // stopped by Dispose: the store has what it asked for
                }
                catch (Exception e)
                {
                    end = new Item(current, null, null, ExceptionDispatchInfo.Capture(e));
                }

                if (!Put(end))
                {
                    return;
                }
            }
        }
        finally
        {
            lock (_gate)
            {
                _readComplete = true;
                Monitor.PulseAll(_gate);
            }
        }
    }

    /// <summary>One thing read: a batch of <paramref name="File"/>, or how it ended (<paramref name="End"/> or <paramref name="Fault"/>).</summary>
    private sealed record Item(int File, BatchIngest? Batch, StreamedFileEnd? End, ExceptionDispatchInfo? Fault)
    {
        /// <summary>What the item counts against <see cref="MaxRowsHeld"/>.</summary>
        public int Rows => Batch is null ? 0 : Math.Max(1, Batch.Outcome.Batch.Rows.Count);
    }
}
