using BatchReconcile.Chemistry.Numerics;

namespace BatchReconcile.Chemistry.Equations;

/// <summary>
/// One quantity that does not balance: an element symbol, or "charge".
/// <paramref name="Amount"/> is |Σ products − Σ reactants| (always positive); <paramref name="HeavierSide"/>
/// has the larger total (for charge: the more positive side).
/// </summary>
public sealed record Imbalance(string Quantity, Rational Amount, EquationSide HeavierSide)
{
    public const string ChargeQuantity = "charge";

    /// <summary>"O is off by 2 (products have 2 more)"; "charge is off by 2 (reactants are 2 more positive)".</summary>
    public string Message
    {
        get
        {
            var side = HeavierSide == EquationSide.Products ? "products" : "reactants";
            return Quantity == ChargeQuantity
                ? $"charge is off by {Amount} ({side} are {Amount} more positive)"
                : $"{Quantity} is off by {Amount} ({side} have {Amount} more)";
        }
    }

    public override string ToString() => Message;
}
