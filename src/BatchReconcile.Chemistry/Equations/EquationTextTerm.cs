using BatchReconcile.Chemistry.Numerics;

namespace BatchReconcile.Chemistry.Equations;

/// <summary>One term of equation text: where it is, its optional coefficient and the species text.</summary>
internal sealed record EquationTextTerm(
    EquationSide Side,
    int Index,
    int SpeciesPosition,
    string Species,
    Rational? Coefficient);
