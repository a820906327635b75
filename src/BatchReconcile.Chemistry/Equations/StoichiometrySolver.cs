using System.Globalization;
using System.Numerics;
using System.Text;
using BatchReconcile.Chemistry.Numerics;

namespace BatchReconcile.Chemistry.Equations;

/// <summary>
/// Exact balancing core. Rows are elements (plus a charge row when any species is charged),
/// columns are species with products negated; the coefficients are the null space of that
/// matrix, found by Gaussian elimination over <see cref="Rational"/>.
/// </summary>
internal static class StoichiometrySolver
{
    public static StoichiometrySolution Solve(IReadOnlyList<StoichiometryColumn> columns)
    {
        ArgumentNullException.ThrowIfNull(columns);

        if (FindRepeatedSpecies(columns) is { } repeated)
        {
            return StoichiometrySolution.Failure(BalanceFailureKind.RepeatedSpecies, repeated, 0);
        }

        var elements = ElementOrder(columns);
        if (FindOneSidedElements(columns, elements) is { } oneSided)
        {
            return StoichiometrySolution.Failure(BalanceFailureKind.ElementOnOneSide, oneSided, 0);
        }

        var charged = columns.Any(c => c.Charge != 0);
        var matrix = BuildMatrix(columns, elements, includeCharge: charged);
        var basis = matrix.NullSpace();

        if (basis.Count == 0)
        {
            if (charged && BuildMatrix(columns, elements, includeCharge: false).NullSpace().Count > 0)
            {
                var list = string.Join(", ", columns.Where(c => c.Charge != 0).Select(c => $"'{c.Label}' ({FormatCharge(c.Charge)})"));
                return StoichiometrySolution.Failure(
                    BalanceFailureKind.ChargeCannotBalance,
                    $"no solution: the atoms can balance but the charge cannot; check the charged species {list} and whether a charged species is missing",
                    0);
            }

            return StoichiometrySolution.Failure(
                BalanceFailureKind.NoSolution,
                "no solution: only all-zero coefficients balance every element; check the formulas and whether a species is missing",
                0);
        }

        if (basis.Count > 1)
        {
            return StoichiometrySolution.Failure(
                BalanceFailureKind.MultipleIndependentReactions,
                $"the equation mixes {basis.Count} independent reactions, so the atoms alone do not fix the ratios; "
                + "split it into separate equations, or fix the coefficients yourself and use the balance check",
                basis.Count);
        }

        var integers = ToSmallestIntegers(basis[0]);
        return Orient(columns, integers);
    }

    private static StoichiometrySolution Orient(IReadOnlyList<StoichiometryColumn> columns, BigInteger[] integers)
    {
        // The null space fixes the ratios only up to sign; take the sign that puts most species where they are written.
        var positives = integers.Count(v => v.Sign > 0);
        var negatives = integers.Count(v => v.Sign < 0);
        var firstNonZero = integers.First(v => !v.IsZero);
        if (negatives > positives || (negatives == positives && firstNonZero.Sign < 0))
        {
            for (var i = 0; i < integers.Length; i++)
            {
                integers[i] = -integers[i];
            }
        }

        if (integers.All(v => v.Sign > 0))
        {
            return StoichiometrySolution.Success(integers);
        }

        var problems = new List<string>();
        for (var i = 0; i < integers.Length; i++)
        {
            var column = columns[i];
            if (integers[i].IsZero)
            {
                problems.Add($"'{column.Label}' would take no part (coefficient 0)");
            }
            else if (integers[i].Sign < 0)
            {
                var other = column.Side == EquationSide.Reactants ? EquationSide.Products : EquationSide.Reactants;
                problems.Add(
                    $"'{column.Label}' would have to be on the {EquationText.SideName(other)} "
                    + $"(coefficient {BigInteger.Abs(integers[i]).ToString(CultureInfo.InvariantCulture)})");
            }
        }

        return StoichiometrySolution.Failure(
            BalanceFailureKind.NoPositiveSolution,
            "no positive solution: the only balance has " + string.Join("; ", problems),
            1);
    }

    private static BigInteger[] ToSmallestIntegers(IReadOnlyList<Rational> vector)
    {
        var lcm = BigInteger.One;
        foreach (var v in vector)
        {
            lcm = lcm / BigInteger.GreatestCommonDivisor(lcm, v.Denominator) * v.Denominator;
        }

        var integers = new BigInteger[vector.Count];
        var gcd = BigInteger.Zero;
        for (var i = 0; i < vector.Count; i++)
        {
            integers[i] = vector[i].Numerator * (lcm / vector[i].Denominator);
            gcd = BigInteger.GreatestCommonDivisor(gcd, integers[i]);
        }

        // A basis vector has a 1 in its free column, so gcd is never zero here.
        for (var i = 0; i < integers.Length; i++)
        {
            integers[i] /= gcd;
        }

        return integers;
    }

    private static RationalMatrix BuildMatrix(IReadOnlyList<StoichiometryColumn> columns, IReadOnlyList<string> elements, bool includeCharge)
    {
        var rowCount = elements.Count + (includeCharge ? 1 : 0);
        var entries = new Rational[rowCount, columns.Count];
        var rowOf = new Dictionary<string, int>(elements.Count, StringComparer.Ordinal);
        for (var r = 0; r < elements.Count; r++)
        {
            rowOf[elements[r]] = r;
        }

        for (var c = 0; c < columns.Count; c++)
        {
            var column = columns[c];
            var negate = column.Side == EquationSide.Products;
            foreach (var (element, count) in column.Elements)
            {
                var r = rowOf[element];
                entries[r, c] += negate ? -count : count;
            }

            if (includeCharge)
            {
                entries[rowCount - 1, c] = negate ? -column.Charge : column.Charge;
            }
        }

        return RationalMatrix.Create(entries);
    }

    private static List<string> ElementOrder(IReadOnlyList<StoichiometryColumn> columns)
    {
        var seen = new HashSet<string>(StringComparer.Ordinal);
        var order = new List<string>();
        foreach (var column in columns)
        {
            foreach (var (element, count) in column.Elements)
            {
                if (!count.IsZero && seen.Add(element))
                {
                    order.Add(element);
                }
            }
        }

        return order;
    }

    private static string? FindOneSidedElements(IReadOnlyList<StoichiometryColumn> columns, IReadOnlyList<string> elements)
    {
        var problems = new List<string>();
        foreach (var element in elements)
        {
            var holders = columns.Where(c => c.Elements.Any(e => e.Key == element && !e.Value.IsZero)).ToList();
            var sides = holders.Select(c => c.Side).Distinct().ToList();
            if (sides.Count == 1)
            {
                var holderList = string.Join(", ", holders.Select(c => $"'{c.Label}'"));
                problems.Add($"{element} appears only on the {EquationText.SideName(sides[0])} (in {holderList})");
            }
        }

        return problems.Count == 0 ? null : "element on one side only: " + string.Join("; ", problems);
    }

    private static string? FindRepeatedSpecies(IReadOnlyList<StoichiometryColumn> columns)
    {
        var firstByComposition = new Dictionary<string, StoichiometryColumn>(StringComparer.Ordinal);
        foreach (var column in columns)
        {
            var key = CompositionKey(column);
            if (!firstByComposition.TryGetValue(key, out var earlier))
            {
                firstByComposition[key] = column;
                continue;
            }

            var first = $"species {earlier.Index} on the {EquationText.SideName(earlier.Side)}";
            var second = $"species {column.Index} on the {EquationText.SideName(column.Side)}";
            if (earlier.Side != column.Side)
            {
                return earlier.Label == column.Label
                    ? $"'{column.Label}' is written on both sides ({first} and {second}); cancel it or keep it on one side"
                    : $"'{earlier.Label}' ({first}) and '{column.Label}' ({second}) have the same composition on both sides; cancel it or keep it on one side";
            }

            return earlier.Label == column.Label
                ? $"'{column.Label}' is written twice on the {EquationText.SideName(column.Side)} ({first} and {second}); write it once"
                : $"'{earlier.Label}' ({first}) and '{column.Label}' ({second}) have the same composition; the balancer cannot tell them apart, write it once";
        }

        return null;
    }

    private static string CompositionKey(StoichiometryColumn column)
    {
        var builder = new StringBuilder();
        foreach (var (element, count) in column.Elements.Where(e => !e.Value.IsZero).OrderBy(e => e.Key, StringComparer.Ordinal))
        {
            builder.Append(element).Append(':').Append(count.ToString()).Append(';');
        }

        return builder.Append("q:").Append(column.Charge.ToString(CultureInfo.InvariantCulture)).ToString();
    }

    private static string FormatCharge(int charge) =>
        charge > 0
            ? charge.ToString(CultureInfo.InvariantCulture) + "+"
            : Math.Abs(charge).ToString(CultureInfo.InvariantCulture) + "-";
}
