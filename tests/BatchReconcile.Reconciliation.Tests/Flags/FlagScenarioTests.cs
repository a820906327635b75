using BatchReconcile.Reconciliation.Tests.Support;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Records.Exports;

namespace BatchReconcile.Reconciliation.Tests.Flags;

/// <summary>
/// Which flags each variation of the base hydrogenation batch raises (<see cref="Hydrogenation"/>; hand figures in
/// <see cref="HydrogenationFiguresTests"/>): m_theo = 166.738 kg, tolerance 2 % of 1210.5 kg = 24.21 kg, base gap 3.95 kg.
/// </summary>
public class FlagScenarioTests
{
    private const double Theo = 197.0 / Mw.EthylNitrobenzoate * Mw.Benzocaine;

    public static TheoryData<string, FlagCode[]> Scenarios => new()
    {
        { "base", [] },
        { "product 140.0 kg: Y = 138.88 / 166.738 = 83.29 %", [FlagCode.YieldLow] },
        { "product 165.0 kg @ 99.9: Y = 164.835 / 166.738 = 98.86 %", [FlagCode.YieldHigh] },
        { "product 170.0 kg @ 100: Y = 101.96 %", [FlagCode.YieldOverTheory] },
        { "yield exactly 88 %", [] },
        { "yield exactly 98 %", [] },
        { "H2 7.5 kg: 7.5 / 2.016 / 1.009356 = 3.686 equiv", [FlagCode.EquivalentsOutOfRange] },
        { "residue analysed 5.0 %: 5.6 kg = 3.36 % of theoretical", [FlagCode.ProductInWaste] },
        { "filter wash 20 kg BZC @ 20 %: 4.0 + 1.68 kg = 3.41 %", [FlagCode.ProductInWaste] },
        { "no H2 charged", [FlagCode.ReactantMissing] },
        { "residue 80 kg: gap 35.95 kg", [FlagCode.BalanceGap] },
        { "residue 140 kg: surplus 24.05 kg, within 24.21 kg", [] },
        { "residue 145 kg: surplus 29.05 kg", [FlagCode.BalanceSurplus] },
    };

    [Theory]
    [MemberData(nameof(Scenarios))]
    public void Scenario_raises_exactly(string scenario, FlagCode[] expected)
    {
        var o = Hydrogenation.Reconcile(Rows(scenario));
        Assert.Equal(expected, o.Flags.Select(f => f.Code).ToArray());
        Assert.All(o.Flags, f => Assert.Equal(Hydrogenation.S, f.Step));
    }

    internal static BatchBuilder Rows(string scenario) => scenario.Split(':')[0] switch
    {
        "base" => Hydrogenation.Rows(),
        "product 140.0 kg" => Hydrogenation.Rows(productKg: 140.0),
        "product 165.0 kg @ 99.9" => Hydrogenation.Rows(productKg: 165.0, productAssay: 99.9),
        "product 170.0 kg @ 100" => Hydrogenation.Rows(productKg: 170.0, productAssay: 100),
        "yield exactly 88 %" => Hydrogenation.Rows(productKg: 0.88 * Theo, productAssay: 100),
        "yield exactly 98 %" => Hydrogenation.Rows(productKg: 0.98 * Theo, productAssay: 100),
        "H2 7.5 kg" => Hydrogenation.Rows(hydrogenKg: 7.5),
        "residue analysed 5.0 %" => Hydrogenation.Rows(residueProductPct: 5.0),
        "filter wash 20 kg BZC @ 20 %" => Hydrogenation.Rows().Waste(Hydrogenation.S, "filter wash", 20.0, MassUnit.Kilogram, "BZC", 20.0),
        "no H2 charged" => Hydrogenation.Rows().Without(r => r.Entry == EntryKind.Charge && r.Material == "H2"),
        "residue 80 kg" => Hydrogenation.Rows(residueKg: 80.0),
        "residue 140 kg" => Hydrogenation.Rows(residueKg: 140.0),
        "residue 145 kg" => Hydrogenation.Rows(residueKg: 145.0),
        _ => throw new ArgumentException($"No scenario '{scenario}'.", nameof(scenario)),
    };
}
