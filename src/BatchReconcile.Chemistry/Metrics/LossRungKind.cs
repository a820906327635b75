namespace BatchReconcile.Chemistry.Metrics;

/// <summary>The rungs of the loss ladder, from charged mass down to isolated product, in ladder order.</summary>
public enum LossRungKind
{
    /// <summary>m_aux − m_rec. Negative when recovered streams contain reactant (recovered excess reagent).</summary>
    AuxiliariesNotRecovered,

    /// <summary>m_rec.</summary>
    Recovered,

    /// <summary>m_react − m_stoich: reactant charged beyond the limiting reactant's stoichiometric need.</summary>
    ExcessReactants,

    /// <summary>m_stoich − m_theo: co-products the equation forces (the atom-economy loss).</summary>
    CoProducts,

    /// <summary>Yield loss, part 1: desired product found in waste streams.</summary>
    ProductInWaste,

    /// <summary>Yield loss, part 2: desired product withdrawn in samples.</summary>
    ProductInSamples,

    /// <summary>Yield loss, remainder: m_theo − m_act − product in waste − product in samples. Negative above 100 % yield.</summary>
    UnexplainedYieldLoss,
}
