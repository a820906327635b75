namespace BatchReconcile.Storage.Ingest;

/// <summary>What storing a batch of a file does, compared with what is already stored.</summary>
public enum BatchDisposition
{
    /// <summary>The batch id was never stored: it becomes revision 1.</summary>
    New,

    /// <summary>The batch id is stored with other content: it becomes the next revision and the current one is superseded.</summary>
    Revision,

    /// <summary>The batch's content equals its current revision (<see cref="BatchContentHash"/>): nothing is stored for it.</summary>
    Unchanged,
}
