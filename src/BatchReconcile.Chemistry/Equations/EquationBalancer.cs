using BatchReconcile.Chemistry.Formulas;
using BatchReconcile.Chemistry.Numerics;

namespace BatchReconcile.Chemistry.Equations;

/// <summary>
/// Finds the smallest positive integer coefficients that balance every element and the charge,
/// exactly (rational Gaussian elimination on <see cref="System.Numerics.BigInteger"/>, no floating point).
/// <para>
/// Written coefficients are ignored: the balancer uses only which species are on which side. To
/// check coefficients someone wrote, use <see cref="BalanceCheck"/>. When the atoms leave more than
/// one free ratio (several independent reactions mixed in one equation) the balancer refuses rather
/// than pick one.
/// </para>
/// <para>
/// A balanced equation is an atom and charge account only: it does not say that a reaction happens
/// or is safe. Results support, and do not replace, site procedures, local codes and qualified review.
/// </para>
/// </summary>
public static class EquationBalancer
{
    public static BalanceResult Balance(ChemicalEquation equation)
    {
        ArgumentNullException.ThrowIfNull(equation);

        var columns = new StoichiometryColumn[equation.Terms.Count];
        for (var i = 0; i < columns.Length; i++)
        {
            var isReactant = i < equation.Reactants.Count;
            var term = equation.Terms[i];
            var elements = new List<KeyValuePair<string, Rational>>(term.Formula.Elements.Count);
            foreach (var (element, count) in term.Formula.Elements)
            {
                elements.Add(new KeyValuePair<string, Rational>(element, Rational.FromDecimal(count)));
            }

            columns[i] = new StoichiometryColumn(
                term.Species,
                isReactant ? EquationSide.Reactants : EquationSide.Products,
                isReactant ? i + 1 : i - equation.Reactants.Count + 1,
                elements,
                term.Formula.Charge);
        }

        var solution = StoichiometrySolver.Solve(columns);
        if (solution.Coefficients is not { } coefficients)
        {
            return BalanceResult.Failure(solution.FailureKind!.Value, solution.Message!);
        }

        var balanced = equation.WithCoefficients(coefficients.Select(Rational.FromInteger).ToArray());
        return BalanceResult.Success(coefficients, balanced);
    }

    /// <summary>Parses then balances; text that is not an equation gives <see cref="BalanceFailureKind.InvalidEquation"/> with the located error.</summary>
    public static BalanceResult Balance(string text, Func<string, Formula?>? lookup = null)
    {
        ArgumentNullException.ThrowIfNull(text);
        return ChemicalEquation.TryParse(text, lookup, out var equation, out var error)
            ? Balance(equation)
            : BalanceResult.Invalid(error);
    }
}
