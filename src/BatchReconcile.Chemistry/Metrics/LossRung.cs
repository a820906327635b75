namespace BatchReconcile.Chemistry.Metrics;

/// <summary>One rung of the loss ladder.</summary>
/// <param name="Kind">Which rung.</param>
/// <param name="Kg">Mass in kg; may be negative (never clipped) so that the ladder always adds up.</param>
/// <param name="PercentOfInput">100·Kg/m_in; null when nothing was charged.</param>
public sealed record LossRung(LossRungKind Kind, double Kg, double? PercentOfInput);
