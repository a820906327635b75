namespace BatchReconcile.Chemistry.Equations;

/// <summary>Why equation text was refused, with the 1-based character position it refers to.</summary>
public sealed record EquationError(int Position, string Message)
{
    public override string ToString() => $"at {Position}: {Message}";
}
