using BatchReconcile.Chemistry.Metrics;

namespace BatchReconcile.Chemistry.Tests.Metrics;

/// <summary>
/// Identities of the metrics over seeded random steps: RME = Y·AE/SF/100 (Curzons et al., Green Chem. 2001);
/// RME_g = Y·AE·(1/SF)·MRP (Andraos, OPRD 2005) with percent bookkeeping; ladder rungs + m_act = m_in (project spec).
/// </summary>
public class IdentityPropertyTests
{
    private const int SeedCount = 60;

    public static TheoryData<int> Seeds()
    {
        var data = new TheoryData<int>();
        for (int seed = 1; seed <= SeedCount; seed++)
        {
            data.Add(seed);
        }

        return data;
    }

    [Theory]
    [MemberData(nameof(Seeds))]
    public void Reaction_mass_efficiency_equals_yield_times_atom_economy_over_stoichiometric_factor(int seed)
    {
        foreach (var r in Results(seed))
        {
            double identity = r.YieldPct!.Value * r.AtomEconomyPct / r.StoichiometricFactor!.Value / 100;
            Chem.AssertClose(identity, r.ReactionMassEfficiencyPct, 1e-10, $"seed {seed}");
        }
    }

    [Theory]
    [MemberData(nameof(Seeds))]
    public void Overall_rme_equals_yield_atom_economy_recovery_over_sf(int seed)
    {
        foreach (var r in Results(seed))
        {
            // Y and AE in %, SF and MRP fractions: RME_g (fraction) = Y·AE·(1/SF)·MRP / 10^4; the result holds it in %.
            double fraction = r.YieldPct!.Value * r.AtomEconomyPct * (1 / r.StoichiometricFactor!.Value) * r.MaterialRecoveryParameter!.Value / 1e4;
            Chem.AssertClose(fraction, r.OverallReactionMassEfficiencyPct!.Value / 100, 1e-10, $"seed {seed}");
            Chem.AssertClose(r.ActualProductKg / (r.InputKg - r.RecoveredKg), r.OverallReactionMassEfficiencyPct!.Value / 100, 1e-10, $"seed {seed}");
        }
    }

    [Theory]
    [MemberData(nameof(Seeds))]
    public void Ladder_rungs_plus_product_add_up_to_the_charged_mass(int seed)
    {
        foreach (var r in Results(seed))
        {
            var ladder = r.Ladder!;
            Assert.Equal(7, ladder.Rungs.Count);
            Chem.AssertClose(r.InputKg, ladder.Rungs.Sum(g => g.Kg) + r.ActualProductKg, 1e-10, $"seed {seed}");
            Chem.AssertClose(100.0, ladder.Rungs.Sum(g => g.PercentOfInput!.Value) + (100 * r.ActualProductKg / r.InputKg), 1e-10, $"seed {seed}");
            Assert.Equal(r.TheoreticalProductKg!.Value - r.ActualProductKg, ladder.YieldLossKg, 9);
            Assert.Equal(ladder.YieldLossKg < 0, r.YieldPct > 100);
            Assert.True(ladder[LossRungKind.ExcessReactants].Kg >= -1e-9 * r.InputKg, $"seed {seed}: excess reactants cannot be negative");
        }
    }

    [Theory]
    [MemberData(nameof(Seeds))]
    public void Per_material_parts_add_up_to_their_rungs(int seed)
    {
        // Tolerance: 1e-9 of m_in (floating-point rounding of sums in another order; the figures are kg read to 1 g).
        foreach (var r in Results(seed))
        {
            var ladder = r.Ladder!;
            var auxiliaries = ladder[LossRungKind.AuxiliariesNotRecovered];
            var excess = ladder[LossRungKind.ExcessReactants];
            Assert.NotEmpty(auxiliaries.Parts);
            Assert.Equal(r.Reactants.Select(a => a.Material), excess.Parts.Select(p => p.Material));
            Assert.True(Math.Abs(auxiliaries.Parts.Sum(p => p.Kg) - auxiliaries.Kg) <= 1e-9 * r.InputKg, $"seed {seed}: auxiliaries");
            Assert.True(Math.Abs(excess.Parts.Sum(p => p.Kg) - excess.Kg) <= 1e-9 * r.InputKg, $"seed {seed}: excess reactants");
            Assert.True(Math.Abs(excess.Parts.Single(p => p.Material == r.LimitingReactant).Kg) <= 1e-9 * r.InputKg, $"seed {seed}: limiting");
            Assert.All(ladder.Rungs.Where(g => g != auxiliaries && g != excess), g => Assert.Empty(g.Parts));
        }
    }

    [Theory]
    [MemberData(nameof(Seeds))]
    public void Balance_figures_are_consistent(int seed)
    {
        foreach (var r in Results(seed))
        {
            var b = r.Balance;
            Chem.AssertClose(b.InputKg, b.OutputKg + b.VentedKg + b.GapKg, 1e-12, $"seed {seed}");
            Chem.AssertClose(100 * (b.OutputKg + b.VentedKg) / b.InputKg, b.ClosurePct, 1e-12, $"seed {seed}");
            Assert.False(b.IsSignificantLoss && b.IsSignificantSurplus);
            Assert.True(b.LossForDecisionKg <= b.GapKg + 1e-9 && -b.SurplusForDecisionKg >= b.GapKg - 1e-9);
            Assert.All(Figures.AllNumbers(r), n => Assert.True(double.IsFinite(n.Value), n.Path));
        }
    }

    [Fact]
    public void The_random_steps_include_yields_above_100_percent()
    {
        // Guards the generator: without such cases the negative-rung property above would be vacuous.
        var all = Enumerable.Range(1, SeedCount).SelectMany(Results).ToArray();
        Assert.Contains(all, r => r.YieldPct > 100);
        Assert.Contains(all, r => r.YieldPct < 100);
        Assert.Contains(all, r => r.Ladder![LossRungKind.UnexplainedYieldLoss].Kg < 0);
    }

    /// <summary>Five random steps per seed: 1-3 reactants with random ν, M, charges, assays, auxiliaries and outputs.</summary>
    private static IEnumerable<StepResult> Results(int seed)
    {
        var random = new Random(seed);
        for (int i = 0; i < 5; i++)
        {
            yield return StepMetrics.Compute(RandomStep(random));
        }
    }

    private static StepInput RandomStep(Random random)
    {
        double Between(double low, double high) => low + ((high - low) * random.NextDouble());

        int reactantCount = random.Next(1, 4);
        var reactants = Enumerable.Range(0, reactantCount)
            .Select(i => Chem.T($"R{i}", random.Next(1, 5), Between(2, 400)))
            .ToArray();
        double reactantMassPerExtent = reactants.Sum(t => t.MassPerExtent);
        var product = Chem.T("P", random.Next(1, 3), reactantMassPerExtent * Between(0.2, 1.0) / 2);
        ReactionTerm[] vented = random.Next(2) == 0 ? [] : [Chem.T("G", 1, Between(2, 60))];

        // ξ_max is fixed first: one reactant, chosen at random, is charged exactly stoichiometrically, the others in excess.
        double maxExtent = Between(0.1, 20);
        int limiting = random.Next(reactantCount);
        var charges = new List<ChargeRow>();
        for (int i = 0; i < reactantCount; i++)
        {
            double assayKg = maxExtent * reactants[i].MassPerExtent * (i == limiting ? 1.0 : Between(1.0, 3.0));
            double assay = Between(60, 100);
            charges.Add(ChargeRow.Create(reactants[i].Code, assayKg * 100 / assay, assay));
        }

        charges.Add(ChargeRow.Create("SOLV", Between(0, 5000), role: AuxiliaryRole.Solvent));
        charges.Add(ChargeRow.Create("AQ", Between(0, 2000), role: AuxiliaryRole.Water));
        charges.Add(ChargeRow.Create("CAT", Between(0, 50)));

        double theoretical = maxExtent * product.MassPerExtent;
        double inputKg = charges.Sum(c => c.GrossKg);
        double productAssay = Between(85, 100);
        double wasteProductKg = theoretical * Between(0, 0.05);
        var outputs = new List<OutputRow>
        {
            OutputRow.Product(theoretical * Between(0.3, 1.15) * 100 / productAssay, productAssay),
            OutputRow.Waste(wasteProductKg + Between(0, inputKg / 2), productKg: wasteProductKg),
            OutputRow.Sample(0.5, productKg: 0.4),
            random.Next(2) == 0
                ? OutputRow.Recovered(Between(0, inputKg / 4), AuxiliaryRole.Solvent, "SOLV")
                : OutputRow.Recovered(Between(0, inputKg / 4), AuxiliaryRole.Other, "R0"), // recovered excess reactant
        };

        return StepInput.Create(
            StepReaction.Create(reactants, product, vented),
            charges,
            outputs,
            BalanceCheckSettings.Create(Between(0, 5), Between(0, 0.002), Between(0, 0.5)));
    }
}
