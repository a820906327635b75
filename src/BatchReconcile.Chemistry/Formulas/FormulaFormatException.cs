namespace BatchReconcile.Chemistry.Formulas;

/// <summary>Thrown by <see cref="Formula.Parse"/> for text that is not a formula; carries the located error.</summary>
public sealed class FormulaFormatException : FormatException
{
    public FormulaFormatException(FormulaError error)
        : base((error ?? throw new ArgumentNullException(nameof(error))).Message)
    {
        Error = error;
    }

    public FormulaError Error { get; }
}
