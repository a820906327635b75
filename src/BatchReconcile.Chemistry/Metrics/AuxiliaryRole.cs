namespace BatchReconcile.Chemistry.Metrics;

/// <summary>What a non-reactant charge or a recovered stream is, as far as the simple E-factor cares.</summary>
public enum AuxiliaryRole
{
    /// <summary>Catalyst, reagent outside the equation, work-up chemical, or anything not solvent or water.</summary>
    Other = 0,

    /// <summary>Process solvent.</summary>
    Solvent,

    /// <summary>Process water.</summary>
    Water,
}
