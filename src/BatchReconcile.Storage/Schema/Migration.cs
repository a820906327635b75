namespace BatchReconcile.Storage.Schema;

/// <summary>One step of the schema's history: after it runs, <c>PRAGMA user_version</c> is <paramref name="Version"/>.</summary>
/// <param name="Version">1, 2, 3 ... without gaps.</param>
/// <param name="Description">What the step changes, for the log and for people reading the database.</param>
/// <param name="Sql">Statements run inside one transaction with the version update.</param>
/// <param name="Code">
/// Work SQL alone cannot do (hashing, for one), run after <paramref name="Sql"/> in the same transaction.
/// </param>
/// <param name="FinishSql">Statements run after <paramref name="Code"/>, still in the same transaction.</param>
public sealed record Migration(int Version, string Description, string Sql, Action<MigrationContext>? Code = null, string FinishSql = "");
