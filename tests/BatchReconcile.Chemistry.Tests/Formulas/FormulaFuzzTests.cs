using System.Text;
using BatchReconcile.Chemistry.Formulas;

namespace BatchReconcile.Chemistry.Tests.Formulas;

public class FormulaFuzzTests
{
    private const string Alphabet = "HCONSPKFeClBrNaCaMgAlSiZnCuXqhoe0123456789()[]{}.·•*^+- \t\u2212é\u0000\uD835\uDEFC";

    [Theory]
    [InlineData(1)]
    [InlineData(2)]
    [InlineData(3)]
    public void Random_text_gives_a_formula_or_a_located_error(int seed)
    {
        var random = new Random(seed);
        int parsed = 0;
        for (int i = 0; i < 3000; i++)
        {
            var sb = new StringBuilder();
            int length = random.Next(0, 31);
            for (int k = 0; k < length; k++) sb.Append(Alphabet[random.Next(Alphabet.Length)]);
            if (Check(sb.ToString())) parsed++;
        }

        // Make sure the alphabet does not only ever produce errors.
        Assert.True(parsed > 20, $"only {parsed} random strings parsed");
    }

    [Theory]
    [InlineData(11)]
    [InlineData(12)]
    public void Mutated_formulas_give_a_formula_or_a_located_error(int seed)
    {
        var generator = new RandomFormula(seed, plain: false);
        var random = new Random(seed);
        for (int i = 0; i < 2000; i++)
        {
            var chars = new StringBuilder(generator.Next().Text);
            int position = random.Next(chars.Length);
            char c = Alphabet[random.Next(Alphabet.Length)];
            switch (random.Next(3))
            {
                case 0: chars.Insert(position, c); break;
                case 1: chars.Remove(position, 1); break;
                default: chars[position] = c; break;
            }

            Check(chars.ToString());
        }
    }

    [Theory]
    [InlineData(21, false)]
    [InlineData(22, false)]
    [InlineData(23, true)]
    public void Generated_formulas_have_the_generated_composition(int seed, bool plain)
    {
        var generator = new RandomFormula(seed, plain);
        for (int i = 0; i < 2000; i++)
        {
            var (text, counts, charge) = generator.Next();
            Assert.True(Formula.TryParse(text, out var formula, out var error), $"{text}: {error?.Message}");
            Assert.Equal(
                counts.OrderBy(kv => kv.Key, StringComparer.Ordinal),
                formula.Elements.OrderBy(kv => kv.Key, StringComparer.Ordinal));
            Assert.Equal(charge, formula.Charge);
            Assert.True(Formula.TryGetMolarMass(text, out double fast), text);
            Assert.Equal(formula.MolarMass, fast, formula.MolarMass * 1e-12);
        }
    }

    /// <summary>Asserts the only outcomes are a formula or a located error, and that both entry points agree.</summary>
    private static bool Check(string text)
    {
        bool ok;
        Formula? formula;
        FormulaError? error;
        try
        {
            ok = Formula.TryParse(text, out formula, out error);
        }
        catch (Exception ex)
        {
            Assert.Fail($"TryParse(\"{Escape(text)}\") threw {ex.GetType().Name}: {ex.Message}");
            return false;
        }

        bool fastOk = Formula.TryGetMolarMass(text, out double fast);
        Assert.True(ok == fastOk, $"\"{Escape(text)}\": TryParse {ok}, TryGetMolarMass {fastOk}");
        if (ok)
        {
            Assert.Equal(formula!.MolarMass, fast, Math.Max(1e-9, formula.MolarMass * 1e-12));
            Assert.DoesNotContain(formula.Elements.Values, v => v <= 0);
        }
        else
        {
            Assert.InRange(error!.Position, 1, text.Length + 1);
            // Every message but "empty formula" names its position.
            if (error.Message != "empty formula")
                Assert.True(error.Message.Contains($" {error.Position}", StringComparison.Ordinal), $"\"{Escape(text)}\": {error.Message} (position {error.Position})");
            var ex = Assert.Throws<FormulaFormatException>(() => Formula.Parse(text));
            Assert.Equal(error, ex.Error);
        }

        return ok;
    }

    private static string Escape(string text) =>
        string.Concat(text.Select(c => c < 32 || c > 126 ? $"\\u{(int)c:X4}" : c.ToString()));
}
