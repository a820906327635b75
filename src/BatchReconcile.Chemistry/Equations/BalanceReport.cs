namespace BatchReconcile.Chemistry.Equations;

/// <summary>The outcome of <see cref="BalanceCheck.Check"/>: every element or charge that does not balance.</summary>
public sealed class BalanceReport
{
    internal BalanceReport(IReadOnlyList<Imbalance> imbalances)
    {
        Imbalances = imbalances;
    }

    public bool IsBalanced => Imbalances.Count == 0;

    /// <summary>Elements in the order they first appear in the equation, then charge.</summary>
    public IReadOnlyList<Imbalance> Imbalances { get; }

    public override string ToString() =>
        IsBalanced ? "balanced" : string.Join("; ", Imbalances.Select(i => i.Message));
}
