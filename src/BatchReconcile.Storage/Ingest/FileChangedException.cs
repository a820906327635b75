namespace BatchReconcile.Storage.Ingest;

/// <summary>The file's bytes changed while it was read; nothing of it was stored, and it is to be taken again.</summary>
public sealed class FileChangedException : Exception
{
    public FileChangedException(string fileName)
        : base($"{fileName} changed while it was read (its content no longer gives the hash taken first); nothing of it was stored and it is read again")
    {
        FileName = fileName;
    }

    public FileChangedException()
    {
        FileName = string.Empty;
    }

    public FileChangedException(string message, Exception innerException)
        : base(message, innerException)
    {
        FileName = string.Empty;
    }

    public string FileName { get; }
}
