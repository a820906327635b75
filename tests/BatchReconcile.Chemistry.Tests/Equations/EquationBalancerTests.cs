using System.Numerics;
using BatchReconcile.Chemistry.Equations;
using BatchReconcile.Chemistry.Formulas;
using BatchReconcile.Chemistry.Numerics;

namespace BatchReconcile.Chemistry.Tests.Equations;

public class EquationBalancerTests
{
    // Each row: species as written (no coefficients), the known smallest coefficients in term order, source.
    // "from memory" = recalled standard examples of general/inorganic chemistry teaching, not re-read for this test.
    public static TheoryData<string, int[], string> KnownEquations => new()
    {
        { "KMnO4 + HCl -> KCl + MnCl2 + Cl2 + H2O", [2, 16, 2, 2, 5, 8], "chlorine from permanganate, from memory" },
        { "K2Cr2O7 + HCl -> KCl + CrCl3 + Cl2 + H2O", [1, 14, 2, 2, 3, 7], "chlorine from dichromate, from memory" },
        { "MnO4^- + Fe^2+ + H^+ -> Mn^2+ + Fe^3+ + H2O", [1, 5, 8, 1, 5, 4], "permanganate titration of iron(II), from memory" },
        { "Cr2O7^2- + I^- + H^+ -> Cr^3+ + I2 + H2O", [1, 6, 14, 2, 3, 7], "dichromate/iodide, from memory" },
        { "MnO4^- + H2C2O4 + H^+ -> Mn^2+ + CO2 + H2O", [2, 5, 6, 2, 10, 8], "permanganate standardisation with oxalic acid, from memory" },
        { "MnO4^- + SO3^2- + H^+ -> Mn^2+ + SO4^2- + H2O", [2, 5, 6, 2, 5, 3], "permanganate/sulfite, from memory" },
        { "Cu + HNO3 -> Cu(NO3)2 + NO + H2O", [3, 8, 3, 2, 4], "copper in dilute nitric acid, from memory" },
        { "Cu + HNO3 -> Cu(NO3)2 + NO2 + H2O", [1, 4, 1, 2, 2], "copper in concentrated nitric acid, from memory" },
        { "Cu + H^+ + NO3^- -> Cu^2+ + NO + H2O", [3, 8, 2, 3, 2, 4], "ionic form of the dilute nitric acid reaction, from memory" },
        { "Fe^3+ + Sn^2+ -> Fe^2+ + Sn^4+", [2, 1, 2, 1], "iron(III) reduction by tin(II), from memory" },
        { "S2O3^2- + I2 -> S4O6^2- + I^-", [2, 1, 1, 2], "iodometry, thiosulfate/iodine, from memory" },
        { "As2S3 + HNO3 + H2O -> H3AsO4 + H2SO4 + NO", [3, 28, 4, 6, 9, 28], "arsenic sulfide oxidation, from memory" },
        { "NaOH + Cl2 -> NaCl + NaClO3 + H2O", [6, 3, 5, 1, 3], "chlorine in hot alkali, from memory" },
        { "C8H18 + O2 -> CO2 + H2O", [2, 25, 16, 18], "octane combustion, from memory" },
        { "C3H8 + O2 -> CO2 + H2O", [1, 5, 3, 4], "propane combustion, from memory" },
        { "C6H12O6 + O2 -> CO2 + H2O", [1, 6, 6, 6], "glucose oxidation (respiration), from memory" },
        { "CO2 + H2O -> C6H12O6 + O2", [6, 6, 1, 6], "photosynthesis, from memory" },
        { "Fe2O3 + CO -> Fe + CO2", [1, 3, 2, 3], "blast furnace reduction, from memory" },
        { "Fe2O3 + Al -> Al2O3 + Fe", [1, 2, 1, 2], "thermite, from memory" },
        { "FeS2 + O2 -> Fe2O3 + SO2", [4, 11, 2, 8], "pyrite roasting, from memory" },
        { "H2S + SO2 -> S + H2O", [2, 1, 3, 2], "Claus reaction, from memory" },
        { "Ca3(PO4)2 + SiO2 + C -> CaSiO3 + P4 + CO", [2, 6, 10, 6, 1, 10], "electrothermal phosphorus process, from memory" },
        { "KClO3 -> KCl + O2", [2, 2, 3], "potassium chlorate decomposition, from memory" },
        { "Al + HCl -> AlCl3 + H2", [2, 6, 2, 3], "aluminium in hydrochloric acid, from memory" },
        { "C6H5NO2 + H2 -> C6H5NH2 + H2O", [1, 3, 1, 2], "catalytic hydrogenation of nitrobenzene to aniline, from memory" },
        { "C6H4(NO2)2 + H2 -> C6H4(NH2)2 + H2O", [1, 6, 1, 4], "dinitrobenzene to phenylenediamine, from memory" },
        { "C6H5NO2 + Fe + H2O -> C6H5NH2 + Fe3O4", [4, 9, 4, 4, 3], "Bechamp reduction, from memory" },
        { "C6H5NO2 + Na2S + H2O -> C6H5NH2 + Na2S2O3 + NaOH", [4, 6, 7, 4, 3, 6], "Zinin reduction with sodium sulfide, from memory" },
        { "CuSO4·5H2O -> CuSO4 + H2O", [1, 1, 5], "dehydration of copper sulfate pentahydrate, from memory" },
        {
            "K4[Fe(CN)6] + KMnO4 + H2SO4 -> KHSO4 + Fe2(SO4)3 + MnSO4 + HNO3 + CO2 + H2O",
            [10, 122, 299, 162, 5, 122, 60, 60, 188],
            "ferrocyanide/permanganate, a classic test case of the equation-balancing literature, from memory"
        },
    };

    [Theory]
    [MemberData(nameof(KnownEquations))]
    public void Balances_known_equations(string unbalanced, int[] expected, string source)
    {
        _ = source;

        var result = EquationBalancer.Balance(unbalanced);

        Assert.True(result.IsSuccess, result.ToString());
        Assert.Equal(expected.Select(e => new BigInteger(e)), result.Coefficients);
        Assert.True(BalanceCheck.Check(result.Equation).IsBalanced);
    }

    [Theory]
    [MemberData(nameof(KnownEquations))]
    public void Known_coefficients_pass_the_balance_check_and_disturbed_ones_fail(string unbalanced, int[] expected, string source)
    {
        _ = source;
        var equation = ChemicalEquation.Parse(unbalanced);

        var written = equation.WithCoefficients(expected.Select(e => (Rational)e).ToArray());
        var disturbed = equation.WithCoefficients(expected.Select((e, i) => (Rational)(i == 0 ? e + 1 : e)).ToArray());

        Assert.True(BalanceCheck.Check(written).IsBalanced);
        Assert.False(BalanceCheck.Check(disturbed).IsBalanced);
    }

    [Fact]
    public void Balanced_equation_is_written_in_canonical_form()
    {
        var result = EquationBalancer.Balance("KMnO4 + HCl = KCl + MnCl2 + Cl2 + H2O");

        Assert.Equal("2 KMnO4 + 16 HCl -> 2 KCl + 2 MnCl2 + 5 Cl2 + 8 H2O", result.Equation?.ToString());
    }

    [Fact]
    public void Written_coefficients_are_ignored_when_balancing()
    {
        var result = EquationBalancer.Balance("7 H2 + 1/2 O2 -> 3 H2O");

        Assert.Equal("2 H2 + O2 -> 2 H2O", result.Equation?.ToString());
    }

    [Fact]
    public void Material_codes_balance_through_the_lookup()
    {
        var materials = new Dictionary<string, string>(StringComparer.Ordinal) { ["NB"] = "C6H5NO2", ["ANL"] = "C6H7N", ["WATER"] = "H2O" };

        var result = EquationBalancer.Balance("NB + H2 -> ANL + WATER", name => materials.TryGetValue(name, out var f) ? Formula.Parse(f) : null);

        Assert.Equal("NB + 3 H2 -> ANL + 2 WATER", result.Equation?.ToString());
    }

    [Theory]
    [InlineData("H2O -> H2O2", BalanceFailureKind.NoSolution, "no solution: only all-zero coefficients")]
    [InlineData("NO -> NO2", BalanceFailureKind.NoSolution, "no solution")]
    [InlineData("C + O2 -> CO + CO2", BalanceFailureKind.MultipleIndependentReactions, "the equation mixes 2 independent reactions")]
    [InlineData("C + O2 + H2 -> CO + CO2 + H2O", BalanceFailureKind.MultipleIndependentReactions, "the equation mixes 3 independent reactions")]
    [InlineData("Fe^2+ + Fe^3+ -> Fe", BalanceFailureKind.NoPositiveSolution, "'Fe^3+' would have to be on the right (coefficient 2)")]
    [InlineData("CO + C -> CO2", BalanceFailureKind.NoPositiveSolution, "no positive solution: the only balance has 'C' would have to be on the right")]
    [InlineData("H2 -> O2", BalanceFailureKind.ElementOnOneSide, "H appears only on the left (in 'H2'); O appears only on the right (in 'O2')")]
    [InlineData("Fe + O2 -> Fe2O3 + SO2", BalanceFailureKind.ElementOnOneSide, "S appears only on the right (in 'SO2')")]
    [InlineData("Fe^2+ -> Fe^3+", BalanceFailureKind.ChargeCannotBalance, "the atoms can balance but the charge cannot; check the charged species 'Fe^2+' (2+), 'Fe^3+' (3+)")]
    [InlineData("MnO4^- + H^+ -> Mn^2+ + H2O", BalanceFailureKind.ChargeCannotBalance, "charge cannot")]
    [InlineData("C + H2O -> CO + H2 + H2O", BalanceFailureKind.RepeatedSpecies, "'H2O' is written on both sides (species 2 on the left and species 3 on the right)")]
    [InlineData("C2H5OH -> CH3OCH3", BalanceFailureKind.RepeatedSpecies, "'C2H5OH' (species 1 on the left) and 'CH3OCH3' (species 1 on the right) have the same composition")]
    [InlineData("H2 + O2 + H2 -> H2O", BalanceFailureKind.RepeatedSpecies, "'H2' is written twice on the left")]
    public void Refuses_equations_that_cannot_be_balanced(string text, BalanceFailureKind kind, string reason)
    {
        var result = EquationBalancer.Balance(text);

        Assert.False(result.IsSuccess);
        Assert.Equal(kind, result.FailureKind);
        Assert.Contains(reason, result.Message, StringComparison.Ordinal);
        Assert.Empty(result.Coefficients);
    }

    [Fact]
    public void Text_that_is_not_an_equation_reports_the_located_parse_error()
    {
        var result = EquationBalancer.Balance("H2 + Xq2 -> H2O");

        Assert.Equal(BalanceFailureKind.InvalidEquation, result.FailureKind);
        Assert.Equal(6, result.ParseError?.Position);
        Assert.Equal("at 6: species 2 on the left: unknown element 'Xq' at 1 of 'Xq2'", result.Message);
    }

    // Same generator as the core property test, but through text: formulas are written out, parsed and balanced.
    [Fact]
    public void Random_reactions_from_text_recover_the_known_coefficients()
    {
        var random = new Random(7_31_2025);

        var outcome = RandomReactions.Run(random, 300, c =>
        {
            var text = string.Join(" + ", c.Reactants.Select(r => RandomReactions.Hill(r.Atoms)))
                + " -> " + string.Join(" + ", c.Products.Select(p => RandomReactions.Hill(p.Atoms)));
            var result = EquationBalancer.Balance(text);
            if (result.FailureKind == BalanceFailureKind.MultipleIndependentReactions)
            {
                return null;
            }

            Assert.True(result.IsSuccess, $"{text}: {result}");
            Assert.True(BalanceCheck.Check(result.Equation).IsBalanced, text);
            return result.Coefficients;
        });

        Assert.Equal(0, outcome.Mismatches);
        Assert.True(outcome.Recovered >= 100, $"only {outcome.Recovered} of 300 cases had a single reaction; the generator is too weak");
    }
}
