namespace BatchReconcile.Chemistry.Metrics;

/// <summary>Every figure of one step's reconciliation; ratios are null where their denominator is zero or meaningless.</summary>
public sealed record StepResult
{
    // Only StepMetrics builds results, so the figures stay consistent with each other.
    internal StepResult()
    {
    }

    /// <summary>Reactants of the equation in equation order, charged or not (a missing one has 0 kg).</summary>
    public required IReadOnlyList<ChargedAmount> Reactants { get; init; }

    /// <summary>Charged reagents outside the equation whose molar mass was supplied, for their equivalents.</summary>
    public required IReadOnlyList<ChargedAmount> Reagents { get; init; }

    /// <summary>Reactants of the equation with no assay mass charged; when non-empty, ξ_max and everything built on it is null,
    /// and so are RME, RME_g, PMI, cEF and sEF (the charged total is known to be incomplete).</summary>
    public required IReadOnlyList<string> MissingReactants { get; init; }

    /// <summary>Code of the limiting reactant L (smallest n/ν; near-ties go to the first in equation order).</summary>
    public required string? LimitingReactant { get; init; }

    /// <summary>ξ_max = n_L/ν_L in kmol.</summary>
    public required double? MaxExtentKmol { get; init; }

    /// <summary>ξ_act = m_act/(ν_P·M_P) in kmol.</summary>
    public required double ActualExtentKmol { get; init; }

    /// <summary>m_theo = ξ_max·ν_P·M_P, kg.</summary>
    public required double? TheoreticalProductKg { get; init; }

    /// <summary>m_act = Σ product rows m·a/100, kg.</summary>
    public required double ActualProductKg { get; init; }

    /// <summary>Y = 100·m_act/m_theo.</summary>
    public required double? YieldPct { get; init; }

    /// <summary>AE (Trost, Science 1991).</summary>
    public required double AtomEconomyPct { get; init; }

    /// <summary>m_stoich = ξ_max·Σ ν_r·M_r, kg.</summary>
    public required double? StoichiometricReactantKg { get; init; }

    /// <summary>m_react = Σ reactant charges m·a/100, kg.</summary>
    public required double ReactantChargedKg { get; init; }

    /// <summary>SF = m_react/m_stoich.</summary>
    public required double? StoichiometricFactor { get; init; }

    /// <summary>RME = 100·m_act/m_react (Curzons et al., Green Chem. 2001).</summary>
    public required double? ReactionMassEfficiencyPct { get; init; }

    /// <summary>m_in = Σ gross charge rows, kg.</summary>
    public required double InputKg { get; init; }

    /// <summary>m_aux = m_in − m_react, kg (solvents, catalysts, work-up, the non-assay part of charges).</summary>
    public required double AuxiliaryKg { get; init; }

    /// <summary>m_rec = Σ recovered rows, kg.</summary>
    public required double RecoveredKg { get; init; }

    /// <summary>MRP = m_react/(m_in − m_rec), a fraction (Andraos, Org. Process Res. Dev. 2005).</summary>
    public required double? MaterialRecoveryParameter { get; init; }

    /// <summary>Overall RME_g = 100·m_act/(m_in − m_rec) in %, = Y·AE·MRP/SF/100 (Andraos, Org. Process Res. Dev. 2005).</summary>
    public required double? OverallReactionMassEfficiencyPct { get; init; }

    /// <summary>PMI = m_in/m_act, kg per kg.</summary>
    public required double? ProcessMassIntensity { get; init; }

    /// <summary>cEF = (m_in − m_rec − m_act)/m_act, kg per kg.</summary>
    public required double? CompleteEFactor { get; init; }

    /// <summary>sEF: cEF without net solvent and water; see <see cref="StepMetrics"/> for the exact definition.</summary>
    public required double? SimpleEFactor { get; init; }

    /// <summary>Gross solvent and water charged outside the equation, kg.</summary>
    public required double SolventAndWaterChargedKg { get; init; }

    /// <summary>Solvent charged outside the equation, kg: plain rows whose role is solvent (gross) and the solvent
    /// components of solutions; never a reactant. Part of <see cref="SolventAndWaterChargedKg"/>.</summary>
    public required double SolventChargedKg { get; init; }

    /// <summary>Water charged outside the equation, kg: plain rows whose role is water (gross) and the water of
    /// solutions; never a reactant. Part of <see cref="SolventAndWaterChargedKg"/>.</summary>
    public required double WaterChargedKg { get; init; }

    /// <summary>Recovered rows marked solvent or water, kg.</summary>
    public required double SolventAndWaterRecoveredKg { get; init; }

    /// <summary>Desired product found in waste streams, kg.</summary>
    public required double ProductInWasteKg { get; init; }

    /// <summary>Desired product in sample rows, kg.</summary>
    public required double ProductInSamplesKg { get; init; }

    /// <summary>The loss ladder; null when ξ_max is undefined (a reactant not charged).</summary>
    public required LossLadder? Ladder { get; init; }

    public required MassBalance Balance { get; init; }
}
