namespace BatchReconcile.Storage;

/// <summary>
/// The database cannot be used by this program: it is newer than the program, or the file system
/// refuses what the store needs. The message says what to do; the host stops with it.
/// </summary>
public sealed class StoreException : Exception
{
    public StoreException(string message)
        : base(message)
    {
    }

    public StoreException(string message, Exception innerException)
        : base(message, innerException)
    {
    }

    public StoreException()
    {
    }

    /// <summary>
    /// The fault lies with the database and may pass (locked, disk full, read-only, I/O): nothing of the operation
    /// was stored, and the same operation may be tried again later. The service waits and retries.
    /// </summary>
    public bool Transient { get; init; }

    /// <summary>
    /// The operation was refused for what the stores hold, before anything was changed (a copy into a site that already
    /// holds data, or from a store at another schema version): not a fault, and trying again changes nothing.
    /// </summary>
    public bool Refused { get; init; }
}
