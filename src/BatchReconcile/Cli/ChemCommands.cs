using System.CommandLine;
using System.Globalization;
using BatchReconcile.Chemistry.Formulas;

namespace BatchReconcile.Cli;

/// <summary><c>chem mass|balance|economy</c>: the chemistry library from the command line.</summary>
public static class ChemCommands
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    public static Command Create(TextWriter stdout)
    {
        var chem = new Command("chem", "Formulas, molar masses, equation balancing and atom economy");
        chem.Subcommands.Add(Mass(stdout));
        return chem;
    }

    private static Option<bool> JsonOption() => new("--json") { Description = "Print one JSON document on stdout" };

    private static Command Mass(TextWriter stdout)
    {
        var formula = new Argument<string>("FORMULA") { Description = "e.g. CuSO4·5H2O, K4[Fe(CN)6], SO4^2-" };
        var json = JsonOption();
        var command = new Command("mass", "Molar mass, Hill formula and elemental composition of a formula") { formula, json };
        command.SetAction(parse =>
        {
            var text = parse.GetRequiredValue(formula);
            if (!Formula.TryParse(text, out var parsed, out var error))
            {
                throw new UsageException($"formula '{text}': {error.Message}");
            }

            if (parse.GetValue(json))
            {
                JsonOutput.Write(stdout, new MassJson(
                    text,
                    parsed.Hill,
                    Rounding.Hundredths(parsed.MolarMass),
                    HillOrdered(parsed).ToDictionary(e => e.Key, e => e.Value),
                    parsed.Charge));
            }
            else
            {
                WriteMassText(stdout, text, parsed);
            }

            return ExitCodes.Success;
        });
        return command;
    }

    private static IEnumerable<KeyValuePair<string, decimal>> HillOrdered(Formula formula) =>
        formula.MassFractionsPct.Keys.Select(symbol => new KeyValuePair<string, decimal>(symbol, formula.Elements[symbol]));

    private static void WriteMassText(TextWriter stdout, string text, Formula formula)
    {
        stdout.WriteLine($"formula      {text}");
        stdout.WriteLine($"Hill         {formula.Hill}");
        stdout.WriteLine(string.Create(Inv, $"molar mass   {formula.MolarMass:F2} g/mol"));
        if (formula.Charge != 0)
        {
            stdout.WriteLine(string.Create(Inv, $"charge       {formula.Charge:+0;-0}"));
        }

        stdout.WriteLine("element   count      mass %");
        foreach (var (symbol, pct) in formula.MassFractionsPct)
        {
            stdout.WriteLine(string.Create(Inv, $"{symbol,-7} {formula.Elements[symbol],7:0.####} {pct,11:F2}"));
        }
    }

    private sealed record MassJson(string Formula, string Hill, double MolarMass, Dictionary<string, decimal> Elements, int Charge);
}
