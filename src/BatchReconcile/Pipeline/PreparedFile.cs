using BatchReconcile.Intake.Inbox;
using BatchReconcile.Storage.Ingest;

namespace BatchReconcile.Pipeline;

/// <summary>A ready inbox file after hashing, before it is stored (a new file is read and reconciled while it is stored).</summary>
/// <param name="Known">The first ingest of the same content, when the file was seen before.</param>
public sealed record PreparedFile(ReadyFile Source, FileIngest Ingest, KnownFile? Known);
