using System.Numerics;

namespace BatchReconcile.Chemistry.Equations;

/// <summary>What the balancer core found: the smallest positive integer coefficients, or why there are none.</summary>
internal sealed record StoichiometrySolution(
    IReadOnlyList<BigInteger>? Coefficients,
    BalanceFailureKind? FailureKind,
    string? Message,
    int NullSpaceDimension)
{
    public static StoichiometrySolution Success(IReadOnlyList<BigInteger> coefficients) => new(coefficients, null, null, 1);

    public static StoichiometrySolution Failure(BalanceFailureKind kind, string message, int nullSpaceDimension) =>
        new(null, kind, message, nullSpaceDimension);
}
