using BatchReconcile.Chemistry.Numerics;

namespace BatchReconcile.Chemistry.Tests.Numerics;

public class RationalMatrixTests
{
    private static RationalMatrix Matrix(params int[][] rows) =>
        RationalMatrix.FromRows(rows.Select(r => (IReadOnlyList<Rational>)r.Select(v => (Rational)v).ToArray()).ToArray());

    [Fact]
    public void Null_space_of_full_column_rank_matrix_is_empty()
    {
        var m = Matrix([1, 2], [3, 4]);

        Assert.Empty(m.NullSpace());
        Assert.Equal(2, m.Rank());
    }

    [Fact]
    public void Null_space_vectors_solve_the_homogeneous_system()
    {
        // Rows are linear combinations, so rank 2 with 5 columns: null space of dimension 3.
        var m = Matrix([2, -1, 0, 3, 1], [4, -2, 1, 0, 5], [6, -3, 1, 3, 6]);

        var basis = m.NullSpace();

        Assert.Equal(2, m.Rank());
        Assert.Equal(3, basis.Count);
        foreach (var vector in basis)
        {
            for (var r = 0; r < m.RowCount; r++)
            {
                var sum = Rational.Zero;
                for (var c = 0; c < m.ColumnCount; c++)
                {
                    sum += m[r, c] * vector[c];
                }

                Assert.True(sum.IsZero);
            }
        }
    }

    [Fact]
    public void Null_space_is_found_with_fractional_pivots()
    {
        // 2 H2 + O2 -> 2 H2O as an element matrix: H row (2, 0, -2), O row (0, 2, -1).
        var m = Matrix([2, 0, -2], [0, 2, -1]);

        var basis = Assert.Single(m.NullSpace());

        Assert.Equal(new Rational[] { 1, Rational.Create(1, 2), 1 }, basis);
    }

    [Fact]
    public void Reduced_row_echelon_form_has_unit_pivots_and_zero_columns_elsewhere()
    {
        var m = Matrix([0, 3, 6], [2, 4, 2], [1, 2, 1]);

        var (reduced, pivots) = m.ReducedRowEchelonForm();

        Assert.Equal([0, 1], pivots);
        Assert.Equal(Rational.One, reduced[0, 0]);
        Assert.Equal(Rational.One, reduced[1, 1]);
        Assert.Equal(Rational.Zero, reduced[0, 1]);
        Assert.Equal(Rational.Zero, reduced[1, 0]);
        Assert.Equal(Rational.Create(-3, 1), reduced[0, 2]);
        Assert.Equal(Rational.Create(2, 1), reduced[1, 2]);
        Assert.True(reduced[2, 2].IsZero);
    }

    [Fact]
    public void Create_copies_the_array()
    {
        var entries = new Rational[1, 1];
        entries[0, 0] = 5;
        var m = RationalMatrix.Create(entries);
        entries[0, 0] = 7;

        Assert.Equal((Rational)5, m[0, 0]);
    }

    [Fact]
    public void Ragged_rows_are_a_bug()
    {
        Assert.Throws<ArgumentException>(() => Matrix([1, 2], [3]));
    }
}
