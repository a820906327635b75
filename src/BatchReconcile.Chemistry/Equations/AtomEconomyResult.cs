using System.Diagnostics.CodeAnalysis;

namespace BatchReconcile.Chemistry.Equations;

/// <summary>The outcome of <see cref="AtomEconomy.Compute"/>: the figures, or why they could not be computed.</summary>
public sealed class AtomEconomyResult
{
    private AtomEconomyResult(AtomEconomy? value, string? error)
    {
        Value = value;
        Error = error;
    }

    [MemberNotNullWhen(true, nameof(Value))]
    [MemberNotNullWhen(false, nameof(Error))]
    public bool IsSuccess => Value is not null;

    public AtomEconomy? Value { get; }

    public string? Error { get; }

    internal static AtomEconomyResult Success(AtomEconomy value) => new(value, null);

    internal static AtomEconomyResult Failure(string error) => new(null, error);

    public override string ToString() => IsSuccess ? Value.ToString() : Error;
}
