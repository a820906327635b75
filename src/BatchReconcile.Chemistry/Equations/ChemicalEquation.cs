using System.Diagnostics.CodeAnalysis;
using BatchReconcile.Chemistry.Formulas;
using BatchReconcile.Chemistry.Numerics;

namespace BatchReconcile.Chemistry.Equations;

/// <summary>
/// Reactant and product terms of a chemical equation.
/// <para>
/// Text form: <c>2 KMnO4 + 16 HCl -&gt; 2 KCl + 2 MnCl2 + 5 Cl2 + 8 H2O</c>. The arrow may be
/// '-&gt;', '→', '=', '&lt;=&gt;' or '⇌' (all mean the same here). Terms are separated by a '+' with
/// white space on both sides, so the charges in <c>NH4^+ + OH^-</c> are not separators. Each term may
/// start with a positive coefficient: integer, decimal or fraction (<c>2 H2O</c>, <c>0.5 O2</c>,
/// <c>1/2 O2</c>), separated by white space or glued on (<c>2H2O</c>, <c>1/2O2</c>) when the species
/// then starts with a letter, '(' or '['. A glued leading number is always read as the equation
/// coefficient, never as the formula's own multiplier.
/// </para>
/// <para>
/// Species are formulas, or names resolved by a caller-supplied lookup (material codes in recipes);
/// the lookup is asked first with the whole term, then with the species after the coefficient, and
/// when it has no entry the species is read as a formula.
/// </para>
/// </summary>
public sealed class ChemicalEquation
{
    private ChemicalEquation(IReadOnlyList<EquationTerm> reactants, IReadOnlyList<EquationTerm> products)
    {
        Reactants = reactants;
        Products = products;
        Terms = [.. reactants, .. products];
    }

    public IReadOnlyList<EquationTerm> Reactants { get; }

    public IReadOnlyList<EquationTerm> Products { get; }

    /// <summary>Reactants then products, in the order written.</summary>
    public IReadOnlyList<EquationTerm> Terms { get; }

    /// <summary>True when every term has a written coefficient.</summary>
    public bool HasAllCoefficients => Terms.All(t => t.Coefficient is not null);

    /// <summary>An empty side is a bug in the caller (text goes through <see cref="TryParse(string, Func{string, Formula?}?, out ChemicalEquation?, out EquationError?)"/>).</summary>
    public static ChemicalEquation Create(IEnumerable<EquationTerm> reactants, IEnumerable<EquationTerm> products)
    {
        ArgumentNullException.ThrowIfNull(reactants);
        ArgumentNullException.ThrowIfNull(products);
        var left = reactants.ToArray();
        var right = products.ToArray();
        if (left.Length == 0 || right.Length == 0)
        {
            throw new ArgumentException("An equation needs at least one reactant and one product.");
        }

        if (left.Concat(right).Any(t => t is null))
        {
            throw new ArgumentException("Terms must not be null.");
        }

        return new ChemicalEquation(left, right);
    }

    public static bool TryParse(string text, [NotNullWhen(true)] out ChemicalEquation? equation, [NotNullWhen(false)] out EquationError? error) =>
        TryParse(text, null, out equation, out error);

    /// <summary>Reads equation text; malformed text gives false and an error with a 1-based position and the reason.</summary>
    /// <param name="text">The equation.</param>
    /// <param name="lookup">Resolves names (such as material codes) to formulas; returns null for names it does not know.</param>
    /// <param name="equation">The equation, when the text is valid.</param>
    /// <param name="error">Where and why the text was refused.</param>
    public static bool TryParse(
        string text,
        Func<string, Formula?>? lookup,
        [NotNullWhen(true)] out ChemicalEquation? equation,
        [NotNullWhen(false)] out EquationError? error)
    {
        ArgumentNullException.ThrowIfNull(text);
        equation = null;

        Func<string, bool>? isKnown = lookup is null ? null : name => lookup(name) is not null;
        if (!EquationText.TryTokenize(text, isKnown, out var rawTerms, out error))
        {
            return false;
        }

        var reactants = new List<EquationTerm>();
        var products = new List<EquationTerm>();
        foreach (var raw in rawTerms)
        {
            var formula = lookup?.Invoke(raw.Species);
            if (formula is null && !Formula.TryParse(raw.Species, out formula, out var formulaError))
            {
                var known = lookup is null ? string.Empty : " (and it is not a known name)";
                error = new EquationError(
                    raw.SpeciesPosition + formulaError.Position - 1,
                    $"species {raw.Index} on the {EquationText.SideName(raw.Side)}: {formulaError.Message} of '{raw.Species}'{known}");
                return false;
            }

            var term = EquationTerm.Create(raw.Species, formula, raw.Coefficient);
            (raw.Side == EquationSide.Reactants ? reactants : products).Add(term);
        }

        equation = new ChemicalEquation(reactants, products);
        error = null;
        return true;
    }

    /// <summary>Reads trusted equation text (constants in code); malformed text is a bug and throws <see cref="EquationFormatException"/>.</summary>
    public static ChemicalEquation Parse(string text, Func<string, Formula?>? lookup = null) =>
        TryParse(text, lookup, out var equation, out var error) ? equation : throw new EquationFormatException(error);

    /// <summary>The same species with new coefficients, one per term in <see cref="Terms"/> order.</summary>
    public ChemicalEquation WithCoefficients(IReadOnlyList<Rational> coefficients)
    {
        ArgumentNullException.ThrowIfNull(coefficients);
        if (coefficients.Count != Terms.Count)
        {
            throw new ArgumentException($"Expected {Terms.Count} coefficients, got {coefficients.Count}.", nameof(coefficients));
        }

        var reactants = Reactants.Select((t, i) => t.WithCoefficient(coefficients[i])).ToArray();
        var products = Products.Select((t, i) => t.WithCoefficient(coefficients[Reactants.Count + i])).ToArray();
        return new ChemicalEquation(reactants, products);
    }

    /// <summary>Canonical text: terms joined by " + ", sides by " -&gt; ", coefficient 1 omitted, fractions as "1/2".</summary>
    public override string ToString() =>
        string.Join(" + ", Reactants) + " -> " + string.Join(" + ", Products);
}
