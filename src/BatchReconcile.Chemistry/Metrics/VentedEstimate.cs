namespace BatchReconcile.Chemistry.Metrics;

/// <summary>Expected mass of one vented gas of the equation.</summary>
/// <param name="Code">Species code.</param>
/// <param name="AtActualExtentKg">ξ_act·ν_g·M_g: the reported estimate, from the product actually isolated.</param>
/// <param name="AtMaxExtentKg">ξ_max·ν_g·M_g: the most the limiting reactant allows; null when ξ_max is undefined.</param>
/// <remarks>
/// A stoichiometric estimate for the mass balance only: it is not a measurement of what left the vessel
/// and supports, not replaces, site venting procedures, local codes and qualified review.
/// </remarks>
public sealed record VentedEstimate(string Code, double AtActualExtentKg, double? AtMaxExtentKg);
