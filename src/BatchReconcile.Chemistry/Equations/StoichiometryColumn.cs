using BatchReconcile.Chemistry.Numerics;

namespace BatchReconcile.Chemistry.Equations;

/// <summary>
/// One species as the balancer sees it: a column of element counts and a charge, with the
/// label and place used in messages. Kept free of the formula type so the linear algebra can be
/// exercised on bare element-count matrices.
/// </summary>
internal sealed record StoichiometryColumn(
    string Label,
    EquationSide Side,
    int Index,
    IReadOnlyList<KeyValuePair<string, Rational>> Elements,
    int Charge);
