namespace BatchReconcile.Records.Definitions;

/// <summary>One step of a recipe, as the master record defines it.</summary>
/// <param name="ProductCode">Material code of the desired (isolated) product.</param>
/// <param name="YieldPct">Expected percentage yield range of the master record.</param>
/// <param name="BalanceTolerancePct">Allowed gross mass-balance gap, % of the charged mass.</param>
/// <param name="Equivalents">Allowed equivalents (mol per mol of limiting reactant) by reagent code.</param>
/// <param name="Severities">Severity overrides for this step, over the site's defaults.</param>
/// <param name="ProductInWasteMaxPct">Share of theoretical product allowed in waste streams before a flag; null: the site default.</param>
public sealed record RecipeStep(
    string Code,
    string Name,
    RecipeReaction Reaction,
    string ProductCode,
    ValueRange YieldPct,
    double BalanceTolerancePct,
    IReadOnlyDictionary<string, ValueRange> Equivalents,
    IReadOnlyDictionary<FlagCode, FlagSeverity> Severities,
    double? ProductInWasteMaxPct);
