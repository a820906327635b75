using BatchReconcile.Chemistry.Formulas;
using BatchReconcile.Chemistry.Numerics;

namespace BatchReconcile.Chemistry.Equations;

/// <summary>One species in an equation, with the coefficient written before it (null when none was written).</summary>
public sealed class EquationTerm
{
    private EquationTerm(string species, Formula formula, Rational? coefficient)
    {
        Species = species;
        Formula = formula;
        Coefficient = coefficient;
    }

    /// <summary>The species as written: a formula, or a name the caller's lookup resolved.</summary>
    public string Species { get; }

    public Formula Formula { get; }

    /// <summary>The written coefficient; null when none was written.</summary>
    public Rational? Coefficient { get; }

    /// <summary>The coefficient that applies: an unwritten coefficient means 1.</summary>
    public Rational EffectiveCoefficient => Coefficient ?? Rational.One;

    /// <summary>Bad arguments here are bugs in the caller (text goes through the equation parser) and throw.</summary>
    public static EquationTerm Create(string species, Formula formula, Rational? coefficient = null)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(species);
        ArgumentNullException.ThrowIfNull(formula);
        if (species.Any(char.IsWhiteSpace))
        {
            throw new ArgumentException($"Species '{species}' contains white space.", nameof(species));
        }

        if (coefficient is { Sign: <= 0 } c)
        {
            throw new ArgumentOutOfRangeException(nameof(coefficient), c.ToString(), "A coefficient must be positive.");
        }

        return new EquationTerm(species, formula, coefficient);
    }

    public EquationTerm WithCoefficient(Rational? coefficient) => Create(Species, Formula, coefficient);

    /// <summary>"2 H2O", "1/2 O2", or just "H2O" when the coefficient is 1 or unwritten.</summary>
    public override string ToString() =>
        Coefficient is { } c && c != Rational.One ? $"{c} {Species}" : Species;
}
