namespace BatchReconcile.Storage.Queries;

/// <summary>Counts of one production day over current revisions.</summary>
/// <param name="Unresolved">Flags whose state is not yet closed.</param>
public sealed record DayCounts(DateOnly Day, int Batches, int Critical, int Major, int Minor, int Unresolved)
{
    public int Flags => Critical + Major + Minor;
}
