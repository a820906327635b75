namespace BatchReconcile.Storage.Queries;

/// <summary>A row of a stored revision as it was read: its line in the file and its columns in header order.</summary>
public sealed record RawRowView(int Line, IReadOnlyList<KeyValuePair<string, string>> Fields);
