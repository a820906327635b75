namespace BatchReconcile.Chemistry.Formulas;

/// <summary>
/// Collects exact element counts. Atoms of an open group are kept as entries and multiplied when the
/// group closes (its count is only known then); at the end of a part they are added to the totals.
/// </summary>
internal struct CompositionSink : IFormulaSink
{
    private readonly List<(int Element, decimal Count)> _entries;
    private readonly int[] _groupStarts;
    private int _depth;

    public CompositionSink(int elementCount)
    {
        _entries = new List<(int, decimal)>(16);
        _groupStarts = new int[FormulaReader.MaxDepth + 1];
        Totals = new decimal[elementCount];
    }

    /// <summary>Total count by element index; zero where the element does not occur.</summary>
    public decimal[] Totals { get; }

    public void BeginPart(FormulaNumber multiplier)
    {
        _entries.Clear();
        _depth = 0;
    }

    public readonly void Atom(int elementIndex, FormulaNumber count) => _entries.Add((elementIndex, count.ToDecimal()));

    public void OpenGroup() => _groupStarts[++_depth] = _entries.Count;

    public void CloseGroup(FormulaNumber count)
    {
        int start = _groupStarts[_depth--];
        if (count.IsOne) return;
        decimal factor = count.ToDecimal();
        for (int i = start; i < _entries.Count; i++)
            _entries[i] = (_entries[i].Element, _entries[i].Count * factor);
    }

    public readonly void EndPart(FormulaNumber multiplier)
    {
        decimal factor = multiplier.ToDecimal();
        foreach (var (element, count) in _entries)
            Totals[element] += count * factor;
    }
}
