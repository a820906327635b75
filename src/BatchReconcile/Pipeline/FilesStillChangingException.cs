namespace BatchReconcile.Pipeline;

/// <summary>
/// Files of a group changed each time they were read (<see cref="IngestPipeline.MaxReads"/> reads): nothing of
/// them was stored or moved and they stay in the inbox. The other files of the group were handled as usual;
/// their outcomes are in <see cref="Done"/>.
/// </summary>
public sealed class FilesStillChangingException : IOException
{
    public FilesStillChangingException(IReadOnlyList<FileOutcome> done, IReadOnlyList<string> left)
        : base($"{string.Join(", ", left)} changed each of the {IngestPipeline.MaxReads} times it was read; left in the inbox to settle")
    {
        Done = done;
        Left = left;
    }

    public FilesStillChangingException()
        : this([], [])
    {
    }

    public FilesStillChangingException(string message)
        : base(message)
    {
        Done = [];
        Left = [];
    }

    public FilesStillChangingException(string message, Exception innerException)
        : base(message, innerException)
    {
        Done = [];
        Left = [];
    }

    /// <summary>Outcomes of the files of the group that were stored, archived or quarantined, in group order.</summary>
    public IReadOnlyList<FileOutcome> Done { get; }

    /// <summary>Names of the files left in the inbox.</summary>
    public IReadOnlyList<string> Left { get; }
}
