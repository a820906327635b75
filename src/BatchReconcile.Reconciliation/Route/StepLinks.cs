using BatchReconcile.Chemistry.Metrics;
using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Reconciliation.Steps;
using BatchReconcile.Records.Definitions;

namespace BatchReconcile.Reconciliation.Route;

/// <summary>One reconciled step as the links and the route yield need it.</summary>
internal sealed record ComputedStep(RecipeStep Step, bool HasRows, StepInput Input, StepResult Result);

/// <summary>Links the steps of one batch: intermediates charged against what was isolated, and the route yield (docs/computation.md).</summary>
internal static class StepLinks
{
    /// <summary>
    /// Every later step with rows that charges (or whose equation consumes) the product of an earlier step with rows.
    /// The source is the nearest earlier step with that product; several later steps drawing one intermediate are
    /// each compared with what the ones before them left.
    /// </summary>
    public static IReadOnlyList<IntermediateLink> Find(IReadOnlyList<ComputedStep> steps, MaterialLookup materials)
    {
        var products = steps.Select(s => materials.Get(s.Step.ProductCode).Code).ToArray();
        var drawn = new double[steps.Count];
        var links = new List<IntermediateLink>();
        for (var j = 0; j < steps.Count; j++)
        {
            var to = steps[j];
            if (!to.HasRows)
            {
                continue;
            }

            var codes = to.Input.Reaction.Reactants.Select(r => r.Code)
                .Concat(to.Input.Charges.SelectMany(c => c.Contents).Select(c => c.Material))
                .Distinct(StringComparer.Ordinal);
            foreach (var code in codes)
            {
                var i = j == 0 ? -1 : Array.FindLastIndex(products, j - 1, j, p => p == code);
                if (i < 0 || !steps[i].HasRows)
                {
                    continue;
                }

                double isolated = steps[i].Result.ActualProductKg;
                double charged = to.Input.Charges.SelectMany(c => c.Contents).Where(c => c.Material == code).Sum(c => c.Kg);
                double available = Math.Max(0, isolated - drawn[i]);
                drawn[i] += charged;
                links.Add(new IntermediateLink(code, steps[i].Step.Code, to.Step.Code, isolated, available, charged, to.Step.BalanceTolerancePct));
            }
        }

        return links;
    }

    /// <summary>
    /// m_theo,route = n_L,1·(ν_P1/ν_L1)·Π_k≥2 (ν_Pk/ν_I,k)·M_final, where n_L,1·ν_P1/ν_L1 = m_theo,1/M_P1 and I is the
    /// intermediate (the product of step k−1) in step k's equation; Y_route = 100·m_act,final/m_theo,route.
    /// </summary>
    public static RouteYield Yield(IReadOnlyList<ComputedStep> steps, MaterialLookup materials)
    {
        if (steps.FirstOrDefault(s => !s.HasRows) is { } missing)
        {
            return RouteYield.NotComputable($"step {missing.Step.Code} has no rows");
        }

        var first = steps[0];
        if (first.Result.TheoreticalProductKg is not { } theoretical1 || first.Result.LimitingReactant is null)
        {
            return RouteYield.NotComputable($"step {first.Step.Code} has no limiting reactant (a reactant of its equation was not charged)");
        }

        var product = first.Input.Reaction.Product;
        // kmol of the first intermediate the first step could make: m_theo,1/M_P1 (= ξ_max,1·ν_P1).
        double kmol = theoretical1 / product.MolarMassGPerMol;
        for (var k = 1; k < steps.Count; k++)
        {
            var step = steps[k];
            var intermediate = product;
            var consumed = step.Input.Reaction.Reactants.FirstOrDefault(r => r.Code == intermediate.Code);
            if (consumed is null)
            {
                return RouteYield.NotComputable(
                    $"step {step.Step.Code} does not take the product of step {steps[k - 1].Step.Code} ({intermediate.Code}) in its equation");
            }

            if (step.Result.LimitingReactant is not { } limiting)
            {
                return RouteYield.NotComputable($"step {step.Step.Code} has no limiting reactant (a reactant of its equation was not charged)");
            }

            if (limiting != intermediate.Code)
            {
                return RouteYield.NotComputable(
                    $"step {step.Step.Code} was limited by {limiting}, not by the intermediate {intermediate.Code}, so the route's stoichiometry does not decide its product");
            }

            product = step.Input.Reaction.Product;
            kmol *= product.Coefficient / consumed.Coefficient;
        }

        double theoretical = kmol * product.MolarMassGPerMol;
        double actual = steps[^1].Result.ActualProductKg;
        return theoretical > 0
            ? new RouteYield(100 * actual / theoretical, theoretical, null)
            : RouteYield.NotComputable($"step {first.Step.Code} has a theoretical yield of 0 kg");
    }
}
