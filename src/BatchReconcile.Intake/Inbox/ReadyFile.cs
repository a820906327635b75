namespace BatchReconcile.Intake.Inbox;

/// <summary>
/// A complete file in the inbox, handed to the consumer. <paramref name="ArrivedAt"/> is when the
/// service first saw the file (UTC), or its last-write time when it was already there at start-up;
/// it is the production-day fallback for a batch whose rows carry no time.
/// </summary>
/// <param name="FullPath">Absolute path of the file in the inbox.</param>
/// <param name="Name">File name without folder.</param>
/// <param name="ArrivedAt">Arrival time (UTC) used for ordering.</param>
/// <param name="Size">Size in bytes when it was found complete.</param>
/// <param name="LastWriteUtc">Last-write time when it was found complete.</param>
public sealed record ReadyFile(string FullPath, string Name, DateTimeOffset ArrivedAt, long Size, DateTimeOffset LastWriteUtc);
