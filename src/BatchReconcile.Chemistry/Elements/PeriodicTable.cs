// Source of the weights: CIAAW/IUPAC standard atomic weights 2021, abridged to five significant
// figures (Prohaska et al., Pure Appl. Chem. 94 (2022) 573, Table 1; the abridged table prints H as
// 1.0080); elements whose standard atomic weight is an interval use the conventional abridged value
// (H 1.008, Li 6.94, B 10.81, C 12.011, N 14.007, O 15.999, Mg 24.305, Si 28.085, S 32.06, Cl 35.45,
// Ar 39.95, Br 79.904, Tl 204.38, Pb 207.2). Elements without a standard atomic weight are left out on
// purpose. The tests check every value against a copy of that table and against the npm
// package chemical-elements.
// D and T: atomic masses of 2H and 3H from the Atomic Mass Evaluation AME2020 (M. Wang et al., Chinese
// Physics C 45 (2021) 030003) as used by CIAAW: 2.014101777844 and 3.01604928132. (NIST's "Atomic
// Weights and Isotopic Compositions" lists the older AME2016 2H mass, 2.01410177812.)
namespace BatchReconcile.Chemistry.Elements;

/// <summary>
/// The elements a formula may use: every element with a CIAAW 2021 standard atomic weight,
/// plus deuterium (D) and tritium (T). The data is compiled in, so lookups do no I/O.
/// </summary>
public static class PeriodicTable
{
    private static readonly Element[] Table = Build(
    [
        ("H", "hydrogen", 1, 1.008),
        ("He", "helium", 2, 4.0026),
        ("Li", "lithium", 3, 6.94),
        ("Be", "beryllium", 4, 9.0122),
        ("B", "boron", 5, 10.81),
        ("C", "carbon", 6, 12.011),
        ("N", "nitrogen", 7, 14.007),
        ("O", "oxygen", 8, 15.999),
        ("F", "fluorine", 9, 18.998),
        ("Ne", "neon", 10, 20.180),
        ("Na", "sodium", 11, 22.990),
        ("Mg", "magnesium", 12, 24.305),
        ("Al", "aluminium", 13, 26.982),
        ("Si", "silicon", 14, 28.085),
        ("P", "phosphorus", 15, 30.974),
        ("S", "sulfur", 16, 32.06),
        ("Cl", "chlorine", 17, 35.45),
        ("Ar", "argon", 18, 39.95),
        ("K", "potassium", 19, 39.098),
        ("Ca", "calcium", 20, 40.078),
        ("Sc", "scandium", 21, 44.956),
        ("Ti", "titanium", 22, 47.867),
        ("V", "vanadium", 23, 50.942),
        ("Cr", "chromium", 24, 51.996),
        ("Mn", "manganese", 25, 54.938),
        ("Fe", "iron", 26, 55.845),
        ("Co", "cobalt", 27, 58.933),
        ("Ni", "nickel", 28, 58.693),
        ("Cu", "copper", 29, 63.546),
        ("Zn", "zinc", 30, 65.38),
        ("Ga", "gallium", 31, 69.723),
        ("Ge", "germanium", 32, 72.630),
        ("As", "arsenic", 33, 74.922),
        ("Se", "selenium", 34, 78.971),
        ("Br", "bromine", 35, 79.904),
        ("Kr", "krypton", 36, 83.798),
        ("Rb", "rubidium", 37, 85.468),
        ("Sr", "strontium", 38, 87.62),
        ("Y", "yttrium", 39, 88.906),
        ("Zr", "zirconium", 40, 91.224),
        ("Nb", "niobium", 41, 92.906),
        ("Mo", "molybdenum", 42, 95.95),
        ("Ru", "ruthenium", 44, 101.07),
        ("Rh", "rhodium", 45, 102.91),
        ("Pd", "palladium", 46, 106.42),
        ("Ag", "silver", 47, 107.87),
        ("Cd", "cadmium", 48, 112.41),
        ("In", "indium", 49, 114.82),
        ("Sn", "tin", 50, 118.71),
        ("Sb", "antimony", 51, 121.76),
        ("Te", "tellurium", 52, 127.60),
        ("I", "iodine", 53, 126.90),
        ("Xe", "xenon", 54, 131.29),
        ("Cs", "caesium", 55, 132.91),
        ("Ba", "barium", 56, 137.33),
        ("La", "lanthanum", 57, 138.91),
        ("Ce", "cerium", 58, 140.12),
        ("Pr", "praseodymium", 59, 140.91),
        ("Nd", "neodymium", 60, 144.24),
        ("Sm", "samarium", 62, 150.36),
        ("Eu", "europium", 63, 151.96),
        ("Gd", "gadolinium", 64, 157.25),
        ("Tb", "terbium", 65, 158.93),
        ("Dy", "dysprosium", 66, 162.50),
        ("Ho", "holmium", 67, 164.93),
        ("Er", "erbium", 68, 167.26),
        ("Tm", "thulium", 69, 168.93),
        ("Yb", "ytterbium", 70, 173.05),
        ("Lu", "lutetium", 71, 174.97),
        ("Hf", "hafnium", 72, 178.49),
        ("Ta", "tantalum", 73, 180.95),
        ("W", "tungsten", 74, 183.84),
        ("Re", "rhenium", 75, 186.21),
        ("Os", "osmium", 76, 190.23),
        ("Ir", "iridium", 77, 192.22),
        ("Pt", "platinum", 78, 195.08),
        ("Au", "gold", 79, 196.97),
        ("Hg", "mercury", 80, 200.59),
        ("Tl", "thallium", 81, 204.38),
        ("Pb", "lead", 82, 207.2),
        ("Bi", "bismuth", 83, 208.98),
        ("Th", "thorium", 90, 232.04),
        ("Pa", "protactinium", 91, 231.04),
        ("U", "uranium", 92, 238.03),
    ],
    [
        ("D", "deuterium", 1, 2.014101777844),
        ("T", "tritium", 1, 3.01604928132),
    ]);

    // Symbols of elements that exist but have no standard atomic weight (no characteristic
    // terrestrial isotopic composition). Kept so a formula naming one gets a precise refusal
    // instead of "unknown element".
    private static readonly string[] WithoutStandardWeight =
    [
        "Tc", "Pm", "Po", "At", "Rn", "Fr", "Ra", "Ac",
        "Np", "Pu", "Am", "Cm", "Bk", "Cf", "Es", "Fm", "Md", "No", "Lr",
        "Rf", "Db", "Sg", "Bh", "Hs", "Mt", "Ds", "Rg", "Cn", "Nh", "Fl", "Mc", "Lv", "Ts", "Og",
    ];

    // Symbols are one ASCII capital plus an optional ASCII small letter, so 26 * 27 slots cover
    // every possible symbol and a lookup is two subtractions and an array read, with no string.
    // Slot value: element index + 1; NoWeight for elements without a standard atomic weight; 0 unknown.
    internal const short NoWeight = -1;
    private static readonly short[] Slots = BuildSlots();

    /// <summary>Weights by <see cref="Element.Index"/>, for the allocation-free mass path.</summary>
    internal static readonly double[] Weights = Array.ConvertAll(Table, e => e.StandardAtomicWeight);

    /// <summary>Elements with a standard atomic weight in order of atomic number, then D and T.</summary>
    public static IReadOnlyList<Element> All { get; } = Array.AsReadOnly(Table);

    internal static int Count => Table.Length;

    internal static Element ByIndex(int index) => Table[index];

    public static bool TryGet(ReadOnlySpan<char> symbol, [System.Diagnostics.CodeAnalysis.NotNullWhen(true)] out Element? element)
    {
        int slot = symbol.Length switch
        {
            1 => Lookup(symbol[0], '\0'),
            2 => Lookup(symbol[0], symbol[1]),
            _ => 0,
        };
        element = slot > 0 ? Table[slot - 1] : null;
        return element is not null;
    }

    /// <summary>
    /// Slot for a symbol given as its capital and its small letter ('\0' for a one-letter symbol):
    /// element index + 1, <see cref="NoWeight"/>, or 0 when no element has that symbol.
    /// </summary>
    internal static int Lookup(char upper, char lower)
    {
        if (!char.IsAsciiLetterUpper(upper)) return 0;
        int column;
        if (lower == '\0') column = 0;
        else if (char.IsAsciiLetterLower(lower)) column = lower - 'a' + 1;
        else return 0;
        return Slots[(upper - 'A') * 27 + column];
    }

    private static Element[] Build((string Symbol, string Name, int Z, double Weight)[] elements, (string Symbol, string Name, int Z, double Mass)[] isotopes)
    {
        var all = new Element[elements.Length + isotopes.Length];
        for (int i = 0; i < elements.Length; i++)
            all[i] = new Element(i, elements[i].Symbol, elements[i].Name, elements[i].Z, elements[i].Weight, isIsotope: false);
        for (int i = 0; i < isotopes.Length; i++)
        {
            int index = elements.Length + i;
            all[index] = new Element(index, isotopes[i].Symbol, isotopes[i].Name, isotopes[i].Z, isotopes[i].Mass, isIsotope: true);
        }
        return all;
    }

    private static short[] BuildSlots()
    {
        var slots = new short[26 * 27];
        foreach (var e in Table) Set(slots, e.Symbol, checked((short)(e.Index + 1)));
        foreach (var s in WithoutStandardWeight) Set(slots, s, NoWeight);
        return slots;
    }

    private static void Set(short[] slots, string symbol, short value)
    {
        int slot = (symbol[0] - 'A') * 27 + (symbol.Length == 2 ? symbol[1] - 'a' + 1 : 0);
        // A duplicate symbol in the data above is a bug in this file, not bad input.
        if (slots[slot] != 0) throw new InvalidOperationException($"Element symbol '{symbol}' is listed twice.");
        slots[slot] = value;
    }
}
