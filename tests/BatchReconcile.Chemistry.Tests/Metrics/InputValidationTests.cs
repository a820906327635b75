using BatchReconcile.Chemistry.Metrics;

namespace BatchReconcile.Chemistry.Tests.Metrics;

/// <summary>Inputs arrive validated by the batch-record layer, so impossible numbers here are bugs and throw.</summary>
public class InputValidationTests
{
    [Theory]
    [InlineData(0.0, 10.0)]
    [InlineData(-1.0, 10.0)]
    [InlineData(1.0, 0.0)]
    [InlineData(double.NaN, 10.0)]
    [InlineData(1.0, double.PositiveInfinity)]
    public void Reaction_terms_need_positive_finite_coefficient_and_molar_mass(double nu, double molarMass) =>
        Assert.Throws<ArgumentException>(() => ReactionTerm.Create("X", nu, molarMass));

    [Theory]
    [InlineData(-0.1, 100.0)]
    [InlineData(double.NaN, 100.0)]
    [InlineData(10.0, 0.0)]
    [InlineData(10.0, 100.1)]
    public void Charge_rows_need_non_negative_mass_and_assay_in_range(double grossKg, double assayPct) =>
        Assert.Throws<ArgumentException>(() => ChargeRow.Create("X", grossKg, assayPct));

    [Fact]
    public void Waste_rows_cannot_hold_more_product_than_their_mass() =>
        Assert.Throws<ArgumentException>(() => OutputRow.Waste(1.0, productKg: 1.5));

    [Fact]
    public void A_species_may_appear_only_once_in_the_step_reaction()
    {
        Assert.Throws<ArgumentException>(() => StepReaction.Create([Chem.T("A", 1, 10), Chem.T("A", 1, 10)], Chem.T("P", 1, 20)));
        Assert.Throws<ArgumentException>(() => StepReaction.Create([Chem.T("A", 1, 10)], Chem.T("A", 1, 10)));
        Assert.Throws<ArgumentException>(() => StepReaction.Create([Chem.T("A", 1, 10)], Chem.T("P", 1, 10), [Chem.T("A", 1, 10)]));
    }

    [Fact]
    public void A_step_reaction_needs_a_reactant() =>
        Assert.Throws<ArgumentException>(() => StepReaction.Create([], Chem.T("P", 1, 10)));

    [Fact]
    public void Reagent_molar_masses_are_not_accepted_for_species_of_the_equation() =>
        Assert.Throws<ArgumentException>(() => StepInput.Create(
            Chem.Esterification(), [], [], Chem.Balance(), new Dictionary<string, double> { ["ETOH"] = 46.069 }));

    [Fact]
    public void Balance_settings_refuse_negative_numbers() =>
        Assert.Throws<ArgumentException>(() => BalanceCheckSettings.Create(1.0, -0.001, 0.0));
}
