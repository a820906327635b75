using BatchReconcile.Chemistry.Numerics;

namespace BatchReconcile.Records.Definitions.Loading;

/// <summary>
/// Hints for definition errors drawn from the loaded materials: the code nearest to one that is not defined,
/// and the material that would balance a reaction that does not.
/// </summary>
internal sealed class MaterialHints(IReadOnlyDictionary<string, MaterialDraft> materials)
{
    // Up to 4 of one species covers the usual slips (a water, two HCl, ...); more is a wrong equation, not a missing term.
    private const int MaxMissingCount = 4;

    /// <summary>" (did you mean 'HCL'?)", or empty.</summary>
    public string Near(string code) => NearestCode.Hint(code, materials.Keys);

    /// <summary>
    /// The material (and how many of it) whose formula is exactly <paramref name="difference"/> (element by element,
    /// charge under <see cref="Chemistry.Equations.Imbalance.ChargeQuantity"/>) divided by 1 to 4; null when none is.
    /// </summary>
    public (MaterialDraft Material, int Count)? Balancing(IReadOnlyDictionary<string, Rational> difference)
    {
        foreach (var count in Enumerable.Range(1, MaxMissingCount))
        {
            foreach (var material in materials.Values.Where(m => m is { IsValid: true, Formula: not null, Vented: false }).OrderBy(m => m.Code, StringComparer.Ordinal))
            {
                var formula = material.Formula!;
                var quantities = formula.Elements.Keys.Append(Chemistry.Equations.Imbalance.ChargeQuantity).Concat(difference.Keys).Distinct(StringComparer.Ordinal);
                if (quantities.All(q => difference.GetValueOrDefault(q) == count * Amount(formula, q)))
                {
                    return (material, count);
                }
            }
        }

        return null;
    }

    private static Rational Amount(Chemistry.Formulas.Formula formula, string quantity) =>
        quantity == Chemistry.Equations.Imbalance.ChargeQuantity
            ? Rational.FromInteger(formula.Charge)
            : Rational.FromDecimal(formula.Elements.GetValueOrDefault(quantity));
}
