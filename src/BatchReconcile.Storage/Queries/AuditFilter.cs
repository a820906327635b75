namespace BatchReconcile.Storage.Queries;

/// <summary>Which audit entries <c>BatchStore.ListAudit</c> gives.</summary>
/// <param name="From">Entries written at or after this instant; null from the first.</param>
/// <param name="To">Entries written before this instant (exclusive); null up to the last.</param>
/// <param name="Kind">
/// A kind (<c>flag.review</c>) or a family of kinds (<c>flag</c> gives every <c>flag.*</c>, <c>ingest</c> every
/// <c>ingest.*</c>); null for all.
/// </param>
/// <remarks>The command line turns production days into these instants with the plant's calendar.</remarks>
public sealed record AuditFilter(DateTimeOffset? From = null, DateTimeOffset? To = null, string? Kind = null);
