using BatchReconcile.Reconciliation.Tests.Support;
using BatchReconcile.Records.Exports;

namespace BatchReconcile.Reconciliation.Tests;

/// <summary>The same ENB charge written in each unit of the contract; the kg figures follow the conversion.</summary>
public class UnitsTests
{
    [Theory]
    [InlineData(200.0, "kg", 200.0)]
    [InlineData(200_000.0, "g", 200.0)]
    [InlineData(200_000_000.0, "mg", 200.0)]
    [InlineData(0.2, "t", 200.0)]
    [InlineData(440.0, "lb", 199.5806428)] // 440 × 0.45359237 kg exactly (international yard and pound agreement, 1959)
    public void Charge_in_any_unit(double quantity, string unit, double kg)
    {
        Assert.True(MassUnit.TryParse(unit, out var massUnit));
        var rows = Hydrogenation.Rows()
            .Without(r => r.Entry == EntryKind.Charge && r.Material == "ENB")
            .Charge(Hydrogenation.S, "ENB", quantity, massUnit, 98.5);
        var o = Hydrogenation.Reconcile(rows);

        // m_in = ENB + 6.5 + 1000 + 4.0 kg; m_theo = kg × 0.985 / 195.174 × 165.192.
        Close.Equal(kg + 1010.5, o.MassInKg, "m_in");
        Close.Equal(kg * 0.985 / Mw.EthylNitrobenzoate * Mw.Benzocaine, o.TheoreticalKg, "m_theo");
        Close.Equal(kg * 0.985 + 6.5, o.ReactantMassKg, "m_react (assay-corrected)");
    }
}
