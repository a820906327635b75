using System.Diagnostics.CodeAnalysis;
using System.Globalization;
using System.Text;
using BatchReconcile.Chemistry.Elements;

namespace BatchReconcile.Chemistry.Formulas;

/// <summary>
/// A chemical formula read from text, with its exact composition, charge, molar mass, Hill formula
/// and elemental analysis.
/// <para>
/// Notation: element symbols with integer or decimal counts (<c>C6H12O6</c>, <c>Fe0.95O</c>); groups in
/// <c>()</c>, <c>[]</c> or <c>{}</c> with a count after them (<c>K4[Fe(CN)6]</c>); adducts and hydrates
/// joined by '·' (preferred, unambiguous), '•', '*' or '.', each part with an optional leading
/// multiplier (<c>CuSO4·5H2O</c>, <c>CaSO4·0.5H2O</c>); a leading multiplier on the first part too
/// (<c>2H2O</c> is H4O2); a charge at the very end after '^', sign after or before the number
/// (<c>SO4^2-</c>, <c>SO4^-2</c>, <c>NH4^+</c>). How '.' is told from a decimal point is described on
/// the reader (rule: CuSO4.5H2O is a pentahydrate, Fe0.95O and YBa2Cu3O6.95 have decimal counts).
/// D and T are deuterium and tritium.
/// </para>
/// <para>
/// Two formulas are equal when they have the same composition and charge (the same <see cref="Hill"/>
/// string), however they were written: isomers compare equal.
/// </para>
/// </summary>
public sealed class Formula : IEquatable<Formula>
{
    private Formula(string text, IReadOnlyDictionary<string, decimal> elements, int charge, double molarMass, string hill, IReadOnlyDictionary<string, double> massFractionsPct)
    {
        Text = text;
        Elements = elements;
        Charge = charge;
        MolarMass = molarMass;
        Hill = hill;
        MassFractionsPct = massFractionsPct;
    }

    /// <summary>The formula as written, without surrounding white space.</summary>
    public string Text { get; }

    /// <summary>Element symbol to total count, in Hill order; no zero entries; D and T are their own keys.</summary>
    public IReadOnlyDictionary<string, decimal> Elements { get; }

    public int Charge { get; }

    /// <summary>Molar mass in g/mol from the abridged standard atomic weights; electron mass ignored (common practice).</summary>
    public double MolarMass { get; }

    /// <summary>Hill formula: C, then H, then the rest alphabetically (all alphabetical without C); count 1 omitted; charge as "^2-".</summary>
    public string Hill { get; }

    /// <summary>Elemental analysis: percent by mass of each element, in Hill order.</summary>
    public IReadOnlyDictionary<string, double> MassFractionsPct { get; }

    /// <exception cref="FormulaFormatException">The text is not a formula; the exception carries the located error.</exception>
    public static Formula Parse(string text)
    {
        if (TryParse(text, out var formula, out var error)) return formula;
        throw new FormulaFormatException(error);
    }

    public static bool TryParse(string text, [NotNullWhen(true)] out Formula? formula, [NotNullWhen(false)] out FormulaError? error)
    {
        ArgumentNullException.ThrowIfNull(text);
        var sink = new CompositionSink(PeriodicTable.Count);
        if (!FormulaReader.Read(text.AsSpan(), ref sink, out int charge, out var failure))
        {
            formula = null;
            error = FormulaReader.Describe(text, failure);
            return false;
        }

        formula = Create(text.Trim(), sink.Totals, charge);
        error = null;
        return true;
    }

    /// <summary>Molar mass only, without allocating: for hot paths. Returns false (and 0) for text that <see cref="Parse"/> would refuse.</summary>
    public static bool TryGetMolarMass(ReadOnlySpan<char> text, out double molarMass)
    {
        var sink = new MassSink(stackalloc double[FormulaReader.MaxDepth + 1]);
        if (!FormulaReader.Read(text, ref sink, out _, out _))
        {
            molarMass = 0;
            return false;
        }

        molarMass = sink.Total;
        return true;
    }

    private static Formula Create(string text, decimal[] totals, int charge)
    {
        var present = new List<Element>();
        for (int i = 0; i < totals.Length; i++)
        {
            if (totals[i] != 0) present.Add(PeriodicTable.ByIndex(i));
        }

        present.Sort(HillComparer(present.Exists(e => e.Symbol == "C")));

        var elements = new Dictionary<string, decimal>(present.Count, StringComparer.Ordinal);
        var hill = new StringBuilder();
        double mass = 0;
        foreach (var element in present)
        {
            decimal count = Normalize(totals[element.Index]);
            elements.Add(element.Symbol, count);
            hill.Append(element.Symbol);
            if (count != 1) hill.Append(count.ToString(CultureInfo.InvariantCulture));
            mass += element.StandardAtomicWeight * (double)count;
        }

        if (charge != 0)
        {
            hill.Append('^');
            if (Math.Abs(charge) != 1) hill.Append(Math.Abs(charge).ToString(CultureInfo.InvariantCulture));
            hill.Append(charge > 0 ? '+' : '-');
        }

        var fractions = new Dictionary<string, double>(present.Count, StringComparer.Ordinal);
        foreach (var element in present)
            fractions.Add(element.Symbol, element.StandardAtomicWeight * (double)elements[element.Symbol] / mass * 100.0);

        return new Formula(text, elements.AsReadOnly(), charge, mass, hill.ToString(), fractions.AsReadOnly());
    }

    private static Comparison<Element> HillComparer(bool hasCarbon) => (a, b) =>
    {
        if (hasCarbon)
        {
            int rank = HillRank(a).CompareTo(HillRank(b));
            if (rank != 0) return rank;
        }

        return string.CompareOrdinal(a.Symbol, b.Symbol);
    };

    private static int HillRank(Element e) => e.Symbol switch { "C" => 0, "H" => 1, _ => 2 };

    // Products like 0.95m * 2m keep trailing zeros ("1.90"); counts are shown and compared without them.
    private static decimal Normalize(decimal value) => value.Scale == 0 ? value :
        decimal.Parse(value.ToString("0.############################", CultureInfo.InvariantCulture), NumberStyles.Number, CultureInfo.InvariantCulture);

    public bool Equals(Formula? other) => other is not null && string.Equals(Hill, other.Hill, StringComparison.Ordinal);

    public override bool Equals(object? obj) => Equals(obj as Formula);

    public override int GetHashCode() => StringComparer.Ordinal.GetHashCode(Hill);

    public override string ToString() => Text;
}
