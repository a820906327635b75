namespace BatchReconcile.Storage.Queries;

/// <summary>Counts of one production day over current revisions.</summary>
/// <param name="Batches">Batches whose production day it is (completed that day).</param>
/// <param name="Unresolved">Flags whose state is not yet closed.</param>
/// <param name="StepsReconciled">Recipe steps with rows in the record, reconciled.</param>
public sealed record DayCounts(DateOnly Day, int Batches, int Critical, int Major, int Minor, int Unresolved, int StepsReconciled)
{
    public int Flags => Critical + Major + Minor;
}
