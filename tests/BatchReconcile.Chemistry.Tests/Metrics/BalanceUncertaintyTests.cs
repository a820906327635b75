using BatchReconcile.Chemistry.Metrics;

namespace BatchReconcile.Chemistry.Tests.Metrics;

/// <summary>Standard uncertainty of weighings combined in quadrature (JCGM 100:2008 (GUM) 5.1.2).</summary>
public class BalanceUncertaintyTests
{
    [Theory]
    // u = sqrt((rel·m)² + abs²)
    [InlineData(100.0, 0.001, 0.01, 0.10049875621)]  // sqrt(0.1² + 0.01²) = sqrt(0.0101)
    [InlineData(0.0, 0.001, 0.01, 0.01)]             // absolute part only
    [InlineData(2000.0, 0.0005, 0.0, 1.0)]           // relative part only: 0.0005 * 2000
    [InlineData(300.0, 0.0004, 0.09, 0.15)]          // sqrt(0.12² + 0.09²) = sqrt(0.0225)
    public void One_weighing(double massKg, double relative, double absoluteKg, double expectedKg) =>
        Assert.Equal(expectedKg, BalanceCheckSettings.Create(1, relative, absoluteKg).StandardUncertaintyKg(massKg), 10);

    [Fact]
    public void Rows_combine_in_quadrature()
    {
        // One charge of 100 kg and one waste of 50 kg, rel 0.001, abs 0.01 kg, no vented gas (all sensitivities 1):
        // u1² = 0.1² + 0.01² = 0.0101; u2² = 0.05² + 0.01² = 0.0026; u_c = sqrt(0.0127) = 0.112694 kg; k·u_c = 0.225389 kg.
        var input = StepInput.Create(
            Chem.Esterification(),
            [ChargeRow.Create("BZOH", 100.0)],
            [OutputRow.Waste(50.0)],
            BalanceCheckSettings.Create(1.0, 0.001, 0.01));
        var b = StepMetrics.Compute(input).Balance;
        Assert.Equal(Math.Sqrt(0.0127), b.CombinedStandardUncertaintyKg, 12);
        Assert.Equal(0.112694, b.CombinedStandardUncertaintyKg, 6);
        Assert.Equal(2 * 0.112694, b.ExpandedUncertaintyKg, 5);
        Assert.Equal(2.0, b.CoverageFactor);
    }

    [Fact]
    public void Product_rows_weigh_more_when_the_equation_vents_gas()
    {
        // Boc step: the vent estimate scales with m_act, so c_product = 1 + 1.0 * 100.117 / 143.614 = 1.697126.
        // One product row of 100 kg @ 100 % only, rel 0.001, abs 0: u = 0.1 kg -> u_c = 0.1697126 kg.
        var input = StepInput.Create(Chem.BocDeprotection(), [], [OutputRow.Product(100.0)], BalanceCheckSettings.Create(1.0, 0.001, 0.0));
        Assert.Equal(0.1 * (1 + (100.117 / 143.614)), StepMetrics.Compute(input).Balance.CombinedStandardUncertaintyKg, 12);
    }
}
