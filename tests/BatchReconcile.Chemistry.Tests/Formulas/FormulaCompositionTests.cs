using BatchReconcile.Chemistry.Formulas;

namespace BatchReconcile.Chemistry.Tests.Formulas;

/// <summary>Element counts and charges as read from the notation; the expected counts are worked out by hand from the text.</summary>
public class FormulaCompositionTests
{
    public static TheoryData<string, string, int> Cases => new()
    {
        // text, expected counts ("Symbol=count;..."), charge
        { "H2O", "H=2;O=1", 0 },
        { "C6H12O6", "C=6;H=12;O=6", 0 },
        { "Fe0.95O", "Fe=0.95;O=1", 0 },
        { "La0.7Sr0.3MnO3", "La=0.7;Sr=0.3;Mn=1;O=3", 0 },
        { "YBa2Cu3O6.95", "Y=1;Ba=2;Cu=3;O=6.95", 0 },
        { "Ca3(PO4)2", "Ca=3;P=2;O=8", 0 },
        { "K4[Fe(CN)6]", "K=4;Fe=1;C=6;N=6", 0 },
        { "{[Co(NH3)4Cl2]}Cl", "Co=1;N=4;H=12;Cl=3", 0 },
        { "CuSO4·5H2O", "Cu=1;S=1;O=9;H=10", 0 },
        { "CuSO4•5H2O", "Cu=1;S=1;O=9;H=10", 0 },
        { "CuSO4.5H2O", "Cu=1;S=1;O=9;H=10", 0 },
        { "CuSO4*5H2O", "Cu=1;S=1;O=9;H=10", 0 },
        { "Na2CO3.10H2O", "Na=2;C=1;O=13;H=20", 0 },
        { "CaSO4*0.5H2O", "Ca=1;S=1;O=4.5;H=1", 0 },
        { "CaSO4.0.5H2O", "Ca=1;S=1;O=4.5;H=1", 0 },
        { "CaSO4·0.5H2O", "Ca=1;S=1;O=4.5;H=1", 0 },
        { "2H2O", "H=4;O=2", 0 },
        { "NaCl.H2O", "Na=1;Cl=1;H=2;O=1", 0 },
        { "Fe1.5", "Fe=1.5", 0 },
        { "(Fe0.5)3O", "Fe=1.5;O=1", 0 },
        { "CH3COO^-", "C=2;H=3;O=2", -1 },
        { "SO4^2-", "S=1;O=4", -2 },
        { "SO4^-2", "S=1;O=4", -2 },
        { "Fe^3+", "Fe=1", 3 },
        { "Fe^+3", "Fe=1", 3 },
        { "NH4^+", "N=1;H=4", 1 },
        { "MnO4^-", "Mn=1;O=4", -1 },
        { "[Cu(NH3)4]SO4·H2O", "Cu=1;N=4;H=14;S=1;O=5", 0 },
        { "D2O", "D=2;O=1", 0 },
        { "CD3OD", "C=1;D=4;O=1", 0 },
        { "HTO", "H=1;T=1;O=1", 0 },
        { "  NaCl  ", "Na=1;Cl=1", 0 },
        { "CO", "C=1;O=1", 0 },
        { "Co", "Co=1", 0 },
        { "C2H5OH", "C=2;H=6;O=1", 0 },
    };

    [Theory]
    [MemberData(nameof(Cases))]
    public void Reads_counts_and_charge(string text, string expected, int charge)
    {
        var formula = Formula.Parse(text);

        var expectedCounts = expected.Split(';').Select(p => p.Split('='))
            .ToDictionary(p => p[0], p => decimal.Parse(p[1], System.Globalization.CultureInfo.InvariantCulture));
        Assert.Equal(expectedCounts.OrderBy(kv => kv.Key, StringComparer.Ordinal), formula.Elements.OrderBy(kv => kv.Key, StringComparer.Ordinal));
        Assert.Equal(charge, formula.Charge);
        Assert.Equal(text.Trim(), formula.Text);
    }
}
