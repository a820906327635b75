using BatchReconcile.Records.Exports;

namespace BatchReconcile.Storage.Ingest;

/// <summary>
/// How a streamed file ended once its producer has handed over every batch it will
/// (<see cref="FileIngest.Streamed"/>): valid, so what was handed over is kept; or broken, so the
/// store rolls the file back and records it as quarantined with these errors and this report.
/// </summary>
public sealed record StreamedFileEnd
{
    private StreamedFileEnd(IReadOnlyList<ExportError> errors, string? report)
    {
        Errors = errors;
        Report = report;
    }

    /// <summary>The file met the contract to its last row.</summary>
    public static StreamedFileEnd Valid { get; } = new([], null);

    /// <summary>
    /// The file changed while it was read (its bytes no longer give the hash taken before): what was handed over is
    /// rolled back and nothing is recorded, so that the file is taken again, as a new arrival, with its new content.
    /// </summary>
    public static StreamedFileEnd Changed { get; } = new([], null) { IsChanged = true };

    /// <summary>See <see cref="Changed"/>.</summary>
    public bool IsChanged { get; private init; }

    /// <summary>Every contract error found (empty when valid).</summary>
    public IReadOnlyList<ExportError> Errors { get; }

    /// <summary>The human-readable quarantine report; null when valid.</summary>
    public string? Report { get; }

    public bool IsValid => Errors.Count == 0 && !IsChanged;

    /// <summary>The file broke the contract (possibly after some of its batches were handed over).</summary>
    /// <exception cref="ArgumentException">No errors given.</exception>
    public static StreamedFileEnd Rejected(IReadOnlyList<ExportError> errors, string? report)
    {
        ArgumentNullException.ThrowIfNull(errors);
        if (errors.Count == 0)
        {
            throw new ArgumentException("A rejected file needs at least one error.", nameof(errors));
        }

        return new StreamedFileEnd(errors, report);
    }
}
