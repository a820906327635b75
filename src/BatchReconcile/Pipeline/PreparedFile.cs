using BatchReconcile.Intake.Inbox;
using BatchReconcile.Storage.Ingest;

namespace BatchReconcile.Pipeline;

/// <summary>A ready inbox file after hashing, reading and reconciling, before it is stored.</summary>
/// <param name="Known">The first ingest of the same content, when the file was seen before.</param>
public sealed record PreparedFile(ReadyFile Source, FileIngest Ingest, KnownFile? Known);
