using BatchReconcile.Intake.Inbox;
using BatchReconcile.Storage.Ingest;

namespace BatchReconcile.Pipeline;

/// <summary>A ready inbox file after hashing, before it is stored (a new file is read and reconciled while it is stored).</summary>
/// <param name="Known">The first ingest of the same content, when the file was seen before.</param>
/// <param name="Content">The file's bytes when it was small enough to be read once into memory (what was hashed and parsed).</param>
/// <param name="ReadPath">Where a large file was hashed and parsed: a hidden second name of it (<see cref="Intake.Inbox.ReadingLink"/>), or its own path.</param>
public sealed record PreparedFile(ReadyFile Source, FileIngest Ingest, KnownFile? Known, byte[]? Content = null, string? ReadPath = null);
