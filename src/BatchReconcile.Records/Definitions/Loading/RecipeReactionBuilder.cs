using System.Globalization;
using BatchReconcile.Chemistry.Equations;
using BatchReconcile.Chemistry.Formulas;
using BatchReconcile.Chemistry.Numerics;

namespace BatchReconcile.Records.Definitions.Loading;

/// <summary>
/// Second pass for one step: reads its reaction in material codes, checks every species, the
/// product and vented materials, then checks the written coefficients or balances a reaction
/// written without any.
/// </summary>
internal static class RecipeReactionBuilder
{
    // Stands in for a name that is not a material, so the parser goes on to the post-check that
    // names the unknown code (instead of reporting it as a malformed formula). Never balanced.
    private static readonly Formula Placeholder = Formula.Parse("H");

    public static RecipeReaction? Build(
        string? text,
        string? productCode,
        Func<string, MaterialDraft?> materials,
        DefinitionLocation at,
        List<DefinitionError> errors,
        List<DefinitionNote> notes,
        MaterialHints hints)
    {
        var errorsBefore = errors.Count;
        var product = productCode is null ? null : materials(productCode);
        if (productCode is not null && product is null)
        {
            errors.Add(at.Error($"product '{productCode}' is not a material in any loaded file{hints.Near(productCode)}"));
        }
        else if (product is { Composition: not null })
        {
            errors.Add(at.Error($"product '{product.Code}' is a solution ({ProcessDefinitionLoader.ComponentList(product)}); the product is the substance isolated"));
        }
        else if (product is { Vented: true })
        {
            errors.Add(at.Error($"product '{product.Code}' is a vented material; a vented gas is never weighed, so it cannot be the isolated product"));
        }

        if (text is null)
        {
            return null;
        }

        Formula? Lookup(string name) =>
            materials(name) is { } m
                ? m.Formula ?? Placeholder
                : DefinitionFileReader.IsValidMaterialCode(name) ? Placeholder : null;

        if (!ChemicalEquation.TryParse(text, Lookup, out var written, out var parseError))
        {
            errors.Add(at.Error(
                $"reaction '{text}' cannot be read at character {parseError.Position.ToString(CultureInfo.InvariantCulture)}: {parseError.Message}"));
            return null;
        }

        var terms = new List<(MaterialDraft? Material, EquationTerm Term, bool IsReactant)>();
        foreach (var term in written.Terms)
        {
            var isReactant = terms.Count < written.Reactants.Count;
            var material = materials(term.Species);
            if (material is null)
            {
                errors.Add(at.Error($"reaction '{text}' names '{term.Species}', which is not a material in any loaded file (species are written with material codes){hints.Near(term.Species)}"));
            }
            else if (material.Composition is not null)
            {
                errors.Add(at.Error(
                    $"reaction '{text}' names '{material.Code}', a solution ({ProcessDefinitionLoader.ComponentList(material)}); write the component that reacts "
                    + $"(e.g. {material.Composition[0].Code}) in the reaction and charge {material.Code} in the batch record: its components are counted from its composition"));
            }
            else if (!material.IsValid)
            {
                errors.Add(at.Error($"reaction '{text}' names material '{material.Code}', which was refused ({material.File}, see its own error)"));
            }

            // Keep the position even for unknown species so the reactant/product split stays right.
            terms.Add((material, term, isReactant));
        }

        var known = terms.Where(t => t.Material is not null).Select(t => (Material: t.Material!, t.Term, t.IsReactant)).ToList();
        foreach (var repeated in known.GroupBy(t => t.Material.Code, StringComparer.OrdinalIgnoreCase).Where(g => g.Count() > 1))
        {
            errors.Add(at.Error($"reaction '{text}' names material '{repeated.Key}' more than once; write each material once, on one side"));
        }

        foreach (var (material, _, isReactant) in known)
        {
            if (material.Vented && isReactant)
            {
                errors.Add(at.Error(
                    $"reaction '{text}' has vented material '{material.Code}' among the reactants; a vented gas leaves the vessel unweighed, so it may only be a product"));
            }
        }

        if (product is not null && !known.Any(t => !t.IsReactant && ReferenceEquals(t.Material, product)))
        {
            errors.Add(at.Error($"product '{product.Code}' is not on the product side of reaction '{text}'"));
        }

        if (errors.Count > errorsBefore)
        {
            return null;
        }

        // Rewritten with the catalogue's spelling of each code and the coefficients that apply.
        var canonical = ChemicalEquation.Create(
            known.Where(t => t.IsReactant).Select(t => EquationTerm.Create(t.Material.Code, t.Material.Formula!, t.Term.Coefficient)),
            known.Where(t => !t.IsReactant).Select(t => EquationTerm.Create(t.Material.Code, t.Material.Formula!, t.Term.Coefficient)));

        ChemicalEquation balanced;
        if (canonical.Terms.All(t => t.Coefficient is null))
        {
            var result = EquationBalancer.Balance(canonical);
            if (!result.IsSuccess)
            {
                errors.Add(at.Error($"reaction '{text}' is written without coefficients and cannot be balanced: {result.Message}"));
                return null;
            }

            balanced = result.Equation;
            notes.Add(at.Note($"reaction '{text}' was written without coefficients and was balanced to '{balanced}'"));
        }
        else
        {
            // Partly written coefficients count as written: an unwritten one means 1 and the whole must balance.
            var report = BalanceCheck.Check(canonical);
            if (!report.IsBalanced)
            {
                errors.Add(at.Error($"reaction '{text}' does not balance: {Describe(report.Imbalances, canonical, hints)}"));
                return null;
            }

            balanced = canonical.WithCoefficients(canonical.Terms.Select(t => t.EffectiveCoefficient).ToArray());
        }

        return new RecipeReaction(
            text,
            balanced.ToString(),
            balanced.Reactants.Select(ToSpecies).ToArray(),
            balanced.Products.Select(ToSpecies).ToArray());
    }

    private static ReactionSpecies ToSpecies(EquationTerm term) => new(term.Species, term.EffectiveCoefficient.ToDouble());

    /// <summary>
    /// "H differs by 2 (reactants 6, products 8) and O by 1 (reactants 2, products 3): is a WATER (water) missing on the
    /// left (or one too many on the right)?" The hint is given when every difference points the same way and a loaded material (1 to 4 of it) makes
    /// it up exactly; it is a question, since a wrong coefficient on the other side gives the same difference.
    /// </summary>
    private static string Count(int count) => count.ToString(CultureInfo.InvariantCulture);

    private static string Describe(IReadOnlyList<Imbalance> imbalances, ChemicalEquation equation, MaterialHints hints)
    {
        var parts = new List<string>();
        var difference = new Dictionary<string, Rational>(StringComparer.Ordinal);
        foreach (var imbalance in imbalances)
        {
            var isCharge = imbalance.Quantity == Imbalance.ChargeQuantity;
            Rational Total(IEnumerable<EquationTerm> side) => side.Aggregate(
                Rational.Zero,
                (sum, t) => sum + (t.EffectiveCoefficient * (isCharge
                    ? Rational.FromInteger(t.Formula.Charge)
                    : Rational.FromDecimal(t.Formula.Elements.GetValueOrDefault(imbalance.Quantity)))));

            var reactants = Total(equation.Reactants);
            var products = Total(equation.Products);
            difference[imbalance.Quantity] = products - reactants;
            string Show(Rational value) => isCharge && value.Sign > 0 ? "+" + value : value.ToString();
            var by = parts.Count == 0 ? $"{imbalance.Quantity} differs by" : $"{imbalance.Quantity} by";
            parts.Add($"{by} {imbalance.Amount} (reactants {Show(reactants)}, products {Show(products)})");
        }

        var text = parts.Count == 1 ? parts[0] : string.Join(", ", parts[..^1]) + " and " + parts[^1];
        var signs = difference.Values.Select(d => d.Sign).Distinct().ToList();
        if (signs.Count != 1)
        {
            return text;
        }

        // Products have more of everything: something is missing on the left (the reactants), and the other way round.
        var (side, other) = signs[0] > 0 ? ("left", "right") : ("right", "left");
        var missing = difference.ToDictionary(d => d.Key, d => signs[0] > 0 ? d.Value : -d.Value, StringComparer.Ordinal);
        return hints.Balancing(missing) is { } found
            ? found.Count == 1
                ? $"{text}: is a {found.Material.Code} ({found.Material.Name}) missing on the {side} (or one too many on the {other})?"
                : $"{text}: are {Count(found.Count)} {found.Material.Code} ({found.Material.Name}) missing on the {side} (or {Count(found.Count)} too many on the {other})?"
            : difference.ContainsKey(Imbalance.ChargeQuantity)
                ? text
                : $"{text}: the {side} side has less of each, so a species may be missing there or a coefficient is too small";
    }
}
