using BatchReconcile.Chemistry.Metrics;
using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Records.Definitions;

namespace BatchReconcile.Reconciliation.Steps;

/// <summary>Copies a <see cref="StepResult"/> onto the stored shape, <see cref="StepOutcome"/>.</summary>
internal static class StepOutcomeMapper
{
    private const double MolPerKmol = 1000;

    /// <param name="productInWasteMaxPct">The product-in-waste limit the flags were judged by (step value or site default).</param>
    public static StepOutcome Map(RecipeStep step, bool hasRows, StepResult r, IReadOnlyList<Flag> flags, double productInWasteMaxPct)
    {
        var balance = r.Balance;

        // Reactants first, then reagents; only materials with a defined value (none when no limiting reactant).
        var equivalents = new Dictionary<string, double>(StringComparer.OrdinalIgnoreCase);
        foreach (var amount in r.Reactants.Concat(r.Reagents))
        {
            if (amount.Equivalents is { } eq)
            {
                equivalents[amount.Material] = eq;
            }
        }

        var ladder = r.Ladder?.Rungs
            .Select(rung =>
            {
                var (key, label) = LadderRungKeys.Of(rung.Kind);

                // A ladder exists only when a reactant was charged, so m_in > 0 and the percentage is defined.
                double pct = rung.PercentOfInput ?? throw new InvalidOperationException($"Step {step.Code}: ladder without charged mass.");
                return new LadderRung(key, label, rung.Kg, pct) { Parts = rung.Parts };
            })
            .ToArray() ?? [];

        return new StepOutcome(
            Step: step.Code,
            HasRows: hasRows,
            LimitingReactant: r.LimitingReactant,
            ExtentMaxMol: r.MaxExtentKmol * MolPerKmol,
            TheoreticalKg: r.TheoreticalProductKg,
            ActualKg: r.ActualProductKg,
            YieldPct: r.YieldPct,
            AtomEconomyPct: r.AtomEconomyPct,
            StoichiometricFactor: r.StoichiometricFactor,
            RmePct: r.ReactionMassEfficiencyPct,
            Mrp: r.MaterialRecoveryParameter,
            OverallRmePct: r.OverallReactionMassEfficiencyPct,
            Pmi: r.ProcessMassIntensity,
            CompleteEFactor: r.CompleteEFactor,
            SimpleEFactor: r.SimpleEFactor,
            MassInKg: r.InputKg,
            ReactantMassKg: r.ReactantChargedKg,
            StoichiometricMassKg: r.StoichiometricReactantKg,
            RecoveredKg: r.RecoveredKg,
            MassOutKg: balance.OutputKg,
            VentedKg: balance.VentedKg,

            // The upper end of the vented range the decision allowed for; without ξ_max only the ξ_act estimate exists.
            VentedMaxKg: Math.Max(balance.VentedKg, balance.VentedAtMaxExtentKg ?? balance.VentedKg),
            GapKg: balance.GapKg,
            ClosurePct: balance.ClosurePct,
            CombinedUncertaintyKg: balance.CombinedStandardUncertaintyKg,
            Equivalents: equivalents,
            Ladder: ladder,
            Flags: flags,
            Limits: new StepLimits(
                step.YieldPct.Min,
                step.YieldPct.Max,
                balance.TolerancePct,
                balance.CoverageFactor,
                balance.ExpandedUncertaintyKg,
                step.Equivalents,
                productInWasteMaxPct),
            SolventInKg: r.SolventChargedKg,
            WaterInKg: r.WaterChargedKg);
    }
}
