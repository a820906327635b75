using BatchReconcile.Chemistry.Elements;

namespace BatchReconcile.Chemistry.Formulas;

/// <summary>
/// Adds up the molar mass while the formula is read. A group's mass is summed on its own level and
/// multiplied by the group count when it closes, so no list of atoms is kept and nothing is allocated.
/// </summary>
internal ref struct MassSink : IFormulaSink
{
    private readonly Span<double> _levels;
    private readonly double[] _weights;
    private int _depth;
    private double _total;

    /// <param name="levels">At least <see cref="FormulaReader.MaxDepth"/> + 1 slots.</param>
    public MassSink(Span<double> levels)
    {
        _levels = levels;
        _weights = PeriodicTable.Weights;
    }

    public readonly double Total => _total;

    public void BeginPart(FormulaNumber multiplier)
    {
        _depth = 0;
        _levels[0] = 0;
    }

    public void Atom(int elementIndex, FormulaNumber count) => _levels[_depth] += _weights[elementIndex] * count.ToDouble();

    public void OpenGroup() => _levels[++_depth] = 0;

    public void CloseGroup(FormulaNumber count)
    {
        double group = _levels[_depth] * count.ToDouble();
        _depth--;
        _levels[_depth] += group;
    }

    public void EndPart(FormulaNumber multiplier) => _total += _levels[0] * multiplier.ToDouble();
}
