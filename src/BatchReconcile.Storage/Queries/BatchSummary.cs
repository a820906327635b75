namespace BatchReconcile.Storage.Queries;

/// <summary>One line of a list of batches: the current revision and how many flags it carries.</summary>
public sealed record BatchSummary(string BatchId, int Revision, string Recipe, int RecipeVersion, DateOnly ProductionDay, int FlagCount);
