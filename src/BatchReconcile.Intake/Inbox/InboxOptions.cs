namespace BatchReconcile.Intake.Inbox;

/// <summary>How an <see cref="InboxWatcher"/> watches one folder.</summary>
public sealed record InboxOptions
{
    /// <param name="inboxPath">The folder exporters drop files into (created at start when missing).</param>
    /// <param name="settleInterval">How long size and last-write time must stay unchanged before a file
    /// counts as complete; zero takes a file as soon as an exclusive open succeeds.</param>
    /// <param name="rescanInterval">How often the whole folder is listed again, because file-system
    /// events can be dropped (buffer overflow, network shares).</param>
    /// <param name="useFileSystemEvents">False to rely on rescans alone.</param>
    public InboxOptions(string inboxPath, TimeSpan settleInterval, TimeSpan rescanInterval, bool useFileSystemEvents = true)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(inboxPath);
        ArgumentOutOfRangeException.ThrowIfLessThan(settleInterval, TimeSpan.Zero);
        ArgumentOutOfRangeException.ThrowIfLessThanOrEqual(rescanInterval, TimeSpan.Zero);
        InboxPath = Path.GetFullPath(inboxPath);
        SettleInterval = settleInterval;
        RescanInterval = rescanInterval;
        UseFileSystemEvents = useFileSystemEvents;
    }

    /// <summary>Absolute path of the inbox folder.</summary>
    public string InboxPath { get; }

    /// <summary>Quiet time required before a file counts as complete.</summary>
    public TimeSpan SettleInterval { get; }

    /// <summary>Time between full listings of the folder.</summary>
    public TimeSpan RescanInterval { get; }

    /// <summary>Whether a FileSystemWatcher reports changes between rescans.</summary>
    public bool UseFileSystemEvents { get; }
}
