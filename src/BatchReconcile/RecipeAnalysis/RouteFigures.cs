namespace BatchReconcile.RecipeAnalysis;

/// <summary>One step of one batch as the route's mass figures need it.</summary>
/// <param name="MassInKg">All mass charged at the step (m_in).</param>
/// <param name="RecoveredKg">Mass recovered for reuse at the step (m_rec).</param>
/// <param name="ActualKg">The step's isolated product (m_act, pure).</param>
/// <param name="IntermediateChargedKg">Pure mass of the previous step's product charged at this step (c_k); 0 for the first step.</param>
public sealed record RouteStepMass(string Step, double MassInKg, double RecoveredKg, double ActualKg, double IntermediateChargedKg);

/// <summary>The cumulative mass figures of a route (docs/analysis.md, "The route").</summary>
public static class RouteFigures
{
    /// <summary>
    /// PMI of the whole route: Σ_k s_k · (m_in,k − c_k) / m_act,N, with s_N = 1 and s_(k−1) = s_k · c_k / m_act,(k−1), so each
    /// earlier step counts with the share of its product that went on; the intermediates made within the route are not raw
    /// materials. Null when a product the sum divides by is not above zero.
    /// </summary>
    public static double? CumulativePmi(IReadOnlyList<RouteStepMass> steps) => Sum(steps, recovered: false) is { } s ? s.Sum / s.Product : null;

    /// <summary>
    /// Complete E-factor of the whole route: (Σ_k s_k · (m_in,k − c_k − m_rec,k) − m_act,N) / m_act,N, the same scaling as
    /// <see cref="CumulativePmi"/>; null when not computable.
    /// </summary>
    public static double? CompleteEFactor(IReadOnlyList<RouteStepMass> steps) => Sum(steps, recovered: true) is { } s ? (s.Sum - s.Product) / s.Product : null;

    private static (double Sum, double Product)? Sum(IReadOnlyList<RouteStepMass> steps, bool recovered)
    {
        ArgumentNullException.ThrowIfNull(steps);
        if (steps.Count == 0 || !(steps[^1].ActualKg > 0))
        {
            return null;
        }

        double scale = 1, sum = 0;
        for (var k = steps.Count - 1; k >= 0; k--)
        {
            var s = steps[k];
            sum += scale * (s.MassInKg - s.IntermediateChargedKg - (recovered ? s.RecoveredKg : 0));
            if (k > 0)
            {
                if (!(steps[k - 1].ActualKg > 0))
                {
                    return null;
                }

                scale *= s.IntermediateChargedKg / steps[k - 1].ActualKg;
            }
        }

        return (sum, steps[^1].ActualKg);
    }
}
