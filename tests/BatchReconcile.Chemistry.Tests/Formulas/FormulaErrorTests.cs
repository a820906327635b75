using BatchReconcile.Chemistry.Formulas;

namespace BatchReconcile.Chemistry.Tests.Formulas;

public class FormulaErrorTests
{
    public static TheoryData<string, int, string> Errors => new()
    {
        { "", 1, "empty formula" },
        { "   ", 1, "empty formula" },
        { "H2OXq", 4, "unknown element 'Xq' at 4" },
        { "CaSO4Q", 6, "unknown element 'Q' at 6" },
        { "Tc2O7", 1, "element 'Tc' at 1 has no standard atomic weight" },
        { "PuO2", 1, "element 'Pu' at 1 has no standard atomic weight" },
        { "Ca(OH2", 3, "'(' at 3 is never closed" },
        { "K4[Fe(CN)6", 3, "'[' at 3 is never closed" },
        { "CaOH)2", 5, "')' at 5 has no matching '('" },
        { "H2O]", 4, "']' at 4 has no matching '['" },
        { "[Co(NH3)6)Cl3", 1, "mismatched bracket: '[' at 1 closed by ')' at 10" },
        { "H2()O", 3, "empty brackets '()' at 3" },
        { "H2O#", 4, "expected an element symbol at 4, found '#'" },
        { "h2o", 1, "expected an element symbol at 1, found 'h' (element symbols start with a capital letter)" },
        { "H2 O", 3, "expected an element symbol at 3, found U+0020" },
        { "H\u0000", 2, "expected an element symbol at 2, found U+0000" },
        { "2", 2, "expected an element symbol at 2, found the end of the formula" },
        { "·H2O", 1, "expected an element symbol at 1, found '·'" },
        { "CuSO4··5H2O", 7, "expected an element symbol at 7, found '·'" },
        { "(H2O", 1, "'(' at 1 is never closed" },
        { "CuSO4·", 6, "expected a formula after '·' at 6" },
        { "Na2CO3.", 7, "expected a formula after '.' at 7" },
        { "H0", 2, "count at 2 is zero" },
        { "(OH)0", 5, "count at 5 is zero" },
        { "0H2O", 1, "multiplier at 1 is zero" },
        { "H12345678", 2, "count at 2 has more than 7 digits" },
        { "H2000000", 2, "count at 2 is larger than 1000000" },
        { "H1000000.5", 2, "count at 2 is larger than 1000000" },
        { "H0.1234567", 2, "count at 2 has more than 6 decimal places" },
        { "((((H)1000)1000)1000)2", 22, "count at 22 makes an element count larger than 1000000000" },
        { "1000000(H1000)2", 1, "multiplier at 1 makes an element count larger than 1000000000" },
        { "(H0.00001)0.00001", 11, "count at 11 makes an element count smaller than 0.000000001" },
        { new string('(', 17) + "H" + new string(')', 17), 17, "brackets nested more than 16 deep at 17" },
        { new string('H', 1025), 1, "formula is longer than 1024 characters" },
        { "SO4^", 4, "expected a charge after '^' at 4, such as '^2-', '^-2' or '^+', found the end of the formula" },
        { "SO4^x", 4, "expected a charge after '^' at 4, such as '^2-', '^-2' or '^+', found 'x'" },
        { "SO4^2", 6, "expected '+' or '-' at 6 after the charge number, found the end of the formula" },
        { "SO4^0-", 4, "charge after '^' at 4 is zero" },
        { "SO4^1234-", 5, "charge at 5 has more than 3 digits" },
        { "SO4^2-H", 7, "unexpected 'H' at 7: the charge must come last" },
        { "SO4^2-^", 7, "unexpected '^' at 7: the charge must come last" },
        // Positions count in the text as given, leading white space included.
        { "  H2OXq", 6, "unknown element 'Xq' at 6" },
    };

    [Theory]
    [MemberData(nameof(Errors))]
    public void TryParse_reports_located_error(string text, int position, string message)
    {
        Assert.False(Formula.TryParse(text, out var formula, out var error));
        Assert.Null(formula);
        Assert.Equal(new FormulaError(position, message), error);
        Assert.False(Formula.TryGetMolarMass(text, out _));
    }

    [Theory]
    [MemberData(nameof(Errors))]
    public void Parse_throws_with_the_same_error(string text, int position, string message)
    {
        var ex = Assert.Throws<FormulaFormatException>(() => Formula.Parse(text));
        Assert.Equal(position, ex.Error.Position);
        Assert.Equal(message, ex.Error.Message);
        Assert.Equal(message, ex.Message);
    }

    [Fact]
    public void Null_text_is_a_bug_not_bad_input()
    {
        Assert.Throws<ArgumentNullException>(() => Formula.Parse(null!));
    }
}
