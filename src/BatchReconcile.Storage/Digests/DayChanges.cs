namespace BatchReconcile.Storage.Digests;

/// <summary>
/// How many stored changes have touched a production day, by kind (counted by the database's triggers; they
/// only grow). A digest write records the counts it was gathered at; the difference to the day's counts now is
/// what arrived since.
/// </summary>
/// <param name="Batches">First revisions of batches stored for the day.</param>
/// <param name="Revisions">Later revisions (re-exports) stored for the day.</param>
/// <param name="Withdrawn">Revisions of the day replaced by a revision that belongs to another day.</param>
/// <param name="Reviews">Review decisions on the day's current flags.</param>
public sealed record DayChanges(int Batches, int Revisions, int Withdrawn, int Reviews)
{
    public static DayChanges None { get; } = new(0, 0, 0, 0);

    public int Total => Batches + Revisions + Withdrawn + Reviews;

    /// <summary>What came after <paramref name="earlier"/> (never negative).</summary>
    public DayChanges Since(DayChanges earlier)
    {
        ArgumentNullException.ThrowIfNull(earlier);
        return new(
            Math.Max(0, Batches - earlier.Batches),
            Math.Max(0, Revisions - earlier.Revisions),
            Math.Max(0, Withdrawn - earlier.Withdrawn),
            Math.Max(0, Reviews - earlier.Reviews));
    }
}
