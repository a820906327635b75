using System.Globalization;
using BatchReconcile.Chemistry.Elements;

namespace BatchReconcile.Chemistry.Tests.Elements;

public class PeriodicTableTests
{
    // Independent copy, typed separately from the production table, digits as printed in the source.
    // Source: CIAAW standard atomic weights 2021, abridged values (Prohaska et al., "Standard atomic
    // weights of the elements 2021", Pure Appl. Chem. 94 (2022) 573, Table 1), read from the
    // copy in the public repository MilanSkocic/ciaaw, file data/src/saw_2021.txt (column
    // "asaw"). Every one of the 84 values below was compared with it and agrees; the source prints
    // hydrogen as 1.0080. Cross-checks: the 2021 changes listed in the abstract of Prohaska et al. 2022
    // (stored copy of the De Gruyter page: Ar and Pb become intervals, Hf 178.486 ± 0.006,
    // Yb 173.045 ± 0.010, Ir 192.217 ± 0.002) round to the values here. Interval elements carry the
    // conventional abridged value. Not applied on purpose: CIAAW's 2024 revisions of Zr (91.222),
    // Gd and Lu; of these only Zr changes at five significant figures.
    // Format: Z symbol weight
    internal const string Ciaaw2021Abridged = """
        1 H 1.0080
        2 He 4.0026
        3 Li 6.94
        4 Be 9.0122
        5 B 10.81
        6 C 12.011
        7 N 14.007
        8 O 15.999
        9 F 18.998
        10 Ne 20.180
        11 Na 22.990
        12 Mg 24.305
        13 Al 26.982
        14 Si 28.085
        15 P 30.974
        16 S 32.06
        17 Cl 35.45
        18 Ar 39.95
        19 K 39.098
        20 Ca 40.078
        21 Sc 44.956
        22 Ti 47.867
        23 V 50.942
        24 Cr 51.996
        25 Mn 54.938
        26 Fe 55.845
        27 Co 58.933
        28 Ni 58.693
        29 Cu 63.546
        30 Zn 65.38
        31 Ga 69.723
        32 Ge 72.630
        33 As 74.922
        34 Se 78.971
        35 Br 79.904
        36 Kr 83.798
        37 Rb 85.468
        38 Sr 87.62
        39 Y 88.906
        40 Zr 91.224
        41 Nb 92.906
        42 Mo 95.95
        44 Ru 101.07
        45 Rh 102.91
        46 Pd 106.42
        47 Ag 107.87
        48 Cd 112.41
        49 In 114.82
        50 Sn 118.71
        51 Sb 121.76
        52 Te 127.60
        53 I 126.90
        54 Xe 131.29
        55 Cs 132.91
        56 Ba 137.33
        57 La 138.91
        58 Ce 140.12
        59 Pr 140.91
        60 Nd 144.24
        62 Sm 150.36
        63 Eu 151.96
        64 Gd 157.25
        65 Tb 158.93
        66 Dy 162.50
        67 Ho 164.93
        68 Er 167.26
        69 Tm 168.93
        70 Yb 173.05
        71 Lu 174.97
        72 Hf 178.49
        73 Ta 180.95
        74 W 183.84
        75 Re 186.21
        76 Os 190.23
        77 Ir 192.22
        78 Pt 195.08
        79 Au 196.97
        80 Hg 200.59
        81 Tl 204.38
        82 Pb 207.2
        83 Bi 208.98
        90 Th 232.04
        91 Pa 231.04
        92 U 238.03
        """;

    /// <summary>Symbol and weight as printed, for checks that need the printed precision.</summary>
    internal static IEnumerable<(string Symbol, string Printed)> AbridgedRows()
    {
        foreach (var line in Ciaaw2021Abridged.Split('\n', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries))
        {
            var parts = line.Split(' ');
            yield return (parts[1], parts[2]);
        }
    }

    public static TheoryData<int, string, double> Reference()
    {
        var data = new TheoryData<int, string, double>();
        foreach (var line in Ciaaw2021Abridged.Split('\n', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries))
        {
            var parts = line.Split(' ');
            data.Add(int.Parse(parts[0], CultureInfo.InvariantCulture), parts[1], double.Parse(parts[2], CultureInfo.InvariantCulture));
        }

        return data;
    }

    [Theory]
    [MemberData(nameof(Reference))]
    public void Weight_matches_CIAAW_abridged_value(int atomicNumber, string symbol, double weight)
    {
        Assert.True(PeriodicTable.TryGet(symbol, out var element), $"{symbol} missing");
        Assert.Equal(symbol, element.Symbol);
        Assert.Equal(atomicNumber, element.AtomicNumber);
        Assert.Equal(weight, element.StandardAtomicWeight);
        Assert.False(element.IsIsotope);
    }

    [Fact]
    public void Table_holds_exactly_the_reference_elements_plus_D_and_T()
    {
        var expected = Reference().Select(row => (string)row[1]).Append("D").Append("T").Order(StringComparer.Ordinal);
        Assert.Equal(expected, PeriodicTable.All.Select(e => e.Symbol).Order(StringComparer.Ordinal));
        // 84 elements have a standard atomic weight (CIAAW 2021; Prohaska et al. 2022 Table 1 as transcribed above).
        Assert.Equal(84, PeriodicTable.All.Count(e => !e.IsIsotope));
    }

    [Theory]
    // Atomic masses of 2H and 3H from AME2020 (Huang et al. and Wang et al., Chinese Physics C 45 (2021)
    // 030002/030003), read from the CIAAW atomic-mass data as transcribed in the public repository
    // MilanSkocic/ciaaw, file data/naw_2020.txt: 2H 2.014101777844(15), 3H 3.01604928132(8).
    // (NIST "Atomic Weights and Isotopic Compositions" still lists the AME2016 value 2.01410177812(12) for 2H.)
    [InlineData("D", 2.014101777844)]
    [InlineData("T", 3.01604928132)]
    public void Hydrogen_isotopes_carry_their_atomic_mass(string symbol, double mass)
    {
        Assert.True(PeriodicTable.TryGet(symbol, out var element));
        Assert.Equal(mass, element.StandardAtomicWeight, 1e-12);
        Assert.Equal(1, element.AtomicNumber);
        Assert.True(element.IsIsotope);
    }

    [Theory]
    // Elements with no standard atomic weight (CIAAW 2021; "nan" rows of the copy cited above):
    // no stable isotope and no characteristic terrestrial composition.
    [InlineData("Tc")]
    [InlineData("Pm")]
    [InlineData("Po")]
    [InlineData("At")]
    [InlineData("Rn")]
    [InlineData("Fr")]
    [InlineData("Ra")]
    [InlineData("Ac")]
    [InlineData("Np")]
    [InlineData("Pu")]
    [InlineData("Og")]
    // Not symbols at all.
    [InlineData("Xx")]
    [InlineData("")]
    [InlineData("h")]
    [InlineData("HE")]
    [InlineData("Hee")]
    public void Symbols_without_a_weight_are_not_found(string symbol)
    {
        Assert.False(PeriodicTable.TryGet(symbol, out var element));
        Assert.Null(element);
    }

    [Fact]
    public void Atomic_numbers_increase_and_names_are_present()
    {
        var elements = PeriodicTable.All.Where(e => !e.IsIsotope).ToList();
        for (int i = 1; i < elements.Count; i++)
            Assert.True(elements[i].AtomicNumber > elements[i - 1].AtomicNumber, elements[i].Symbol);
        Assert.All(PeriodicTable.All, e => Assert.False(string.IsNullOrWhiteSpace(e.Name)));
    }
}
