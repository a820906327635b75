namespace BatchReconcile.Chemistry.Equations;

/// <summary>
/// Thrown by <see cref="ChemicalEquation.Parse(string, Func{string, Formulas.Formula?}?)"/> for text
/// that was expected to be valid (constants in code). Untrusted text goes through TryParse instead.
/// </summary>
public sealed class EquationFormatException : FormatException
{
    public EquationFormatException(EquationError error)
        : base(error?.ToString())
    {
        ArgumentNullException.ThrowIfNull(error);
        Error = error;
    }

    public EquationError Error { get; }
}
