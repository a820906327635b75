using BatchReconcile.Chemistry.Metrics;

namespace BatchReconcile.Reconciliation.Outcomes;

/// <summary>One rung of the loss ladder: where part of the charged mass went.</summary>
/// <param name="Key">Stable identifier, e.g. "auxiliaries-not-recovered", "yield-loss-unexplained".</param>
/// <param name="Label">Plain-language name for reports.</param>
/// <param name="Kg">Mass in kg; may be negative (yield over 100 % makes the yield-loss rungs negative).</param>
/// <param name="PctOfCharged">Kg as % of all charged mass.</param>
public sealed record LadderRung(string Key, string Label, double Kg, double PctOfCharged)
{
    /// <summary>
    /// The rung material by material where it is tied to materials: "auxiliaries-not-recovered" per auxiliary material
    /// (charged less recovered of it), "excess-reactants" per reactant (charged less what the equation needs at the
    /// limiting extent). They add up to <see cref="Kg"/> up to floating-point rounding. Empty for the other rungs and
    /// for rungs stored before parts were kept.
    /// </summary>
    public IReadOnlyList<LadderPart> Parts { get; init; } = [];

    /// <summary>Value equality including the parts, element by element.</summary>
    public bool Equals(LadderRung? other) =>
        other is not null
        && string.Equals(Key, other.Key, StringComparison.Ordinal)
        && string.Equals(Label, other.Label, StringComparison.Ordinal)
        && Kg.Equals(other.Kg)
        && PctOfCharged.Equals(other.PctOfCharged)
        && Parts.SequenceEqual(other.Parts);

    public override int GetHashCode() => HashCode.Combine(Key, Label, Kg, PctOfCharged, Parts.Count);
}
