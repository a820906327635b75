namespace BatchReconcile.Chemistry.Elements;

/// <summary>
/// One entry of the <see cref="PeriodicTable"/>: a chemical element with a standard atomic weight,
/// or one of the hydrogen isotopes deuterium (D) and tritium (T), which formulas may name on their own.
/// </summary>
public sealed class Element
{
    internal Element(int index, string symbol, string name, int atomicNumber, double standardAtomicWeight, bool isIsotope)
    {
        if (symbol.Length is < 1 or > 2 || !char.IsAsciiLetterUpper(symbol[0]) || (symbol.Length == 2 && !char.IsAsciiLetterLower(symbol[1])))
            throw new ArgumentException($"'{symbol}' is not an element symbol.", nameof(symbol));
        ArgumentOutOfRangeException.ThrowIfLessThan(atomicNumber, 1);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(standardAtomicWeight);
        Index = index;
        Symbol = symbol;
        Name = name;
        AtomicNumber = atomicNumber;
        StandardAtomicWeight = standardAtomicWeight;
        IsIsotope = isIsotope;
    }

    /// <summary>Position in <see cref="PeriodicTable.All"/>; lets the parser work with small integers instead of strings.</summary>
    internal int Index { get; }

    public string Symbol { get; }

    public string Name { get; }

    public int AtomicNumber { get; }

    /// <summary>
    /// Standard atomic weight abridged to five significant figures (conventional value for elements
    /// published as intervals). For D and T this is the atomic mass of the nuclide instead.
    /// </summary>
    public double StandardAtomicWeight { get; }

    /// <summary>True for D and T, which are single nuclides rather than elements.</summary>
    public bool IsIsotope { get; }

    public override string ToString() => Symbol;
}
