namespace BatchReconcile.Reconciliation.Outcomes;

/// <summary>One rung of the loss ladder: where part of the charged mass went.</summary>
/// <param name="Key">Stable identifier, e.g. "auxiliaries-not-recovered", "yield-loss-unexplained".</param>
/// <param name="Label">Plain-language name for reports.</param>
/// <param name="Kg">Mass in kg; may be negative (yield over 100 % makes the yield-loss rungs negative).</param>
/// <param name="PctOfCharged">Kg as % of all charged mass.</param>
public sealed record LadderRung(string Key, string Label, double Kg, double PctOfCharged);
