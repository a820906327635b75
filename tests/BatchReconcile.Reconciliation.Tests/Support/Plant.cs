using BatchReconcile.Chemistry.Formulas;
using BatchReconcile.Records.Definitions;

namespace BatchReconcile.Reconciliation.Tests.Support;

/// <summary>Builds process definitions for tests directly, without the JSON loader.</summary>
internal static class Plant
{
    public static Material M(string code, string name, string formula, MaterialRole role = MaterialRole.Reactant, bool vented = false) =>
        new(code, name, Formula.Parse(formula), role, vented, "test-definitions.json");

    /// <summary>A solution material: components (code, mass %), the main one first.</summary>
    public static Material Solution(string code, string name, params (string Code, double Pct)[] components) =>
        new(code, name, null, MaterialRole.Reactant, false, "test-definitions.json")
        {
            Composition = components.Select(c => new SolutionComponent(c.Code, c.Pct)).ToArray(),
        };

    /// <summary>A balanced reaction from (coefficient, code) lists; the text is rebuilt for messages.</summary>
    public static RecipeReaction Reaction((double Nu, string Code)[] reactants, (double Nu, string Code)[] products)
    {
        static string Side((double Nu, string Code)[] side) =>
            string.Join(" + ", side.Select(s => s.Nu == 1 ? s.Code : FormattableString.Invariant($"{s.Nu} {s.Code}")));
        string text = $"{Side(reactants)} -> {Side(products)}";
        return new RecipeReaction(
            text,
            text,
            reactants.Select(r => new ReactionSpecies(r.Code, r.Nu)).ToArray(),
            products.Select(p => new ReactionSpecies(p.Code, p.Nu)).ToArray());
    }

    public static RecipeStep Step(
        string code,
        string name,
        RecipeReaction reaction,
        string product,
        double yieldMin,
        double yieldMax,
        double tolerancePct,
        Dictionary<string, ValueRange>? equivalents = null,
        Dictionary<FlagCode, FlagSeverity>? severities = null,
        double? productInWasteMaxPct = null) =>
        new(code, name, reaction, product, new ValueRange(yieldMin, yieldMax), tolerancePct,
            equivalents ?? [], severities ?? [], productInWasteMaxPct);

    public static Recipe Recipe(string code, params RecipeStep[] steps) => new(code, 1, code, steps, "test-definitions.json");
}
