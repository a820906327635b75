namespace BatchReconcile.Chemistry.Formulas;

/// <summary>
/// Receives what <see cref="FormulaReader"/> reads, in order. One reader serves both the
/// allocation-free mass path and the full composition path, so both accept exactly the same text.
/// Implementations are structs so the generic reader is specialised and the calls inlined.
/// </summary>
internal interface IFormulaSink
{
    /// <summary>Start of a formula part (the whole formula, or the part after an adduct separator) with its multiplier.</summary>
    void BeginPart(FormulaNumber multiplier);

    void Atom(int elementIndex, FormulaNumber count);

    void OpenGroup();

    void CloseGroup(FormulaNumber count);

    void EndPart(FormulaNumber multiplier);
}
