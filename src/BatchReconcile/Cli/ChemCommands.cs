using System.CommandLine;
using System.Globalization;
using BatchReconcile.Chemistry.Equations;
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
        chem.Subcommands.Add(Balance(stdout));
        chem.Subcommands.Add(Economy(stdout));
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

    private static Command Balance(TextWriter stdout)
    {
        var equation = EquationArgument();
        var json = JsonOption();
        var command = new Command("balance", "Balance an equation with the smallest whole-number coefficients") { equation, json };
        command.SetAction(parse =>
        {
            var balanced = BalanceOrFail(parse.GetRequiredValue(equation));
            if (parse.GetValue(json))
            {
                JsonOutput.Write(stdout, new BalanceJson(balanced.Equation.ToString(), balanced.Coefficients.Select(c => (long)c).ToArray()));
            }
            else
            {
                stdout.WriteLine(balanced.Equation.ToString());
            }

            return ExitCodes.Success;
        });
        return command;
    }

    private static Command Economy(TextWriter stdout)
    {
        var equation = EquationArgument();
        var product = new Option<string>("--product") { Description = "The desired product, as written in the equation", Required = true };
        var json = JsonOption();
        var command = new Command("economy", "Atom economy of a product of an equation (balanced first when written without coefficients)") { equation, product, json };
        command.SetAction(parse =>
        {
            var text = parse.GetRequiredValue(equation);
            var parsed = ParseOrFail(text);
            var used = UsedForEconomy(text, parsed);
            var result = AtomEconomy.Compute(used, parse.GetRequiredValue(product));
            if (!result.IsSuccess)
            {
                throw new UsageException($"equation '{text}': {result.Error}");
            }

            var economy = result.Value;
            if (parse.GetValue(json))
            {
                JsonOutput.Write(stdout, new EconomyJson(
                    Rounding.Hundredths(economy.AtomEconomyPct),
                    Rounding.Hundredths(economy.ProductMolarMass),
                    Rounding.Hundredths(economy.ReactantMolarMassSum),
                    used.ToString()));
            }
            else
            {
                stdout.WriteLine(used.ToString());
                stdout.WriteLine(string.Create(Inv, $"atom economy of {economy.ProductSpecies}: {Rounding.Hundredths(economy.AtomEconomyPct):F2} %"));
                stdout.WriteLine(string.Create(Inv, $"  product {Rounding.Hundredths(economy.ProductMolarMass):F2} g/mol x {economy.ProductCoefficient}, reactants sum {Rounding.Hundredths(economy.ReactantMolarMassSum):F2} g/mol"));
            }

            return ExitCodes.Success;
        });
        return command;
    }

    private static Argument<string> EquationArgument() =>
        new("EQUATION") { Description = "e.g. \"KMnO4 + HCl -> KCl + MnCl2 + Cl2 + H2O\" (arrows ->, →, =, <=>, ⇌)" };

    private static ChemicalEquation ParseOrFail(string text)
    {
        if (!ChemicalEquation.TryParse(text, out var equation, out var error))
        {
            throw new UsageException($"equation '{text}': {error}");
        }

        return equation;
    }

    private static (ChemicalEquation Equation, IReadOnlyList<System.Numerics.BigInteger> Coefficients) BalanceOrFail(string text)
    {
        var result = EquationBalancer.Balance(text);
        if (!result.IsSuccess)
        {
            throw new UsageException($"equation '{text}' cannot be balanced: {Lead(result.FailureKind.Value)}{result.Message}");
        }

        return (result.Equation, result.Coefficients);
    }

    /// <summary>
    /// The equation atom economy is computed on: as written when it has coefficients (it must balance),
    /// as written when it balances with every coefficient 1, else balanced by the program.
    /// </summary>
    /// <remarks>
    /// Overall equations of multi-step routes (isobutylbenzene + acetic anhydride + H2 + CO) often have
    /// several independent balancings; the one written is the route's, so it is kept when it balances.
    /// </remarks>
    private static ChemicalEquation UsedForEconomy(string text, ChemicalEquation parsed)
    {
        if (parsed.Terms.Any(t => t.Coefficient is not null))
        {
            return CheckedAsWritten(text, parsed);
        }

        return BalanceCheck.Check(parsed).IsBalanced ? parsed : BalanceOrFail(text).Equation;
    }

    /// <summary>An equation written with coefficients is used as written, and must balance.</summary>
    private static ChemicalEquation CheckedAsWritten(string text, ChemicalEquation equation)
    {
        var report = BalanceCheck.Check(equation);
        if (!report.IsBalanced)
        {
            throw new UsageException($"equation '{text}' does not balance as written: {string.Join("; ", report.Imbalances)}");
        }

        return equation;
    }

    /// <summary>Says first which of the two refusals of the interface it is: no solution, or several reactions.</summary>
    private static string Lead(BalanceFailureKind kind) => kind switch
    {
        BalanceFailureKind.NoSolution or BalanceFailureKind.ElementOnOneSide or BalanceFailureKind.ChargeCannotBalance
            or BalanceFailureKind.NoPositiveSolution => "no solution: ",
        BalanceFailureKind.MultipleIndependentReactions => "more than one independent reaction: ",
        _ => string.Empty,
    };

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

    private sealed record BalanceJson(string Equation, long[] Coefficients);

    private sealed record EconomyJson(double AtomEconomyPct, double ProductMolarMass, double ReactantMolarMassSum, string Equation);

    private sealed record MassJson(string Formula, string Hill, double MolarMass, Dictionary<string, decimal> Elements, int Charge);
}
