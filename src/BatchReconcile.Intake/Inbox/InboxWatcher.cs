using System.Collections.Concurrent;
using System.Runtime.CompilerServices;

namespace BatchReconcile.Intake.Inbox;

/// <summary>
/// Watches one inbox folder and hands out files once they are complete, oldest arrival first.
/// A file counts as complete when it has not been written for the settle interval and it opens
/// exclusively (see <see cref="Settled"/> for the exact rule). Candidates come from a
/// FileSystemWatcher and from a full listing every rescan interval, because watchers drop events.
/// Nothing is remembered across restarts: a file still in the inbox after a restart is handed out
/// again (the store recognises it by its hash).
/// </summary>
/// <remarks>
/// A file handed out stays "in flight" and is not handed out again until the consumer calls
/// <see cref="Complete"/> or the file is gone from the inbox. Files are ordered among those that
/// are ready: a file still being written does not hold back later files that are complete.
/// One consumer at a time; <see cref="Complete"/> may be called from any thread.
/// Each file is looked at (stat, exclusive open) when it is found, when an event or a rescan says
/// it may have changed, when its settle time is due, and once more just before it is handed out;
/// files found ready wait in an ordered queue without being looked at again, so draining a
/// backlog in groups costs a few looks per file, not a look at every waiting file per group.
/// </remarks>
public sealed class InboxWatcher : IDisposable
{
    private readonly InboxOptions _options;
    private readonly TimeProvider _time;
    private readonly IFileProbe _probe;
    private readonly object _gate = new();
    private readonly object _wakeGate = new();
    private readonly Dictionary<string, Entry> _entries = new(StringComparer.Ordinal);
    private readonly HashSet<string> _toCheck = new(StringComparer.Ordinal);
    private readonly PriorityQueue<string, long> _due = new();
    private readonly SortedSet<ReadyFile> _ready = new(Comparer<ReadyFile>.Create(CompareArrival));
    private readonly ConcurrentQueue<string> _events = new();
    private readonly Dictionary<string, IgnoredKind> _ignored = new(StringComparer.Ordinal);
    private readonly List<IgnoredEntry> _newlyIgnored = [];
    private TaskCompletionSource _wake = NewWake();
    private FileSystemWatcher? _watcher;
    private long _nextRescanAt;
    private int _rescanRequested;
    private int _consumerActive;
    private bool _started;
    private bool _disposed;

    /// <summary>Creates a watcher; nothing happens on disk until <see cref="Start"/> or the first read.</summary>
    public InboxWatcher(InboxOptions options, TimeProvider time)
        : this(options, time, FileProbe.Instance)
    {
    }

    internal InboxWatcher(InboxOptions options, TimeProvider time, IFileProbe probe)
    {
        _options = options ?? throw new ArgumentNullException(nameof(options));
        _time = time ?? throw new ArgumentNullException(nameof(time));
        _probe = probe ?? throw new ArgumentNullException(nameof(probe));
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
    /// order, marking them in flight. Never waits. A file last written at least one settle interval
    /// ago is ready on the first call that sees it; a file written more recently becomes ready on a
    /// call once its last write is that old.
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
    /// <summary>
    /// The symbolic links and folders (with names that could be exports) found by the listings since the
    /// last call: each is returned once while it stays in the inbox, so that the caller can log it once.
    /// They are never read.
    /// </summary>
    public IReadOnlyList<IgnoredEntry> TakeNewlyIgnored()
    {
        lock (_gate)
        {
            var taken = _newlyIgnored.ToList();
            _newlyIgnored.Clear();
            return taken;
        }
    }

    /// <summary>Every symbolic link and folder in the inbox at the last listing, by name.</summary>
    public IReadOnlyList<IgnoredEntry> Ignored()
    {
        lock (_gate)
        {
            return _ignored.OrderBy(i => i.Key, StringComparer.Ordinal).Select(i => new IgnoredEntry(i.Key, i.Value)).ToList();
        }
    }

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

            while (_due.TryPeek(out var dueName, out var dueAt) && dueAt <= now)
            {
                _due.Dequeue();
                // The queue is never cleaned: an entry rescheduled or gone since leaves a stale item behind.
                if (_entries.TryGetValue(dueName, out var dueEntry) && dueEntry.IsWaiting && dueEntry.CheckAt == dueAt)
                {
                    _toCheck.Add(dueName);
                }
            }

            foreach (var name in _toCheck)
            {
                if (_entries.TryGetValue(name, out var entry))
                {
                    Evaluate(entry, now, nowUtc);
                }
            }

            _toCheck.Clear();
            var taken = new List<ReadyFile>();
            while (taken.Count < maxFiles && _ready.Min is { } queued)
            {
                _ready.Remove(queued);
                var entry = _entries[queued.Name];
                entry.Queued = null;
                // Found ready earlier; only this file is looked at again, in case it changed without an event.
                if (Stat(entry, now) && Settled(entry, now, nowUtc) is { } file)
                {
                    entry.InFlight = file;
                    taken.Add(file);
                }
            }

            var nextCheck = _time.GetElapsedTime(now, _nextRescanAt);
            if (_due.TryPeek(out _, out var nextDue))
            {
                nextCheck = Min(nextCheck, _time.GetElapsedTime(now, nextDue));
            }

            // Ready files left over because of maxFiles are ready on the next call without waiting.
            untilNextCheck = _ready.Count > 0 ? TimeSpan.Zero : Max(nextCheck, TimeSpan.FromMilliseconds(1));
            return taken;
        }
    }

    private static int CompareArrival(ReadyFile? a, ReadyFile? b)
    {
        if (a is null || b is null)
        {
            return a is null ? (b is null ? 0 : -1) : 1;
        }

        var byArrival = a.ArrivedAt.CompareTo(b.ArrivedAt);
        if (byArrival != 0)
        {
            return byArrival;
        }

        var byWrite = a.LastWriteUtc.CompareTo(b.LastWriteUtc);
        return byWrite != 0 ? byWrite : string.CompareOrdinal(a.Name, b.Name);
    }

    /// <summary>Looks at a file that is new, may have changed or is due, and queues it when it is complete.</summary>
    private void Evaluate(Entry entry, long now, DateTimeOffset nowUtc)
    {
        if (entry.InFlight is not null || !Stat(entry, now) || entry.Queued is not null)
        {
            // In flight, gone, or unchanged since it was found ready (Stat dequeues it on any change).
            return;
        }

        if (Settled(entry, now, nowUtc) is { } file)
        {
            entry.Queued = file;
            _ready.Add(file);
        }
    }

    /// <summary>Records the file's size and last-write time; false (and forgotten) when it is gone.</summary>
    private bool Stat(Entry entry, long now)
    {
        if (!_probe.TryStat(PathOf(entry), out var size, out var lastWrite))
        {
            Forget(entry);
            return false;
        }

        entry.ArrivedAt ??= lastWrite;
        if (entry.Size != size || entry.LastWriteUtc != lastWrite)
        {
            if (entry.Queued is { } queued)
            {
                _ready.Remove(queued);
                entry.Queued = null;
            }

            entry.Size = size;
            entry.LastWriteUtc = lastWrite;
            entry.StableSince = now;
            entry.RetryAt = now;
        }

        return true;
    }

    /// <summary>
    /// The file as a <see cref="ReadyFile"/> when it is complete now; otherwise schedules its next look.
    /// </summary>
    /// <remarks>
    /// Complete means: no write for at least the settle interval, and an exclusive open succeeds.
    /// "No write" is proven by whichever evidence is longer: how long this watcher has seen size and
    /// last-write time unchanged (monotonic clock), or how old the last-write time itself is (wall
    /// clock). Every write moves the last-write time, so a file last written a settle interval ago
    /// has had no write in that interval even if it was renamed or moved in a moment ago, or the
    /// service only just started: it needs no further wait, which makes renamed-in exports and old
    /// backlogs ready on first sight. A file written recently waits until its last write is settle-old.
    /// A last-write time in the future (the writer's clock ahead of ours) proves nothing and counts as
    /// just written, so such a file waits a full interval of observed quiet, as before.
    /// A slow writer pausing less than the settle interval keeps the last-write time recent, so it is
    /// never taken early.
    /// </remarks>
    private ReadyFile? Settled(Entry entry, long now, DateTimeOffset nowUtc)
    {
        var settle = _options.SettleInterval;
        var observed = _time.GetElapsedTime(entry.StableSince, now);
        var age = nowUtc - entry.LastWriteUtc!.Value;
        var quiet = age > observed ? age : observed;
        if (quiet < settle)
        {
            Schedule(entry, now + Ticks(settle - quiet));
            return null;
        }

        if (now < entry.RetryAt)
        {
            Schedule(entry, entry.RetryAt);
            return null;
        }

        var path = PathOf(entry);
        if (!_probe.CanOpenExclusively(path))
        {
            // Someone (a writer that locks, an editor) still holds it: look again a little later.
            var retry = settle > TimeSpan.Zero ? settle : TimeSpan.FromMilliseconds(250);
            entry.RetryAt = now + Ticks(retry);
            Schedule(entry, entry.RetryAt);
            return null;
        }

        return new ReadyFile(path, entry.Name, entry.ArrivedAt!.Value, entry.Size!.Value, entry.LastWriteUtc.Value);
    }

    private void Schedule(Entry entry, long at)
    {
        entry.CheckAt = at;
        _due.Enqueue(entry.Name, at);
    }

    private void Forget(Entry entry)
    {
        if (entry.Queued is { } queued)
        {
            _ready.Remove(queued);
        }

        _entries.Remove(entry.Name);
    }

    private string PathOf(Entry entry) => Path.Combine(_options.InboxPath, entry.Name);

    private long Ticks(TimeSpan span) => (long)Math.Ceiling(span.TotalSeconds * _time.TimestampFrequency);

    private void Rescan(bool startup)
    {
        var nowUtc = _time.GetUtcNow();
        var present = new HashSet<string>(StringComparer.Ordinal);
        var ignoredNow = new HashSet<string>(StringComparer.Ordinal);
        foreach (var info in new DirectoryInfo(_options.InboxPath).EnumerateFileSystemInfos())
        {
            var name = info.Name;
            if (!InboxFileName.IsCandidate(name))
            {
                continue;
            }

            if ((info.Attributes & FileAttributes.ReparsePoint) != 0 || info is DirectoryInfo)
            {
                // Never read, but said once (TakeNewlyIgnored), so that a folder or link dropped by mistake is noticed.
                ignoredNow.Add(name);
                var kind = (info.Attributes & FileAttributes.ReparsePoint) != 0 ? IgnoredKind.SymbolicLink : IgnoredKind.Folder;
                if (!_ignored.TryGetValue(name, out var known) || known != kind)
                {
                    _ignored[name] = kind;
                    _newlyIgnored.Add(new IgnoredEntry(name, kind));
                }

                continue;
            }

            present.Add(name);
            if (_entries.TryGetValue(name, out var entry))
            {
                // Without events (or with events lost) a rescan is the only news of a write to a waiting file.
                if (entry.IsWaiting)
                {
                    _toCheck.Add(name);
                }

                continue;
            }

            // A backlog found at start-up arrives at its last-write time (set by the first look), so it keeps
            // the order in which it was written.
            _entries[name] = new Entry(name, startup ? null : nowUtc);
            _toCheck.Add(name);
        }

        foreach (var entry in _entries.Values.Where(e => !present.Contains(e.Name)).ToList())
        {
            Forget(entry);
        }

        foreach (var gone in _ignored.Keys.Where(n => !ignoredNow.Contains(n)).ToList())
        {
            _ignored.Remove(gone);
        }

        var now = _time.GetTimestamp();
        _nextRescanAt = now + Ticks(_options.RescanInterval);
    }

    private void DrainEvents(DateTimeOffset nowUtc)
    {
        while (_events.TryDequeue(out var name))
        {
            if (!InboxFileName.IsCandidate(name) || name.Contains(Path.DirectorySeparatorChar, StringComparison.Ordinal))
            {
                continue;
            }

            if (_entries.TryGetValue(name, out var entry))
            {
                if (entry.InFlight is not null)
                {
                    if (!_probe.TryStat(PathOf(entry), out _, out _))
                    {
                        // Moved away by the consumer (or deleted): a new file of that name is a new arrival.
                        _entries.Remove(name);
                    }
                }
                else
                {
                    _toCheck.Add(name);
                }

                continue;
            }

            // Looked at (and dropped again when it does not exist) with the other files to check.
            _entries[name] = new Entry(name, nowUtc);
            _toCheck.Add(name);
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

    private static TaskCompletionSource NewWake() => new(TaskCreationOptions.RunContinuationsAsynchronously);

    private static TimeSpan Min(TimeSpan a, TimeSpan b) => a < b ? a : b;

    private static TimeSpan Max(TimeSpan a, TimeSpan b) => a > b ? a : b;

    private sealed class Entry(string name, DateTimeOffset? arrivedAt)
    {
        public string Name { get; } = name;

        /// <summary>When first seen; null until the first look for a file found at start-up (then its last-write time).</summary>
        public DateTimeOffset? ArrivedAt { get; set; } = arrivedAt;

        public long? Size { get; set; }

        public DateTimeOffset? LastWriteUtc { get; set; }

        public long StableSince { get; set; }

        public long RetryAt { get; set; }

        /// <summary>The scheduled look this entry waits for; older items in the due queue are stale.</summary>
        public long CheckAt { get; set; }

        /// <summary>Its place in the ready queue, while found ready and not yet handed out.</summary>
        public ReadyFile? Queued { get; set; }

        public ReadyFile? InFlight { get; set; }

        public bool IsWaiting => InFlight is null && Queued is null;
    }
}
