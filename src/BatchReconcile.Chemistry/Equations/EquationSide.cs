namespace BatchReconcile.Chemistry.Equations;

/// <summary>Which side of the arrow a term is written on.</summary>
public enum EquationSide
{
    Reactants,
    Products,
}
