namespace BatchReconcile.Chemistry.Metrics;

internal static class MassBalanceCalculator
{
    public static MassBalance Compute(StepInput input, double inputKg, double actualExtentKmol, double? maxExtentKmol)
    {
        var reaction = input.Reaction;
        double outputKg = input.Outputs.Sum(o => o.GrossKg);
        var vented = reaction.Vented
            .Select(g => new VentedEstimate(g.Code, actualExtentKmol * g.MassPerExtent, maxExtentKmol * g.MassPerExtent))
            .ToArray();

        // Why sensitivity coefficients: the reported vented mass is computed from the product rows
        // (ξ_act = m_act/(ν_P·M_P)), so weighing a product row enters the gap twice:
        // ∂gap/∂m_row = −(1 + (a/100)·Σν_g·M_g/(ν_P·M_P)). Law of propagation for uncorrelated inputs,
        // u_c² = Σ c_i²·u_i² (JCGM 100:2008 (GUM) 5.1.2). Assay uncertainties are not weighings and are
        // left out; each charge and output row is an independent weighing.
        double ventedPerProductKg = reaction.Vented.Sum(g => g.MassPerExtent) / reaction.Product.MassPerExtent;
        var settings = input.Balance;
        double variance = 0;
        foreach (var charge in input.Charges)
        {
            double u = settings.StandardUncertaintyKg(charge.GrossKg);
            variance += u * u;
        }

        foreach (var output in input.Outputs)
        {
            double c = 1 + (output.ProductFraction * ventedPerProductKg);
            double u = c * settings.StandardUncertaintyKg(output.GrossKg);
            variance += u * u;
        }

        return new MassBalance(inputKg, outputKg, vented, Math.Sqrt(variance), settings);
    }
}
