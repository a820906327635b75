using System.Globalization;
using System.Text;
using BatchReconcile.Chemistry.Elements;

namespace BatchReconcile.Chemistry.Tests.Formulas;

/// <summary>
/// Builds random formulas from a seeded <see cref="Random"/> together with the composition they must
/// have, computed here independently of the parser (by walking what was generated).
/// </summary>
internal sealed class RandomFormula
{
    private readonly Random _random;
    private readonly string[] _symbols;
    private readonly bool _plain;

    /// <param name="plain">Only '(' groups, no adduct separators, no charge, no leading multiplier: notation other readers share.</param>
    public RandomFormula(int seed, bool plain, bool withIsotopes = true)
    {
        _random = new Random(seed);
        _plain = plain;
        _symbols = PeriodicTable.All.Where(e => withIsotopes || !e.IsIsotope).Select(e => e.Symbol).ToArray();
    }

    public (string Text, Dictionary<string, decimal> Counts, int Charge) Next()
    {
        var text = new StringBuilder();
        var counts = new Dictionary<string, decimal>(StringComparer.Ordinal);
        int parts = _plain ? 1 : _random.Next(1, 4);
        for (int p = 0; p < parts; p++)
        {
            if (p > 0) text.Append("·•*"[_random.Next(3)]);
            decimal multiplier = 1;
            if (!_plain && _random.Next(3) == 0)
            {
                (string written, multiplier) = _random.Next(4) == 0 ? Decimal() : Integer(2, 12);
                text.Append(written);
            }

            int units = _random.Next(1, 5);
            for (int u = 0; u < units; u++) Unit(text, counts, multiplier, depth: 0);
        }

        int charge = 0;
        if (!_plain && _random.Next(4) == 0)
        {
            charge = _random.Next(1, 4) * (_random.Next(2) == 0 ? 1 : -1);
            text.Append('^');
            string sign = charge > 0 ? "+" : "-";
            string magnitude = Math.Abs(charge).ToString(CultureInfo.InvariantCulture);
            text.Append(Math.Abs(charge) == 1 && _random.Next(2) == 0 ? sign : _random.Next(2) == 0 ? magnitude + sign : sign + magnitude);
        }

        return (text.ToString(), counts, charge);
    }

    private void Unit(StringBuilder text, Dictionary<string, decimal> counts, decimal factor, int depth)
    {
        if (depth < 3 && _random.Next(4) == 0)
        {
            int kind = _plain ? 0 : _random.Next(3);
            text.Append("([{"[kind]);
            var inner = new Dictionary<string, decimal>(StringComparer.Ordinal);
            int units = _random.Next(1, 4);
            for (int u = 0; u < units; u++) Unit(text, inner, 1, depth + 1);
            text.Append(")]}"[kind]);
            (string written, decimal count) = _random.Next(3) == 0 ? ("", 1m) : Integer(2, 6);
            text.Append(written);
            foreach (var (symbol, n) in inner) Add(counts, symbol, n * count * factor);
            return;
        }

        string element = _symbols[_random.Next(_symbols.Length)];
        text.Append(element);
        int choice = _random.Next(6);
        (string w, decimal c) = choice switch
        {
            0 or 1 => ("", 1m),
            2 => Decimal(),
            _ => Integer(1, 30),
        };
        text.Append(w);
        Add(counts, element, c * factor);
    }

    // Decimals with a zero whole part are decimals wherever they stand (rule 1 and 2 of the '.' rule).
    private (string, decimal) Decimal()
    {
        int digits = _random.Next(1, 4);
        int fraction = _random.Next(1, (int)Math.Pow(10, digits));
        string written = "0." + fraction.ToString(CultureInfo.InvariantCulture).PadLeft(digits, '0');
        return (written, decimal.Parse(written, CultureInfo.InvariantCulture));
    }

    private (string, decimal) Integer(int min, int max)
    {
        int n = _random.Next(min, max + 1);
        return (n.ToString(CultureInfo.InvariantCulture), n);
    }

    private static void Add(Dictionary<string, decimal> counts, string symbol, decimal n) =>
        counts[symbol] = counts.GetValueOrDefault(symbol) + n;
}
