namespace BatchReconcile.Chemistry.Numerics;

/// <summary>
/// An immutable matrix of <see cref="Rational"/> entries with exact Gaussian elimination
/// (reduced row echelon form, rank, null space). No floating point anywhere.
/// </summary>
public sealed class RationalMatrix
{
    private readonly Rational[,] _entries;

    private RationalMatrix(Rational[,] entries)
    {
        _entries = entries;
    }

    public int RowCount => _entries.GetLength(0);

    public int ColumnCount => _entries.GetLength(1);

    public Rational this[int row, int column] => _entries[row, column];

    /// <summary>Copies the entries, so later changes to the array do not reach the matrix.</summary>
    public static RationalMatrix Create(Rational[,] entries)
    {
        ArgumentNullException.ThrowIfNull(entries);
        return new RationalMatrix((Rational[,])entries.Clone());
    }

    /// <summary>Builds a matrix from rows of equal length.</summary>
    public static RationalMatrix FromRows(IReadOnlyList<IReadOnlyList<Rational>> rows)
    {
        ArgumentNullException.ThrowIfNull(rows);
        var columns = rows.Count == 0 ? 0 : rows[0].Count;
        var entries = new Rational[rows.Count, columns];
        for (var r = 0; r < rows.Count; r++)
        {
            if (rows[r].Count != columns)
            {
                throw new ArgumentException($"Row {r} has {rows[r].Count} entries; row 0 has {columns}.", nameof(rows));
            }

            for (var c = 0; c < columns; c++)
            {
                entries[r, c] = rows[r][c];
            }
        }

        return new RationalMatrix(entries);
    }

    /// <summary>The reduced row echelon form and the pivot column of each non-zero row.</summary>
    public (RationalMatrix Reduced, IReadOnlyList<int> PivotColumns) ReducedRowEchelonForm()
    {
        var work = (Rational[,])_entries.Clone();
        var pivots = Reduce(work, RowCount, ColumnCount);
        return (new RationalMatrix(work), pivots);
    }

    public int Rank()
    {
        var work = (Rational[,])_entries.Clone();
        return Reduce(work, RowCount, ColumnCount).Count;
    }

    /// <summary>
    /// A basis of the null space {x : A·x = 0}: one vector per free column, with that free
    /// variable set to 1 and the other free variables 0. Empty when the only solution is x = 0.
    /// </summary>
    public IReadOnlyList<IReadOnlyList<Rational>> NullSpace()
    {
        var rows = RowCount;
        var columns = ColumnCount;
        var work = (Rational[,])_entries.Clone();
        var pivots = Reduce(work, rows, columns);

        var isPivot = new bool[columns];
        foreach (var p in pivots)
        {
            isPivot[p] = true;
        }

        var basis = new List<IReadOnlyList<Rational>>(columns - pivots.Count);
        for (var free = 0; free < columns; free++)
        {
            if (isPivot[free])
            {
                continue;
            }

            var vector = new Rational[columns];
            vector[free] = Rational.One;

            // Row i of the reduced form reads x[pivot i] + sum(a[i, f] * x[f]) = 0 over free columns f.
            for (var i = 0; i < pivots.Count; i++)
            {
                vector[pivots[i]] = -work[i, free];
            }

            basis.Add(vector);
        }

        return basis;
    }

    private static List<int> Reduce(Rational[,] a, int rows, int columns)
    {
        var pivots = new List<int>(Math.Min(rows, columns));
        var pivotRow = 0;
        for (var column = 0; column < columns && pivotRow < rows; column++)
        {
            var found = -1;
            for (var r = pivotRow; r < rows; r++)
            {
                if (!a[r, column].IsZero)
                {
                    found = r;
                    break;
                }
            }

            if (found < 0)
            {
                continue;
            }

            if (found != pivotRow)
            {
                for (var c = column; c < columns; c++)
                {
                    (a[found, c], a[pivotRow, c]) = (a[pivotRow, c], a[found, c]);
                }
            }

            var pivot = a[pivotRow, column];
            if (pivot != Rational.One)
            {
                for (var c = column; c < columns; c++)
                {
                    a[pivotRow, c] /= pivot;
                }
            }

            for (var r = 0; r < rows; r++)
            {
                if (r == pivotRow)
                {
                    continue;
                }

                var factor = a[r, column];
                if (factor.IsZero)
                {
                    continue;
                }

                for (var c = column; c < columns; c++)
                {
                    if (!a[pivotRow, c].IsZero)
                    {
                        a[r, c] -= factor * a[pivotRow, c];
                    }
                }
            }

            pivots.Add(column);
            pivotRow++;
        }

        return pivots;
    }
}
