using System.Text.Json;
using BatchReconcile.Chemistry.Formulas;
using BatchReconcile.Chemistry.Tests.Formulas;

namespace BatchReconcile.Chemistry.Tests.Oracle;

/// <summary>
/// Compares molar masses with an independent implementation: the npm package mf-parser 3.9.3
/// (cheminfo), run by tests/oracle/molar-mass.js. Its element masses are its own, not the abridged
/// CIAAW values used here, so agreement is checked to 0.05 %.
/// </summary>
public class MfParserOracleTests
{
    private const double RelativeTolerance = 5e-4;

    [Fact]
    public void Molar_masses_agree_with_mf_parser()
    {
        // Plain notation only: mf-parser reads '[...]' as isotope notation, '.' after a count as a
        // decimal point, and '·'/'*' differently, so hydrates are written as "(H2O)5" here.
        // D and T are left out: mf-parser spells them as isotopes.
        var generator = new RandomFormula(seed: 20240611, plain: true, withIsotopes: false);
        var formulas = new List<string>
        {
            "C8H10N4O2", "C13H18O2", "C9H8O4", "C8H9NO2", "Ca3(PO4)2", "Al2(SO4)3",
            "CuSO4(H2O)5", "MgSO4(H2O)7", "Na2CO3(H2O)10", "K4(Fe(CN)6)(H2O)3", "Fe0.95O",
        };
        while (formulas.Count < 250) formulas.Add(generator.Next().Text);

        double?[] oracle = RunOracle(formulas);

        Assert.Equal(formulas.Count, oracle.Length);
        var failures = new List<string>();
        for (int i = 0; i < formulas.Count; i++)
        {
            double ours = Formula.Parse(formulas[i]).MolarMass;
            if (oracle[i] is not double theirs)
                failures.Add($"{formulas[i]}: mf-parser could not read it");
            else if (Math.Abs(ours - theirs) > RelativeTolerance * theirs)
                failures.Add($"{formulas[i]}: ours {ours:R}, mf-parser {theirs:R}");
        }

        Assert.True(failures.Count == 0, string.Join(Environment.NewLine, failures));
    }

    private static double?[] RunOracle(List<string> formulas)
    {
        string stdout = NodeOracle.Run("molar-mass.js", "mf-parser", JsonSerializer.Serialize(formulas));
        return JsonSerializer.Deserialize<double?[]>(stdout) ?? throw new InvalidOperationException("the oracle printed null");
    }
}
