using System.Globalization;
using BatchReconcile.Chemistry.Metrics;
using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Reconciliation.Steps;
using BatchReconcile.Records.Definitions;

namespace BatchReconcile.Reconciliation.Flags;

/// <summary>The flag rules of the reconciliation spec, applied to one computed step.</summary>
/// <remarks>
/// <para>Decisions (docs/computation.md):</para>
/// <list type="bullet">
/// <item>One yield flag per step: Y &lt; min gives yield-low; Y &gt; 100 gives yield-over-theory only (it already
/// says the yield is above anything possible, so yield-high would repeat the same finding at a lower severity);
/// max &lt; Y ≤ 100 gives yield-high.</item>
/// <item>A reactant of the equation not charged gives reactant-missing (one per reactant) and nothing that needs the
/// limiting reactant: no yield, equivalents or product-in-waste flags. The gross mass balance is still judged.</item>
/// <item>A reagent outside the equation that the step gives a range for and that was not charged counts as 0 equiv
/// and is flagged when 0 is outside its range.</item>
/// <item>Limits are inclusive; a value within 1e-9 (relative) of a limit counts as on it, so floating-point noise in
/// a charge made exactly at a limit never raises a flag.</item>
/// <item>Balance flags carry the loss (or surplus) the decision judged, i.e. after allowing the whole vented range,
/// and as limit the larger of the tolerance and k·u_c (it broke both); the sentence gives both.</item>
/// </list>
/// Vented-gas figures are stoichiometric estimates: they support, not replace, site venting procedures, local
/// codes and qualified review.
/// </remarks>
internal static class FlagRules
{
    private const double LimitRelativeWindow = 1e-9;

    public static IReadOnlyList<Flag> StepMissing(RecipeStep step, string batchId, SeverityTable severities) =>
    [
        new Flag(
            FlagCode.StepMissing,
            severities.For(FlagCode.StepMissing, step),
            step.Code,
            null,
            null,
            string.Empty,
            $"Step {Name(step)} has no rows in the export of batch {batchId}; confirm whether the step was run and, if it was, obtain a complete re-export."),
    ];

    public static IReadOnlyList<Flag> Evaluate(
        RecipeStep step, StepResult result, MaterialLookup materials, SeverityTable severities, double productInWasteMaxPct)
    {
        var flags = new List<Flag>();
        Flag Make(FlagCode code, double? measured, double? limit, string unit, string message, string? subject = null) =>
            new(code, severities.For(code, step), step.Code, measured, limit, unit, message, subject);

        foreach (string reactant in result.MissingReactants)
        {
            double charged = result.Reactants.First(r => r.Material == reactant).ChargedKg;
            flags.Add(Make(
                FlagCode.ReactantMissing, charged, null, "kg",
                $"Reactant {reactant} of step {Name(step)} has no charge recorded, so the limiting reactant, yield and the figures built on them cannot be computed; check the batch record for a missing charge row.",
                reactant));
        }

        if (result.YieldPct is { } y)
        {
            if (Below(y, step.YieldPct.Min))
            {
                flags.Add(Make(
                    FlagCode.YieldLow, y, step.YieldPct.Min, "%",
                    $"Yield {PctNear(y, step.YieldPct.Min)} % is below the master-record minimum of {Limit(step.YieldPct.Min)} % for step {Name(step)}; investigate under the deviation procedure."));
            }
            else if (Above(y, 100))
            {
                flags.Add(Make(
                    FlagCode.YieldOverTheory, y, 100, "%",
                    $"Yield {PctNear(y, 100)} % is above the theoretical maximum of 100 % for step {Name(step)}; the product is likely wet or impure or a weighing is wrong, so re-check the product weight, loss on drying and assay before release."));
            }
            else if (Above(y, step.YieldPct.Max))
            {
                flags.Add(Make(
                    FlagCode.YieldHigh, y, step.YieldPct.Max, "%",
                    $"Yield {PctNear(y, step.YieldPct.Max)} % is above the master-record maximum of {Limit(step.YieldPct.Max)} % for step {Name(step)}; check the product weight, dryness and assay under the deviation procedure."));
            }
        }

        var balance = result.Balance;
        string vented = balance.Vented.Count == 0 ? string.Empty
            : $", allowing up to {Kg(Math.Max(balance.VentedKg, balance.VentedAtMaxExtentKg ?? 0))} kg of vented gas";
        string closure = balance.ClosurePct is { } c ? $"closure {Pct(c)} % of {Kg(balance.InputKg)} kg charged" : "nothing charged";
        if (balance.IsSignificantLoss)
        {
            double loss = balance.LossForDecisionKg;
            flags.Add(Make(
                FlagCode.BalanceGap, loss, Math.Max(balance.ToleranceKg, balance.ExpandedUncertaintyKg), "kg",
                $"Step {Name(step)} lost {Kg(loss)} kg that the records do not account for ({closure}{vented}), more than both the tolerance of {Kg(balance.ToleranceKg)} kg ({Limit(balance.TolerancePct)} %) and the measurement uncertainty of {Kg(balance.ExpandedUncertaintyKg)} kg (k = {Limit(balance.CoverageFactor)}); look for unrecorded streams, spills or weighing errors."));
        }

        if (balance.IsSignificantSurplus)
        {
            double surplus = balance.SurplusForDecisionKg;
            flags.Add(Make(
                FlagCode.BalanceSurplus, surplus, Math.Max(balance.ToleranceKg, balance.ExpandedUncertaintyKg), "kg",
                $"Step {Name(step)} recorded {Kg(surplus)} kg more output than input ({closure}{vented}), more than both the tolerance of {Kg(balance.ToleranceKg)} kg ({Limit(balance.TolerancePct)} %) and the measurement uncertainty of {Kg(balance.ExpandedUncertaintyKg)} kg (k = {Limit(balance.CoverageFactor)}); check for outputs recorded twice, charges not recorded or weighing errors."));
        }

        if (result.LimitingReactant is not null)
        {
            var amounts = result.Reactants.Concat(result.Reagents).ToDictionary(a => a.Material, StringComparer.OrdinalIgnoreCase);
            foreach (var (code, range) in step.Equivalents.OrderBy(e => e.Key, StringComparer.Ordinal))
            {
                var amount = amounts.GetValueOrDefault(code);
                double equivalents = amount?.Equivalents ?? 0;
                if (Below(equivalents, range.Min) || Above(equivalents, range.Max))
                {
                    string subject = amount?.Material ?? materials.Get(code).Code;
                    string what = amount is null
                        ? $"{subject} was not charged in step {Name(step)} although the master record requires {Equiv(range.Min)} to {Equiv(range.Max)} equiv"
                        : $"{subject} was charged at {Equiv(equivalents)} equiv in step {Name(step)}, outside the allowed {Equiv(range.Min)} to {Equiv(range.Max)} equiv";
                    double limit = Below(equivalents, range.Min) ? range.Min : range.Max;
                    flags.Add(Make(
                        FlagCode.EquivalentsOutOfRange, equivalents, limit, "equiv",
                        $"{what} (relative to {result.LimitingReactant}); review the charge record against the master record.",
                        subject));
                }
            }
        }

        if (result.TheoreticalProductKg is { } theo && theo > 0)
        {
            double pct = 100 * result.ProductInWasteKg / theo;
            if (Above(pct, productInWasteMaxPct))
            {
                flags.Add(Make(
                    FlagCode.ProductInWaste, pct, productInWasteMaxPct, "%",
                    $"Waste streams of step {Name(step)} carry {Kg(result.ProductInWasteKg)} kg of product, {PctNear(pct, productInWasteMaxPct)} % of theoretical, above the limit of {Limit(productInWasteMaxPct)} %; review work-up losses (mother liquor, washes) with production."));
            }
        }

        return flags;
    }

    /// <summary>
    /// intermediate-overdrawn: a later step charged more of an earlier step's product than that step isolated in the
    /// batch (less what earlier steps drew), beyond the later step's balance tolerance (% of the isolated mass).
    /// Measured is the charged kg, limit the isolated kg plus the tolerance.
    /// </summary>
    public static Flag IntermediateOverdrawn(IntermediateLink link, RecipeStep from, RecipeStep to, SeverityTable severities)
    {
        string available = link.AvailableKg < link.IsolatedKg * (1 - 1e-9)
            ? $" ({Kg(link.AvailableKg)} kg of them left after earlier steps drew theirs)"
            : string.Empty;
        return new Flag(
            FlagCode.IntermediateOverdrawn,
            severities.For(FlagCode.IntermediateOverdrawn, to),
            to.Code,
            link.ChargedKg,
            link.AllowedKg,
            "kg",
            $"Step {Name(to)} charged {Kg(link.ChargedKg)} kg of {link.Material}, but step {Name(from)} isolated only {Kg(link.IsolatedKg)} kg of it in this batch{available}, "
            + $"{Kg(link.ChargedKg - link.AvailableKg)} kg more, beyond the tolerance of {Limit(link.TolerancePct)} % ({Kg(link.AllowedKg)} kg); "
            + "find out where the extra material came from (another batch, a weighing or assay error) and record it under the deviation procedure.",
            link.Material);
    }

    private static bool Below(double value, double limit) => value < limit - (LimitRelativeWindow * Math.Abs(limit));

    private static bool Above(double value, double limit) => value > limit + (LimitRelativeWindow * Math.Abs(limit));

    private static string Name(RecipeStep step) => $"{step.Code} ({step.Name})";

    private static string Pct(double value) => value.ToString("0.0", CultureInfo.InvariantCulture);

    /// <summary>One decimal, or two when one would print the value as its own limit ("100.0 % is above 100 %").</summary>
    private static string PctNear(double value, double limit) =>
        Math.Abs(value - limit) < 0.05 ? value.ToString("0.00", CultureInfo.InvariantCulture) : Pct(value);

    private static string Kg(double value) => value.ToString("0.###", CultureInfo.InvariantCulture);

    private static string Equiv(double value) => value.ToString("0.00", CultureInfo.InvariantCulture);

    private static string Limit(double value) => value.ToString("0.##", CultureInfo.InvariantCulture);
}
