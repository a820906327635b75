using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Records.Exports;

namespace BatchReconcile.Storage.Queries;

/// <summary>One revision of a batch with everything <c>batches show</c> prints.</summary>
/// <param name="RevisionCount">How many revisions the batch has in all.</param>
/// <param name="SupersededByRevision">The revision that replaced this one; null while it is current.</param>
/// <param name="ContentSha256">The batch's content hash (see <see cref="Ingest.BatchContentHash"/>).</param>
/// <param name="SourceFile">The file the revision came from, and that file's SHA-256.</param>
public sealed record BatchView(
    string BatchId,
    int Revision,
    int RevisionCount,
    string Recipe,
    int RecipeVersion,
    DateOnly ProductionDay,
    DateTimeOffset? LastOutputAt,
    DateTimeOffset StoredAt,
    DateTimeOffset? SupersededAt,
    int? SupersededByRevision,
    string ContentSha256,
    string SourceFile,
    string SourceSha256,
    IReadOnlyList<StoredStep> Steps)
{
    /// <summary>The route yield as stored (docs/computation.md, "Route yield").</summary>
    public RouteYield Route { get; init; } = RouteYield.NotComputable("not stored");

    /// <summary>Later steps charging an earlier step's product; null for revisions stored before links were kept.</summary>
    public IReadOnlyList<IntermediateLink>? Links { get; init; }

    /// <summary>How <see cref="RecipeVersion"/> was chosen; null when unknown (a revision stored before this was recorded).</summary>
    public RecipeVersionSource? RecipeVersionSource { get; init; }

    public bool IsCurrent => SupersededAt is null;

    public IEnumerable<StoredFlag> Flags => Steps.SelectMany(s => s.Flags);
}
