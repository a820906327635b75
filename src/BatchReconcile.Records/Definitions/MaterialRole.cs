namespace BatchReconcile.Records.Definitions;

/// <summary>What a material is for in a step; decides how its mass is counted.</summary>
/// <remarks>
/// A material that appears in a step's equation is a reactant or product there whatever its role;
/// the role matters for charges outside the equation (solvent and water are left out of the
/// simple E-factor, for instance).
/// </remarks>
public enum MaterialRole
{
    /// <summary>No role given: a reactant or product by the equation.</summary>
    Reactant,
    Solvent,
    Catalyst,
    Reagent,
    Water,
    Workup,
}
