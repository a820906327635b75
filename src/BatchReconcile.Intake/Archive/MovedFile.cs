namespace BatchReconcile.Intake.Archive;

/// <summary>Where a file went.</summary>
/// <param name="SourcePath">Where it was.</param>
/// <param name="DestinationPath">Where it is now (a suffix like <c> (2)</c> was added on a name clash).</param>
/// <param name="CopiedAcrossVolumes">True when the destination is on another file system, so the file was
/// copied, flushed to disk and then deleted instead of renamed.</param>
public sealed record MovedFile(string SourcePath, string DestinationPath, bool CopiedAcrossVolumes);
