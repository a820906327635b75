using BatchReconcile.Chemistry.Numerics;

namespace BatchReconcile.Chemistry.Equations;

/// <summary>
/// Exact check of an equation as written: for each element and for charge, Σ products − Σ reactants
/// with <see cref="Rational"/> coefficients (an unwritten coefficient counts as 1). Used to refuse
/// recipes whose equations do not balance.
/// </summary>
public static class BalanceCheck
{
    public static BalanceReport Check(ChemicalEquation equation)
    {
        ArgumentNullException.ThrowIfNull(equation);

        var order = new List<string>();
        var net = new Dictionary<string, Rational>(StringComparer.Ordinal);
        var charge = Rational.Zero;
        for (var i = 0; i < equation.Terms.Count; i++)
        {
            var term = equation.Terms[i];
            var sign = i < equation.Reactants.Count ? -Rational.One : Rational.One;
            var nu = sign * term.EffectiveCoefficient;
            foreach (var (element, count) in term.Formula.Elements)
            {
                if (!net.TryGetValue(element, out var sum))
                {
                    order.Add(element);
                    sum = Rational.Zero;
                }

                net[element] = sum + (nu * Rational.FromDecimal(count));
            }

            charge += nu * term.Formula.Charge;
        }

        var imbalances = new List<Imbalance>();
        foreach (var element in order)
        {
            if (ToImbalance(element, net[element]) is { } imbalance)
            {
                imbalances.Add(imbalance);
            }
        }

        if (ToImbalance(Imbalance.ChargeQuantity, charge) is { } chargeImbalance)
        {
            imbalances.Add(chargeImbalance);
        }

        return new BalanceReport(imbalances);
    }

    private static Imbalance? ToImbalance(string quantity, Rational productsMinusReactants) =>
        productsMinusReactants.Sign switch
        {
            0 => null,
            > 0 => new Imbalance(quantity, productsMinusReactants, EquationSide.Products),
            _ => new Imbalance(quantity, -productsMinusReactants, EquationSide.Reactants),
        };
}
