namespace BatchReconcile.Storage.Copy;

/// <summary>What <see cref="BatchStore.CopyTo(BatchStore)"/> copied: the rows of each table, in the order they were copied.</summary>
/// <param name="Source">The SQLite file copied from.</param>
/// <param name="Target">Where the copy went (server, database, schema; never the password).</param>
/// <param name="AuditHighWater">The highest audit id ever given in the source (SQLite's sequence of <c>audit_event</c>), now the
/// target's <c>audit_high_water</c>; null when the source never had an audit entry.</param>
/// <param name="Elapsed">From reading the source to the commit of the target.</param>
public sealed record StoreCopyResult(string Source, string Target, IReadOnlyList<TableCopy> Tables, long? AuditHighWater, TimeSpan Elapsed)
{
    /// <summary>
    /// True when the target's per-row bookkeeping triggers (day change counts, audit high water) were off during the copy and their
    /// work done once; false when the role does not own the tables and the copy ran with them on (slower on a large store).
    /// </summary>
    public bool TriggersSkipped { get; init; }

    /// <summary>Rows copied over all tables.</summary>
    public long Rows => Tables.Sum(t => t.Rows);

    /// <summary>The rows of one table (0 when the table is not one of <see cref="Tables"/>).</summary>
    public long RowsOf(string table) => Tables.FirstOrDefault(t => string.Equals(t.Table, table, StringComparison.Ordinal))?.Rows ?? 0;
}

/// <summary>One table of a copy and its rows (the same number in the source and, after the copy, in the target).</summary>
public sealed record TableCopy(string Table, long Rows)
{
    /// <summary>How long the table took, counting its rows in both stores.</summary>
    public TimeSpan Elapsed { get; init; }
}
