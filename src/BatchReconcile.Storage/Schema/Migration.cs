namespace BatchReconcile.Storage.Schema;

/// <summary>One step of the schema's history: after it runs, <c>PRAGMA user_version</c> is <paramref name="Version"/>.</summary>
/// <param name="Version">1, 2, 3 ... without gaps.</param>
/// <param name="Description">What the step changes, for the log and for people reading the database.</param>
/// <param name="Sql">Statements run inside one transaction with the version update.</param>
public sealed record Migration(int Version, string Description, string Sql);
