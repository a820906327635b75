namespace BatchReconcile.Storage;

/// <summary>How hard SQLite works to get a commit onto the disk before it returns (PRAGMA synchronous).</summary>
public enum SynchronousMode
{
    /// <summary>
    /// The write-ahead log is flushed to disk at every commit: a committed file survives a power cut
    /// or an OS crash. The default, because the host moves the export file out of the inbox right
    /// after the commit (docs/storage.md).
    /// </summary>
    Full,

    /// <summary>
    /// The log is flushed only at checkpoints: safe against a crash of the program, but the last
    /// commits can be lost in a power cut or an OS crash.
    /// </summary>
    Normal,
}
