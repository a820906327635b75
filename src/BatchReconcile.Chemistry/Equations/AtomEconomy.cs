using System.Globalization;
using BatchReconcile.Chemistry.Numerics;

namespace BatchReconcile.Chemistry.Equations;

/// <summary>
/// Atom economy of one product of a balanced equation (Trost, Science 1991):
/// AE % = 100 · ν_P · M_P / Σ(ν_r · M_r) over all reactants.
/// Molar masses come from <see cref="Formulas.Formula.MolarMass"/>, so AE is a reporting figure in
/// double precision; the balance it rests on is checked exactly.
/// </summary>
public sealed class AtomEconomy
{
    private AtomEconomy(string productSpecies, Rational productCoefficient, double productMolarMass, double reactantMolarMassSum)
    {
        ProductSpecies = productSpecies;
        ProductCoefficient = productCoefficient;
        ProductMolarMass = productMolarMass;
        ReactantMolarMassSum = reactantMolarMassSum;
    }

    public string ProductSpecies { get; }

    /// <summary>ν_P, the product's coefficient in the equation.</summary>
    public Rational ProductCoefficient { get; }

    /// <summary>M_P in g/mol (one mole of product, not multiplied by ν_P).</summary>
    public double ProductMolarMass { get; }

    /// <summary>Σ(ν_r · M_r) over the reactants, in g per "mole of equation".</summary>
    public double ReactantMolarMassSum { get; }

    /// <summary>100 · ν_P · M_P / Σ(ν_r · M_r).</summary>
    public double AtomEconomyPct => 100.0 * ProductCoefficient.ToDouble() * ProductMolarMass / ReactantMolarMassSum;

    /// <summary>
    /// Computes the atom economy of <paramref name="productSpecies"/> (matched to a product's species text
    /// as written, ordinal). Refuses an equation that does not balance as written (unwritten coefficients
    /// count as 1) and a species that is not a product.
    /// </summary>
    public static AtomEconomyResult Compute(ChemicalEquation balanced, string productSpecies)
    {
        ArgumentNullException.ThrowIfNull(balanced);
        ArgumentNullException.ThrowIfNull(productSpecies);

        var product = balanced.Products.FirstOrDefault(t => string.Equals(t.Species, productSpecies, StringComparison.Ordinal));
        if (product is null)
        {
            var isReactant = balanced.Reactants.Any(t => string.Equals(t.Species, productSpecies, StringComparison.Ordinal));
            var products = string.Join(", ", balanced.Products.Select(t => $"'{t.Species}'"));
            return AtomEconomyResult.Failure(isReactant
                ? $"'{productSpecies}' is a reactant, not a product; products are {products}"
                : $"'{productSpecies}' is not a product of the equation; products are {products}");
        }

        var report = BalanceCheck.Check(balanced);
        if (!report.IsBalanced)
        {
            return AtomEconomyResult.Failure($"the equation is not balanced ({report}); balance it before computing atom economy");
        }

        var reactantSum = 0.0;
        foreach (var term in balanced.Reactants)
        {
            reactantSum += term.EffectiveCoefficient.ToDouble() * term.Formula.MolarMass;
        }

        if (reactantSum <= 0.0)
        {
            return AtomEconomyResult.Failure(string.Create(
                CultureInfo.InvariantCulture,
                $"the reactants have a total molar mass of {reactantSum}; atom economy is undefined"));
        }

        return AtomEconomyResult.Success(new AtomEconomy(product.Species, product.EffectiveCoefficient, product.Formula.MolarMass, reactantSum));
    }

    public override string ToString() =>
        string.Create(CultureInfo.InvariantCulture, $"{ProductSpecies}: {AtomEconomyPct:0.00} % ({ProductCoefficient} x {ProductMolarMass:0.00} / {ReactantMolarMassSum:0.00} g/mol)");
}
