using System.Diagnostics.CodeAnalysis;
using System.Numerics;

namespace BatchReconcile.Chemistry.Equations;

/// <summary>The outcome of <see cref="EquationBalancer"/>: coefficients and the balanced equation, or why not.</summary>
public sealed class BalanceResult
{
    private BalanceResult(
        IReadOnlyList<BigInteger> coefficients,
        ChemicalEquation? equation,
        BalanceFailureKind? failureKind,
        string? message,
        EquationError? parseError)
    {
        Coefficients = coefficients;
        Equation = equation;
        FailureKind = failureKind;
        Message = message;
        ParseError = parseError;
    }

    [MemberNotNullWhen(true, nameof(Equation))]
    [MemberNotNullWhen(false, nameof(FailureKind), nameof(Message))]
    public bool IsSuccess => Equation is not null;

    /// <summary>Smallest positive integers, one per term in the order written (reactants then products); empty on failure.</summary>
    public IReadOnlyList<BigInteger> Coefficients { get; }

    /// <summary>The equation with <see cref="Coefficients"/> written in; null on failure.</summary>
    public ChemicalEquation? Equation { get; }

    public BalanceFailureKind? FailureKind { get; }

    /// <summary>Human-readable reason for the failure; null on success.</summary>
    public string? Message { get; }

    /// <summary>Where the text was refused, when <see cref="FailureKind"/> is <see cref="BalanceFailureKind.InvalidEquation"/>.</summary>
    public EquationError? ParseError { get; }

    internal static BalanceResult Success(IReadOnlyList<BigInteger> coefficients, ChemicalEquation equation) =>
        new(coefficients, equation, null, null, null);

    internal static BalanceResult Failure(BalanceFailureKind kind, string message) =>
        new([], null, kind, message, null);

    internal static BalanceResult Invalid(EquationError error) =>
        new([], null, BalanceFailureKind.InvalidEquation, error.ToString(), error);

    public override string ToString() => IsSuccess ? Equation.ToString() : $"{FailureKind}: {Message}";
}
