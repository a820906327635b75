namespace BatchReconcile.Intake.Archive;

/// <summary>A file moved to quarantine and the report written beside it.</summary>
/// <param name="File">The move.</param>
/// <param name="ReportPath">The report: the quarantined file's name plus <c>.report.txt</c>.</param>
public sealed record QuarantinedFile(MovedFile File, string ReportPath);
