using System.Numerics;
using BatchReconcile.Chemistry.Equations;
using BatchReconcile.Chemistry.Numerics;

namespace BatchReconcile.Chemistry.Tests.Equations;

/// <summary>The balancing core on bare element-count columns, without formula parsing.</summary>
public class StoichiometrySolverTests
{
    private static StoichiometryColumn Column(string label, EquationSide side, int index, string composition, int charge = 0)
    {
        // composition like "H2 O1": element symbol then count, space separated.
        var elements = composition.Split(' ', StringSplitOptions.RemoveEmptyEntries)
            .Select(part =>
            {
                var digit = part.IndexOfAny("0123456789".ToCharArray());
                return new KeyValuePair<string, Rational>(part[..digit], Rational.Parse(part[digit..]));
            })
            .ToList();
        return new StoichiometryColumn(label, side, index, elements, charge);
    }

    private static StoichiometryColumn L(int index, string label, string composition, int charge = 0) =>
        Column(label, EquationSide.Reactants, index, composition, charge);

    private static StoichiometryColumn R(int index, string label, string composition, int charge = 0) =>
        Column(label, EquationSide.Products, index, composition, charge);

    [Fact]
    public void Balances_water_formation()
    {
        var solution = StoichiometrySolver.Solve([L(1, "H2", "H2"), L(2, "O2", "O2"), R(1, "H2O", "H2 O1")]);

        Assert.Null(solution.FailureKind);
        Assert.Equal([2, 1, 2], solution.Coefficients!.Select(c => (int)c));
    }

    [Fact]
    public void Charge_row_fixes_an_otherwise_free_ratio()
    {
        // 2 Fe3+ + Sn2+ -> 2 Fe2+ + Sn4+: iron and tin alone leave two free ratios (common practice).
        StoichiometryColumn[] columns =
        [
            L(1, "Fe^3+", "Fe1", 3), L(2, "Sn^2+", "Sn1", 2), R(1, "Fe^2+", "Fe1", 2), R(2, "Sn^4+", "Sn1", 4),
        ];

        var solution = StoichiometrySolver.Solve(columns);

        Assert.Equal([2, 1, 2, 1], solution.Coefficients!.Select(c => (int)c));
    }

    [Fact]
    public void Fractional_element_counts_are_exact()
    {
        // A non-stoichiometric oxide Fe0.95O1 reduced by CO: 20 Fe0.95O + 20 CO -> 19 Fe + 20 CO2.
        var solution = StoichiometrySolver.Solve(
            [L(1, "Fe0.95O", "Fe0.95 O1"), L(2, "CO", "C1 O1"), R(1, "Fe", "Fe1"), R(2, "CO2", "C1 O2")]);

        Assert.Equal([20, 20, 19, 20], solution.Coefficients!.Select(c => (int)c));
    }

    [Fact]
    public void Sign_of_the_null_vector_is_chosen_so_species_stay_where_written()
    {
        // Written backwards on purpose: the product side has more columns than the reactant side.
        var solution = StoichiometrySolver.Solve([L(1, "H2O", "H2 O1"), R(1, "H2", "H2"), R(2, "O2", "O2")]);

        Assert.Equal([2, 2, 1], solution.Coefficients!.Select(c => (int)c));
    }

    [Fact]
    public void Names_the_species_that_would_have_to_change_sides()
    {
        // CO + C -> CO2 balances only as 2 CO -> C + CO2 (Boudouard equilibrium, common practice).
        var solution = StoichiometrySolver.Solve([L(1, "CO", "C1 O1"), L(2, "C", "C1"), R(1, "CO2", "C1 O2")]);

        Assert.Equal(BalanceFailureKind.NoPositiveSolution, solution.FailureKind);
        Assert.Equal("no positive solution: the only balance has 'C' would have to be on the right (coefficient 1)", solution.Message);
    }

    [Fact]
    public void Names_species_that_would_take_no_part()
    {
        // NaOH + HCl + CO -> NaCl + H2O + CO2: the oxygen balance forces CO and CO2 to zero.
        StoichiometryColumn[] columns =
        [
            L(1, "NaOH", "Na1 O1 H1"), L(2, "HCl", "H1 Cl1"), L(3, "CO", "C1 O1"),
            R(1, "NaCl", "Na1 Cl1"), R(2, "H2O", "H2 O1"), R(3, "CO2", "C1 O2"),
        ];

        var solution = StoichiometrySolver.Solve(columns);

        Assert.Equal(BalanceFailureKind.NoPositiveSolution, solution.FailureKind);
        Assert.Equal(
            "no positive solution: the only balance has 'CO' would take no part (coefficient 0); 'CO2' would take no part (coefficient 0)",
            solution.Message);
    }

    [Fact]
    public void Mixed_reactions_report_the_null_space_dimension()
    {
        var solution = StoichiometrySolver.Solve([L(1, "C", "C1"), L(2, "O2", "O2"), R(1, "CO", "C1 O1"), R(2, "CO2", "C1 O2")]);

        Assert.Equal(BalanceFailureKind.MultipleIndependentReactions, solution.FailureKind);
        Assert.Equal(2, solution.NullSpaceDimension);
        Assert.StartsWith("the equation mixes 2 independent reactions", solution.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Charge_that_cannot_balance_is_told_apart_from_atoms_that_cannot()
    {
        var charge = StoichiometrySolver.Solve([L(1, "Fe^2+", "Fe1", 2), R(1, "Fe^3+", "Fe1", 3)]);
        var atoms = StoichiometrySolver.Solve([L(1, "NO", "N1 O1"), R(1, "NO2", "N1 O2")]);

        Assert.Equal(BalanceFailureKind.ChargeCannotBalance, charge.FailureKind);
        Assert.Contains("'Fe^2+' (2+), 'Fe^3+' (3+)", charge.Message, StringComparison.Ordinal);
        Assert.Equal(BalanceFailureKind.NoSolution, atoms.FailureKind);
    }

    [Fact]
    public void Element_on_one_side_lists_every_such_element()
    {
        var solution = StoichiometrySolver.Solve([L(1, "H2", "H2"), R(1, "O2", "O2")]);

        Assert.Equal(BalanceFailureKind.ElementOnOneSide, solution.FailureKind);
        Assert.Equal(
            "element on one side only: H appears only on the left (in 'H2'); O appears only on the right (in 'O2')",
            solution.Message);
    }

    [Theory]
    [InlineData("H2O", "H2O", EquationSide.Products, "'H2O' is written on both sides (species 1 on the left and species 2 on the right)")]
    [InlineData("H2O", "H2O", EquationSide.Reactants, "'H2O' is written twice on the left (species 1 on the left and species 3 on the left)")]
    [InlineData("WATER", "H2O", EquationSide.Products, "'WATER' (species 1 on the left) and 'H2O' (species 2 on the right) have the same composition on both sides")]
    public void Repeated_compositions_are_refused(string firstLabel, string secondLabel, EquationSide secondSide, string expected)
    {
        List<StoichiometryColumn> columns = [L(1, firstLabel, "H2 O1"), L(2, "C", "C1"), R(1, "CO", "C1 O1"), R(3, "H2", "H2")];
        columns.Add(Column(secondLabel, secondSide, secondSide == EquationSide.Reactants ? 3 : 2, "H2 O1", 0));

        var solution = StoichiometrySolver.Solve(columns);

        Assert.Equal(BalanceFailureKind.RepeatedSpecies, solution.FailureKind);
        Assert.StartsWith(expected, solution.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Coefficients_are_the_smallest_integers_even_when_large()
    {
        // 10 K4Fe(CN)6 + 122 KMnO4 + 299 H2SO4 -> 162 KHSO4 + 5 Fe2(SO4)3 + 122 MnSO4 + 60 HNO3 + 60 CO2 + 188 H2O (from memory).
        StoichiometryColumn[] columns =
        [
            L(1, "K4[Fe(CN)6]", "K4 Fe1 C6 N6"), L(2, "KMnO4", "K1 Mn1 O4"), L(3, "H2SO4", "H2 S1 O4"),
            R(1, "KHSO4", "K1 H1 S1 O4"), R(2, "Fe2(SO4)3", "Fe2 S3 O12"), R(3, "MnSO4", "Mn1 S1 O4"),
            R(4, "HNO3", "H1 N1 O3"), R(5, "CO2", "C1 O2"), R(6, "H2O", "H2 O1"),
        ];

        var solution = StoichiometrySolver.Solve(columns);

        Assert.Equal([10, 122, 299, 162, 5, 122, 60, 60, 188], solution.Coefficients!.Select(c => (int)c));
    }

    // Random reactions with known coefficients: reactants from a list of small molecules, products made by
    // splitting the total atom multiset into random molecules. The known coefficient vector is in the null
    // space by construction; when the null space is one-dimensional the balancer must return it, reduced.
    [Fact]
    public void Random_reactions_with_known_coefficients_are_recovered()
    {
        var random = new Random(20240611);
        var outcome = RandomReactions.Run(random, 400, columns => StoichiometrySolver.Solve(columns));

        Assert.Equal(0, outcome.Mismatches);
        Assert.True(outcome.Recovered >= 150, $"only {outcome.Recovered} of 400 cases had a single reaction; the generator is too weak");
        Assert.Equal(400, outcome.Recovered + outcome.MixedReactions + outcome.Skipped);
    }
}

/// <summary>Builds random reactions whose coefficients are known, for the balancer property tests.</summary>
internal static class RandomReactions
{
    // Small molecules as element counts (common practice compositions).
    private static readonly (string Name, (string Element, int Count)[] Atoms)[] Molecules =
    [
        ("H2", [("H", 2)]), ("O2", [("O", 2)]), ("N2", [("N", 2)]), ("Cl2", [("Cl", 2)]), ("C", [("C", 1)]),
        ("H2O", [("H", 2), ("O", 1)]), ("CO2", [("C", 1), ("O", 2)]), ("CO", [("C", 1), ("O", 1)]),
        ("CH4", [("C", 1), ("H", 4)]), ("C2H6", [("C", 2), ("H", 6)]), ("C2H4", [("C", 2), ("H", 4)]),
        ("HCl", [("H", 1), ("Cl", 1)]), ("NaOH", [("Na", 1), ("O", 1), ("H", 1)]), ("NaCl", [("Na", 1), ("Cl", 1)]),
        ("H2SO4", [("H", 2), ("S", 1), ("O", 4)]), ("SO2", [("S", 1), ("O", 2)]), ("Fe2O3", [("Fe", 2), ("O", 3)]),
        ("Fe", [("Fe", 1)]), ("NO2", [("N", 1), ("O", 2)]), ("KClO3", [("K", 1), ("Cl", 1), ("O", 3)]),
        ("CaCO3", [("Ca", 1), ("C", 1), ("O", 3)]), ("C6H12O6", [("C", 6), ("H", 12), ("O", 6)]),
        ("H2O2", [("H", 2), ("O", 2)]), ("C6H5NO2", [("C", 6), ("H", 5), ("N", 1), ("O", 2)]),
    ];

    public sealed record Outcome(int Recovered, int MixedReactions, int Skipped, int Mismatches);

    public sealed record Case(
        IReadOnlyList<(string Name, IReadOnlyList<(string Element, int Count)> Atoms)> Reactants,
        IReadOnlyList<(string Name, IReadOnlyList<(string Element, int Count)> Atoms)> Products,
        IReadOnlyList<BigInteger> Known);

    public static Outcome Run(Random random, int cases, Func<IReadOnlyList<StoichiometryColumn>, StoichiometrySolution> solve) =>
        Run(random, cases, c => solve(ToColumns(c)) is var s && s.FailureKind == BalanceFailureKind.MultipleIndependentReactions
            ? null
            : s.Coefficients ?? []);

    /// <summary>Runs <paramref name="cases"/> cases; <paramref name="balance"/> returns null for "mixed reactions".</summary>
    public static Outcome Run(Random random, int cases, Func<Case, IReadOnlyList<BigInteger>?> balance)
    {
        int recovered = 0, mixed = 0, skipped = 0, mismatches = 0;
        for (var n = 0; n < cases; n++)
        {
            var generated = Generate(random);
            if (generated is null)
            {
                skipped++;
                continue;
            }

            var coefficients = balance(generated);
            if (coefficients is null)
            {
                mixed++;
                continue;
            }

            var gcd = generated.Known.Aggregate(BigInteger.Zero, BigInteger.GreatestCommonDivisor);
            var expected = generated.Known.Select(k => k / gcd).ToList();
            if (coefficients.SequenceEqual(expected))
            {
                recovered++;
            }
            else
            {
                mismatches++;
            }
        }

        return new Outcome(recovered, mixed, skipped, mismatches);
    }

    public static string Hill(IReadOnlyList<(string Element, int Count)> atoms) =>
        string.Concat(atoms.Select(a => a.Count == 1 ? a.Element : a.Element + a.Count.ToString(System.Globalization.CultureInfo.InvariantCulture)));

    private static IReadOnlyList<StoichiometryColumn> ToColumns(Case c)
    {
        var columns = new List<StoichiometryColumn>();
        for (var i = 0; i < c.Reactants.Count; i++)
        {
            columns.Add(new StoichiometryColumn(c.Reactants[i].Name, EquationSide.Reactants, i + 1, ToPairs(c.Reactants[i].Atoms), 0));
        }

        for (var i = 0; i < c.Products.Count; i++)
        {
            columns.Add(new StoichiometryColumn(c.Products[i].Name, EquationSide.Products, i + 1, ToPairs(c.Products[i].Atoms), 0));
        }

        return columns;
    }

    private static List<KeyValuePair<string, Rational>> ToPairs(IReadOnlyList<(string Element, int Count)> atoms) =>
        atoms.Select(a => new KeyValuePair<string, Rational>(a.Element, a.Count)).ToList();

    private static Case? Generate(Random random)
    {
        var reactantCount = random.Next(1, 4);
        var picked = Molecules.OrderBy(_ => random.Next()).Take(reactantCount).ToList();
        var known = new List<BigInteger>();
        var remaining = new Dictionary<string, int>(StringComparer.Ordinal);
        var elementOrder = new List<string>();
        foreach (var molecule in picked)
        {
            var nu = random.Next(1, 5);
            known.Add(nu);
            foreach (var (element, count) in molecule.Atoms)
            {
                if (!remaining.ContainsKey(element))
                {
                    elementOrder.Add(element);
                    remaining[element] = 0;
                }

                remaining[element] += nu * count;
            }
        }

        var products = new List<(string, IReadOnlyList<(string, int)>)>();
        var productCount = random.Next(1, 4);
        for (var p = 0; p < productCount - 1; p++)
        {
            var c = random.Next(1, 4);
            var atoms = new List<(string, int)>();
            foreach (var element in elementOrder)
            {
                var take = random.Next(0, (remaining[element] / c) + 1);
                if (take > 0)
                {
                    atoms.Add((element, take));
                }
            }

            if (atoms.Count == 0)
            {
                continue;
            }

            foreach (var (element, take) in atoms)
            {
                remaining[element] -= c * take;
            }

            products.Add((Hill(atoms), atoms));
            known.Add(c);
        }

        var rest = elementOrder.Where(e => remaining[e] > 0).Select(e => (e, remaining[e])).ToList();
        if (rest.Count > 0)
        {
            var g = rest.Aggregate(0, (acc, a) => (int)BigInteger.GreatestCommonDivisor(acc, a.Item2));
            var divisors = Enumerable.Range(1, g).Where(d => g % d == 0).ToList();
            var last = divisors[random.Next(divisors.Count)];
            var atoms = rest.Select(a => (a.e, a.Item2 / last)).ToList();
            products.Add((Hill(atoms), atoms));
            known.Add(last);
        }

        // Two columns of the same composition make the case ill-posed; the balancer refuses those on purpose.
        var reactantKeys = picked.Select(m => Key(m.Atoms)).ToList();
        var productKeys = products.Select(p => Key(p.Item2)).ToList();
        if (products.Count == 0 || reactantKeys.Concat(productKeys).Distinct().Count() != reactantKeys.Count + productKeys.Count)
        {
            return null;
        }

        return new Case(
            picked.Select(m => (m.Name, (IReadOnlyList<(string, int)>)m.Atoms)).ToList(),
            products,
            known);
    }

    private static string Key(IEnumerable<(string Element, int Count)> atoms) =>
        string.Join(",", atoms.OrderBy(a => a.Element, StringComparer.Ordinal).Select(a => $"{a.Element}{a.Count}"));
}
