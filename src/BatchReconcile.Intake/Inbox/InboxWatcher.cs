using System.Collections.Concurrent;
using System.Runtime.CompilerServices;

namespace BatchReconcile.Intake.Inbox;

/// <summary>
/// Watches one inbox folder and hands out files once they are complete, oldest arrival first.
/// A file counts as complete when its size and last-write time stayed the same for the settle
/// interval (measured with the injected <see cref="TimeProvider"/>) and it opens exclusively.
/// Candidates come from a FileSystemWatcher and from a full listing every rescan interval,
/// because watchers drop events. Nothing is remembered across restarts: a file still in the
/// inbox after a restart is handed out again (the store recognises it by its hash).
/// </summary>
/// <remarks>
/// A file handed out stays "in flight" and is not handed out again until the consumer calls
/// <see cref="Complete"/> or the file is gone from the inbox. Files are ordered among those that
/// are ready: a file still being written does not hold back later files that are complete.
/// One consumer at a time; <see cref="Complete"/> may be called from any thread.
/// </remarks>
public sealed class InboxWatcher : IDisposable
{
    private readonly InboxOptions _options;
    private readonly TimeProvider _time;
    private readonly object _gate = new();
    private readonly object _wakeGate = new();
    private readonly Dictionary<string, Entry> _entries = new(StringComparer.Ordinal);
    private readonly ConcurrentQueue<string> _events = new();
    private TaskCompletionSource _wake = NewWake();
    private FileSystemWatcher? _watcher;
    private long _nextRescanAt;
    private int _rescanRequested;
    private int _consumerActive;
    private bool _started;
    private bool _disposed;

    /// <summary>Creates a watcher; nothing happens on disk until <see cref="Start"/> or the first read.</summary>
    public InboxWatcher(InboxOptions options, TimeProvider time)
    {
        _options = options ?? throw new ArgumentNullException(nameof(options));
        _time = time ?? throw new ArgumentNullException(nameof(time));
    }

    /// <summary>The watched folder (absolute).</summary>
    public string InboxPath => _options.InboxPath;

    /// <summary>
    /// Creates the inbox when missing, starts the file-system events and lists the folder once.
    /// Files found by this start-up listing get their last-write time as arrival time, so a backlog
    /// keeps the order in which it was written. Called by the first read when not called before.
    /// </summary>
    public void Start()
    {
        lock (_gate)
        {
            ObjectDisposedException.ThrowIf(_disposed, this);
            if (_started)
            {
                return;
            }

            Directory.CreateDirectory(_options.InboxPath);
            if (_options.UseFileSystemEvents)
            {
                // Events first, listing second: a file created in between is seen by at least one of them.
                _watcher = CreateWatcher();
            }

            Rescan(startup: true);
            _started = true;
        }
    }

    /// <summary>
    /// Looks at the inbox now and returns the files that are complete at this moment, in arrival
    /// order, marking them in flight. Never waits. The first call after a file appears only records
    /// its size and time; it becomes ready on a call at least one settle interval later.
    /// </summary>
    public IReadOnlyList<ReadyFile> TakeReady(int maxFiles = int.MaxValue) => TakeReady(maxFiles, out _);

    /// <summary>
    /// Waits until at least one file is complete and returns every file complete at that moment
    /// (at most <paramref name="maxFiles"/>), in arrival order, marked in flight.
    /// </summary>
    public async Task<IReadOnlyList<ReadyFile>> NextReadyAsync(int maxFiles = int.MaxValue, CancellationToken cancellationToken = default)
    {
        if (Interlocked.Exchange(ref _consumerActive, 1) == 1)
        {
            throw new InvalidOperationException("Only one consumer may wait on an inbox watcher at a time.");
        }

        try
        {
            while (true)
            {
                cancellationToken.ThrowIfCancellationRequested();
                Task wake;
                lock (_wakeGate)
                {
                    // Events arriving while the folder is examined complete this task and cut the wait short.
                    if (_wake.Task.IsCompleted)
                    {
                        _wake = NewWake();
                    }

                    wake = _wake.Task;
                }

                var ready = TakeReady(maxFiles, out var untilNextCheck);
                if (ready.Count > 0)
                {
                    return ready;
                }

                using var delayCancel = CancellationTokenSource.CreateLinkedTokenSource(cancellationToken);
                var delay = Task.Delay(untilNextCheck, _time, delayCancel.Token);
                await Task.WhenAny(wake, delay).ConfigureAwait(false);
                await delayCancel.CancelAsync().ConfigureAwait(false);
            }
        }
        finally
        {
            Volatile.Write(ref _consumerActive, 0);
        }
    }

    /// <summary>Hands out complete files one by one, in arrival order, until cancelled (then throws <see cref="OperationCanceledException"/>).</summary>
    public async IAsyncEnumerable<ReadyFile> ReadFilesAsync([EnumeratorCancellation] CancellationToken cancellationToken = default)
    {
        while (true)
        {
            var batch = await NextReadyAsync(int.MaxValue, cancellationToken).ConfigureAwait(false);
            foreach (var file in batch)
            {
                yield return file;
            }
        }
    }

    /// <summary>
    /// Ends the in-flight state of a handed-out file. Call it after the file was moved away (or
    /// processing gave up). Should the file still be in the inbox, the next rescan or event
    /// treats it as a new arrival.
    /// </summary>
    public void Complete(ReadyFile file)
    {
        ArgumentNullException.ThrowIfNull(file);
        lock (_gate)
        {
            if (_entries.TryGetValue(file.Name, out var entry) && entry.InFlight == file)
            {
                _entries.Remove(file.Name);
            }
        }
    }

    /// <summary>Stops the file-system events. Files in flight are not touched.</summary>
    public void Dispose()
    {
        lock (_gate)
        {
            if (_disposed)
            {
                return;
            }

            _disposed = true;
            _watcher?.Dispose();
            _watcher = null;
        }

        Wake();
    }

    /// <summary>Names of candidate files seen but not (yet) complete, for reporting.</summary>
    internal IReadOnlyList<string> PendingNames()
    {
        lock (_gate)
        {
            return _entries.Values.Where(e => e.InFlight is null).Select(e => e.Name).Order(StringComparer.Ordinal).ToList();
        }
    }

    internal IReadOnlyList<ReadyFile> TakeReady(int maxFiles, out TimeSpan untilNextCheck)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(maxFiles, 1);
        Start();
        lock (_gate)
        {
            ObjectDisposedException.ThrowIf(_disposed, this);
            var now = _time.GetTimestamp();
            var nowUtc = _time.GetUtcNow();
            DrainEvents(nowUtc);
            if (Interlocked.Exchange(ref _rescanRequested, 0) == 1 || now >= _nextRescanAt)
            {
                Rescan(startup: false);
            }

            var settle = _options.SettleInterval;
            var ready = new List<(Entry Entry, ReadyFile File)>();
            var nextCheck = _time.GetElapsedTime(now, _nextRescanAt);
            foreach (var entry in _entries.Values.ToList())
            {
                if (entry.InFlight is not null)
                {
                    continue;
                }

                var path = Path.Combine(_options.InboxPath, entry.Name);
                if (!TryStat(path, out var size, out var lastWrite))
                {
                    _entries.Remove(entry.Name);
                    continue;
                }

                if (entry.Size != size || entry.LastWriteUtc != lastWrite)
                {
                    entry.Size = size;
                    entry.LastWriteUtc = lastWrite;
                    entry.StableSince = now;
                    entry.RetryAt = now;
                }

                var quiet = _time.GetElapsedTime(entry.StableSince, now);
                if (quiet < settle)
                {
                    nextCheck = Min(nextCheck, settle - quiet);
                    continue;
                }

                if (now < entry.RetryAt)
                {
                    nextCheck = Min(nextCheck, _time.GetElapsedTime(now, entry.RetryAt));
                    continue;
                }

                if (!CanOpenExclusively(path))
                {
                    // Someone (a writer that locks, an editor) still holds it: look again a little later.
                    var retry = settle > TimeSpan.Zero ? settle : TimeSpan.FromMilliseconds(250);
                    entry.RetryAt = now + (long)(retry.TotalSeconds * _time.TimestampFrequency);
                    nextCheck = Min(nextCheck, retry);
                    continue;
                }

                ready.Add((entry, new ReadyFile(path, entry.Name, entry.ArrivedAt, size, lastWrite)));
            }

            ready.Sort(static (a, b) => CompareArrival(a.File, b.File));
            var taken = ready.Take(maxFiles).ToList();
            foreach (var (entry, file) in taken)
            {
                entry.InFlight = file;
            }

            // Ready files left over because of maxFiles are ready on the next call without waiting.
            untilNextCheck = taken.Count < ready.Count ? TimeSpan.Zero : Max(nextCheck, TimeSpan.FromMilliseconds(1));
            return taken.Select(t => t.File).ToList();
        }
    }

    private static int CompareArrival(ReadyFile a, ReadyFile b)
    {
        var byArrival = a.ArrivedAt.CompareTo(b.ArrivedAt);
        if (byArrival != 0)
        {
            return byArrival;
        }

        var byWrite = a.LastWriteUtc.CompareTo(b.LastWriteUtc);
        return byWrite != 0 ? byWrite : string.CompareOrdinal(a.Name, b.Name);
    }

    private void Rescan(bool startup)
    {
        var nowUtc = _time.GetUtcNow();
        var present = new HashSet<string>(StringComparer.Ordinal);
        foreach (var path in Directory.EnumerateFiles(_options.InboxPath))
        {
            var name = Path.GetFileName(path);
            if (!InboxFileName.IsCandidate(name))
            {
                continue;
            }

            if (_entries.ContainsKey(name))
            {
                present.Add(name);
                continue;
            }

            if (TryStat(path, out _, out var lastWrite))
            {
                present.Add(name);
                _entries[name] = new Entry(name, startup ? lastWrite : nowUtc);
            }
        }

        foreach (var name in _entries.Keys.Where(n => !present.Contains(n)).ToList())
        {
            _entries.Remove(name);
        }

        var now = _time.GetTimestamp();
        _nextRescanAt = now + (long)(_options.RescanInterval.TotalSeconds * _time.TimestampFrequency);
    }

    private void DrainEvents(DateTimeOffset nowUtc)
    {
        while (_events.TryDequeue(out var name))
        {
            if (!InboxFileName.IsCandidate(name) || name.Contains(Path.DirectorySeparatorChar, StringComparison.Ordinal))
            {
                continue;
            }

            var path = Path.Combine(_options.InboxPath, name);
            var exists = TryStat(path, out _, out _);
            if (_entries.TryGetValue(name, out var entry))
            {
                if (!exists && entry.InFlight is not null)
                {
                    // Moved away by the consumer (or deleted): a new file of that name is a new arrival.
                    _entries.Remove(name);
                }

                continue;
            }

            if (exists)
            {
                _entries[name] = new Entry(name, nowUtc);
            }
        }
    }

    private FileSystemWatcher CreateWatcher()
    {
        var watcher = new FileSystemWatcher(_options.InboxPath)
        {
            IncludeSubdirectories = false,
            NotifyFilter = NotifyFilters.FileName | NotifyFilters.LastWrite | NotifyFilters.Size,
            InternalBufferSize = 64 * 1024,
        };
        watcher.Created += OnChanged;
        watcher.Changed += OnChanged;
        watcher.Deleted += OnChanged;
        watcher.Renamed += OnRenamed;
        watcher.Error += OnError;
        watcher.EnableRaisingEvents = true;
        return watcher;
    }

    // Event handlers only queue the name: they run on the watcher's thread and must not wait for disk work.
    private void OnChanged(object sender, FileSystemEventArgs e)
    {
        if (e.Name is { } name)
        {
            _events.Enqueue(name);
            Wake();
        }
    }

    private void OnRenamed(object sender, RenamedEventArgs e)
    {
        if (e.OldName is { } oldName)
        {
            _events.Enqueue(oldName);
        }

        OnChanged(sender, e);
    }

    private void OnError(object sender, ErrorEventArgs e)
    {
        // Typically an overflowed event buffer: events were lost, so list the folder again.
        Interlocked.Exchange(ref _rescanRequested, 1);
        Wake();
    }

    private void Wake()
    {
        lock (_wakeGate)
        {
            _wake.TrySetResult();
        }
    }

    private static bool TryStat(string path, out long size, out DateTimeOffset lastWriteUtc)
    {
        var info = new FileInfo(path);
        // Exists is false for folders; symbolic links are skipped because moving one would archive the link, not the data.
        if (!info.Exists || (info.Attributes & FileAttributes.ReparsePoint) != 0)
        {
            size = 0;
            lastWriteUtc = default;
            return false;
        }

        size = info.Length;
        lastWriteUtc = new DateTimeOffset(info.LastWriteTimeUtc, TimeSpan.Zero);
        return true;
    }

    private static bool CanOpenExclusively(string path)
    {
        // FileShare.None: on Windows a real share-mode lock. On Linux and macOS .NET emulates it with an
        // advisory flock, which only other .NET processes (and programs that use flock) respect; a plain
        // writer is not stopped by it. The settle check above is what really protects against a slow writer.
        try
        {
            using var stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.None, bufferSize: 1);
            return true;
        }
        catch (IOException)
        {
            return false;
        }
        catch (UnauthorizedAccessException)
        {
            return false;
        }
    }

    private static TaskCompletionSource NewWake() => new(TaskCreationOptions.RunContinuationsAsynchronously);

    private static TimeSpan Min(TimeSpan a, TimeSpan b) => a < b ? a : b;

    private static TimeSpan Max(TimeSpan a, TimeSpan b) => a > b ? a : b;

    private sealed class Entry(string name, DateTimeOffset arrivedAt)
    {
        public string Name { get; } = name;

        public DateTimeOffset ArrivedAt { get; } = arrivedAt;

        public long? Size { get; set; }

        public DateTimeOffset? LastWriteUtc { get; set; }

        public long StableSince { get; set; }

        public long RetryAt { get; set; }

        public ReadyFile? InFlight { get; set; }
    }
}
