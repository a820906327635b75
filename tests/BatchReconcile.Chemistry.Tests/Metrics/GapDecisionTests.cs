using BatchReconcile.Chemistry.Metrics;

namespace BatchReconcile.Chemistry.Tests.Metrics;

/// <summary>
/// A gap is flagged only beyond both the tolerance and k·u_c (project spec; k = 2, JCGM 100:2008 (GUM) 6.3.3).
/// </summary>
public class GapDecisionTests
{
    [Theory]
    [InlineData(5.0, 2.0, 3.0, true)]    // beyond both
    [InlineData(5.0, 2.0, 6.0, false)]   // beyond tolerance, within k·u
    [InlineData(5.0, 6.0, 3.0, false)]   // within tolerance, beyond k·u
    [InlineData(5.0, 6.0, 7.0, false)]   // within both
    [InlineData(5.0, 5.0, 1.0, false)]   // equal to the tolerance is not beyond it
    [InlineData(5.0, 1.0, 5.0, false)]   // equal to k·u is not beyond it
    [InlineData(-5.0, 0.0, 0.0, false)]  // a negative amount is never significant in its own direction
    [InlineData(0.001, 0.0, 0.0, true)]  // zero tolerance and zero uncertainty: any positive amount
    public void Significance_needs_both_limits(double amountKg, double toleranceKg, double expandedKg, bool expected) =>
        Assert.Equal(expected, GapSignificance.IsSignificant(amountKg, toleranceKg, expandedKg));

    /// <summary>
    /// Whole-step table. Charge 1000 kg of reactant A, outputs: product and waste; no vented gas.
    /// Tolerance % of 1000 kg; u per row = rel·m (abs 0); u_c = rel·sqrt(1000² + product² + waste²).
    /// </summary>
    [Theory]
    // gap 15 kg; tol 10 kg; rel 0.001: u_c = 0.001*sqrt(1000² + 500² + 485²) = 1.2193, k·u = 2.4386 -> loss
    [InlineData(500.0, 485.0, 1.0, 0.001, true, false)]
    // gap 15 kg > tol 10 kg, but rel 0.01: k·u = 24.386 kg -> within uncertainty, not flagged
    [InlineData(500.0, 485.0, 1.0, 0.01, false, false)]
    // gap 15 kg > k·u 2.4386 kg, but tol 2 % = 20 kg -> not flagged
    [InlineData(500.0, 485.0, 2.0, 0.001, false, false)]
    // outputs 1030 kg: surplus 30 kg > tol 10 kg and > k·u = 0.002*sqrt(1000² + 500² + 530²) = 2.4419 -> surplus
    [InlineData(500.0, 530.0, 1.0, 0.001, false, true)]
    // surplus 30 kg within tol 5 % = 50 kg -> not flagged
    [InlineData(500.0, 530.0, 5.0, 0.001, false, false)]
    public void Step_level_decision_table(double productKg, double wasteKg, double tolerancePct, double relative, bool loss, bool surplus)
    {
        var input = StepInput.Create(
            StepReaction.Create([Chem.T("A", 1, 100.0)], Chem.T("P", 1, 100.0)),
            [ChargeRow.Create("A", 1000.0)],
            [OutputRow.Product(productKg), OutputRow.Waste(wasteKg)],
            BalanceCheckSettings.Create(tolerancePct, relative, 0.0));
        var b = StepMetrics.Compute(input).Balance;

        double expectedU = relative * Math.Sqrt((1000.0 * 1000.0) + (productKg * productKg) + (wasteKg * wasteKg));
        Assert.Equal(expectedU, b.CombinedStandardUncertaintyKg, 10);
        Assert.Equal(tolerancePct * 10.0, b.ToleranceKg, 10);
        Assert.Equal(1000.0 - productKg - wasteKg, b.GapKg, 10);
        Assert.Equal(loss, b.IsSignificantLoss);
        Assert.Equal(surplus, b.IsSignificantSurplus);
    }
}
