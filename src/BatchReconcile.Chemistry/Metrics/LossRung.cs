namespace BatchReconcile.Chemistry.Metrics;

/// <summary>One rung of the loss ladder.</summary>
/// <param name="Kind">Which rung.</param>
/// <param name="Kg">Mass in kg; may be negative (never clipped) so that the ladder always adds up.</param>
/// <param name="PercentOfInput">100·Kg/m_in; null when nothing was charged.</param>
public sealed record LossRung(LossRungKind Kind, double Kg, double? PercentOfInput)
{
    /// <summary>
    /// The rung material by material, for the rungs tied to materials (<see cref="LossRungKind.AuxiliariesNotRecovered"/>,
    /// <see cref="LossRungKind.ExcessReactants"/>); empty for the others. When not empty the parts add up to <see cref="Kg"/>
    /// up to floating-point rounding (see <see cref="StepMetrics"/>).
    /// </summary>
    public IReadOnlyList<LadderPart> Parts { get; init; } = [];
}
