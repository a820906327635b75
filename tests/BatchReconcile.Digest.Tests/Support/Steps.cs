using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Reconciliation.Outcomes;

namespace BatchReconcile.Digest.Tests.Support;

/// <summary>Builds step outcomes whose ladder adds up the way docs/computation.md defines it.</summary>
internal static class Steps
{
    /// <param name="massIn">m_in, all charged mass.</param>
    /// <param name="reactant">m_react, reactant mass charged.</param>
    /// <param name="recovered">m_rec.</param>
    /// <param name="stoich">m_stoich.</param>
    /// <param name="theory">m_theo.</param>
    /// <param name="actual">m_act.</param>
    /// <param name="inWaste">product found in waste.</param>
    /// <param name="inSamples">product in samples.</param>
    /// <param name="massOut">m_out, all weighed outputs.</param>
    /// <param name="vented">vented estimate at the actual extent.</param>
    /// <param name="ventedMax">vented estimate at the full extent.</param>
    /// <param name="u">combined standard uncertainty of the gap, kg.</param>
    /// <param name="k">coverage factor stored with the step (U = k·u).</param>
    /// <param name="tolerance">balance tolerance stored with the step, % of charged.</param>
    public static StepOutcome Outcome(
        string step, double massIn, double reactant, double recovered, double stoich, double theory, double actual,
        double inWaste, double inSamples, double massOut, double vented, double ventedMax, double u, double k = 2.0, double tolerance = 2.0, params Flag[] flags)
    {
        var rungs = new (string Key, string Label, double Kg)[]
        {
            (LadderRungKeys.AuxiliariesNotRecovered, "solvents, catalysts and work-up not recovered", massIn - reactant - recovered),
            (LadderRungKeys.Recovered, "recovered for reuse", recovered),
            (LadderRungKeys.ExcessReactants, "reactants charged in excess", reactant - stoich),
            (LadderRungKeys.CoProducts, "co-products of the equation (atom-economy loss)", stoich - theory),
            (LadderRungKeys.ProductInWaste, "yield loss: product found in waste streams", inWaste),
            (LadderRungKeys.ProductInSamples, "yield loss: product taken as samples", inSamples),
            (LadderRungKeys.UnexplainedYieldLoss, "yield loss: not accounted for", theory - actual - inWaste - inSamples),
        };
        var ladder = rungs.Select(r => new LadderRung(r.Key, r.Label, r.Kg, 100 * r.Kg / massIn)).ToList();
        var gap = massIn - massOut - vented;
        return new StepOutcome(
            Step: step, HasRows: true, LimitingReactant: "A", ExtentMaxMol: 100, TheoreticalKg: theory, ActualKg: actual,
            YieldPct: 100 * actual / theory, AtomEconomyPct: 100 * theory / stoich, StoichiometricFactor: reactant / stoich,
            RmePct: 100 * actual / reactant, Mrp: null, OverallRmePct: null, Pmi: massIn / actual, CompleteEFactor: null, SimpleEFactor: null,
            MassInKg: massIn, ReactantMassKg: reactant, StoichiometricMassKg: stoich, RecoveredKg: recovered, MassOutKg: massOut,
            VentedKg: vented, VentedMaxKg: ventedMax, GapKg: gap, ClosurePct: 100 * (massOut + vented) / massIn,
            CombinedUncertaintyKg: u, Equivalents: new Dictionary<string, double>(), Ladder: ladder, Flags: flags,
            Limits: new StepLimits(88.0, 98.0, tolerance, k, k * u, new Dictionary<string, Records.Definitions.ValueRange>(), 2.0));
    }

    /// <summary>The outcome as if judged with coverage factor <paramref name="k"/> and balance tolerance <paramref name="tolerance"/> %.</summary>
    public static StepOutcome Judged(StepOutcome outcome, double k, double tolerance) =>
        outcome with { Limits = outcome.Limits with { CoverageFactor = k, BalanceTolerancePct = tolerance, ExpandedUncertaintyKg = k * outcome.CombinedUncertaintyKg } };
}
