namespace BatchReconcile.Chemistry.Metrics;

/// <summary>Gross mass balance of a step, the uncertainty behind it and the loss/surplus decision.</summary>
/// <remarks>
/// Vented gases are stoichiometric estimates, not measurements; these figures support, not replace,
/// site procedures, local codes and qualified review.
/// </remarks>
public sealed record MassBalance
{
    internal MassBalance(
        double inputKg,
        double outputKg,
        IReadOnlyList<VentedEstimate> vented,
        double combinedStandardUncertaintyKg,
        BalanceCheckSettings settings)
    {
        InputKg = inputKg;
        OutputKg = outputKg;
        Vented = vented;
        VentedKg = vented.Sum(v => v.AtActualExtentKg);
        VentedAtMaxExtentKg = vented.All(v => v.AtMaxExtentKg.HasValue) ? vented.Sum(v => v.AtMaxExtentKg!.Value) : null;
        GapKg = inputKg - outputKg - VentedKg;
        ClosurePct = SafeRatio.Of(100 * (outputKg + VentedKg), inputKg);
        CombinedStandardUncertaintyKg = combinedStandardUncertaintyKg;
        CoverageFactor = settings.CoverageFactor;
        TolerancePct = settings.TolerancePct;
        ToleranceKg = settings.TolerancePct * inputKg / 100;

        // Why: the decision allows for the whole vented range. Above 100 % yield ξ_act exceeds ξ_max,
        // so "larger" and "smaller" are taken by value, not by which extent produced them.
        double ventedMax = VentedAtMaxExtentKg is { } atMax ? Math.Max(VentedKg, atMax) : VentedKg;
        double ventedMin = VentedAtMaxExtentKg is { } atMax2 ? Math.Min(VentedKg, atMax2) : VentedKg;
        LossForDecisionKg = inputKg - outputKg - ventedMax;
        SurplusForDecisionKg = outputKg + ventedMin - inputKg;
        IsSignificantLoss = GapSignificance.IsSignificant(LossForDecisionKg, ToleranceKg, ExpandedUncertaintyKg);
        IsSignificantSurplus = GapSignificance.IsSignificant(SurplusForDecisionKg, ToleranceKg, ExpandedUncertaintyKg);
    }

    /// <summary>m_in: Σ gross of every charge row, kg.</summary>
    public double InputKg { get; }

    /// <summary>m_out: Σ gross of product, waste, recovered and sample rows, kg.</summary>
    public double OutputKg { get; }

    /// <summary>Per vented species of the equation.</summary>
    public IReadOnlyList<VentedEstimate> Vented { get; }

    /// <summary>Reported vented mass: Σ estimates at ξ_act, kg.</summary>
    public double VentedKg { get; }

    /// <summary>Σ estimates at ξ_max, kg; null when ξ_max is undefined (a reactant not charged).</summary>
    public double? VentedAtMaxExtentKg { get; }

    /// <summary>gap = m_in − m_out − vented, kg. Positive: loss; negative: outputs exceed inputs.</summary>
    public double GapKg { get; }

    /// <summary>100·(m_out + vented)/m_in; null when nothing was charged.</summary>
    public double? ClosurePct { get; }

    /// <summary>u_c of the gap, kg (JCGM 100:2008 (GUM)).</summary>
    public double CombinedStandardUncertaintyKg { get; }

    public double CoverageFactor { get; }

    /// <summary>k·u_c, kg: one of the two limits a flag carries.</summary>
    public double ExpandedUncertaintyKg => CoverageFactor * CombinedStandardUncertaintyKg;

    public double TolerancePct { get; }

    /// <summary>Tolerance in kg (TolerancePct of m_in): the other limit a flag carries.</summary>
    public double ToleranceKg { get; }

    /// <summary>m_in − m_out − (larger vented estimate): the loss the decision judges, kg.</summary>
    public double LossForDecisionKg { get; }

    /// <summary>m_out + (smaller vented estimate) − m_in: the surplus the decision judges, kg.</summary>
    public double SurplusForDecisionKg { get; }

    /// <summary>Unexplained loss beyond both tolerance and k·u_c.</summary>
    public bool IsSignificantLoss { get; }

    /// <summary>Outputs exceed inputs beyond both tolerance and k·u_c.</summary>
    public bool IsSignificantSurplus { get; }
}
