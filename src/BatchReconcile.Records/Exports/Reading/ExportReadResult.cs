namespace BatchReconcile.Records.Exports.Reading;

/// <summary>One export file read whole: either all its batches, or every problem that rejects it.</summary>
public sealed class ExportReadResult
{
    private ExportReadResult(string fileName, IReadOnlyList<BatchRecord> batches, IReadOnlyList<ExportError> errors)
    {
        FileName = fileName;
        Batches = batches;
        Errors = errors;
    }

    public string FileName { get; }

    /// <summary>The batches in order of first appearance in the file; empty when there are errors.</summary>
    public IReadOnlyList<BatchRecord> Batches { get; }

    /// <summary>Every problem found, in line order (capped, with a last "... and N more" entry).</summary>
    public IReadOnlyList<ExportError> Errors { get; }

    public bool IsValid => Errors.Count == 0;

    internal static ExportReadResult Accepted(string fileName, IReadOnlyList<BatchRecord> batches) => new(fileName, batches, []);

    internal static ExportReadResult Rejected(string fileName, IReadOnlyList<ExportError> errors)
    {
        if (errors.Count == 0)
        {
            throw new ArgumentException("A rejected file has at least one error.", nameof(errors));
        }

        return new(fileName, [], errors);
    }
}
