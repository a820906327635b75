namespace BatchReconcile.Records.Definitions;

/// <summary>A step's reaction after loading: balanced, in material codes, with its text as written.</summary>
/// <param name="Text">The reaction as written in the definition file.</param>
/// <param name="Balanced">The balanced equation in canonical form (what was used).</param>
public sealed record RecipeReaction(
    string Text,
    string Balanced,
    IReadOnlyList<ReactionSpecies> Reactants,
    IReadOnlyList<ReactionSpecies> Products);
