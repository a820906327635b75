namespace BatchReconcile.Intake.Inbox;

/// <summary>
/// The two disk looks that decide whether an inbox file is complete. A seam so tests can count
/// how many looks a backlog costs; production uses <see cref="FileProbe"/>.
/// </summary>
internal interface IFileProbe
{
    /// <summary>Size and last-write time of a regular file; false when it is gone, a folder or a link.</summary>
    bool TryStat(string path, out long size, out DateTimeOffset lastWriteUtc);

    /// <summary>True when nobody holds the file in a way that blocks an exclusive open.</summary>
    bool CanOpenExclusively(string path);
}
