using BatchReconcile.Chemistry.Equations;
using BatchReconcile.Chemistry.Numerics;

namespace BatchReconcile.Chemistry.Tests.Equations;

public class EquationTextTests
{
    private static IReadOnlyList<EquationTextTerm> Tokenize(string text, Func<string, bool>? known = null)
    {
        Assert.True(EquationText.TryTokenize(text, known, out var terms, out var error), error?.ToString());
        return terms;
    }

    private static EquationError Refuse(string text, Func<string, bool>? known = null)
    {
        Assert.False(EquationText.TryTokenize(text, known, out _, out var error));
        return error!;
    }

    private static string Describe(IReadOnlyList<EquationTextTerm> terms) =>
        string.Join(" | ", terms.Select(t => $"{(t.Side == EquationSide.Reactants ? "L" : "R")}{t.Index}@{t.SpeciesPosition}:{t.Coefficient?.ToString() ?? "-"}:{t.Species}"));

    [Theory]
    [InlineData("A + B -> C", "L1@1:-:A | L2@5:-:B | R1@10:-:C")]
    [InlineData("A + B → C", "L1@1:-:A | L2@5:-:B | R1@9:-:C")]
    [InlineData("A + B = C", "L1@1:-:A | L2@5:-:B | R1@9:-:C")]
    [InlineData("A + B <=> C", "L1@1:-:A | L2@5:-:B | R1@11:-:C")]
    [InlineData("A + B ⇌ C", "L1@1:-:A | L2@5:-:B | R1@9:-:C")]
    [InlineData("A->C", "L1@1:-:A | R1@4:-:C")]
    [InlineData("  2 H2 +   O2  ->  2 H2O  ", "L1@5:2:H2 | L2@12:-:O2 | R1@22:2:H2O")]
    [InlineData("2H2 + O2 -> 2H2O", "L1@2:2:H2 | L2@7:-:O2 | R1@14:2:H2O")]
    [InlineData("H2 + 0.5 O2 -> H2O", "L1@1:-:H2 | L2@10:1/2:O2 | R1@16:-:H2O")]
    [InlineData("H2 + 1/2 O2 -> H2O", "L1@1:-:H2 | L2@10:1/2:O2 | R1@16:-:H2O")]
    [InlineData("H2 + 1/2O2 -> H2O", "L1@1:-:H2 | L2@9:1/2:O2 | R1@15:-:H2O")]
    [InlineData("H2 + .5O2 -> H2O", "L1@1:-:H2 | L2@8:1/2:O2 | R1@14:-:H2O")]
    [InlineData("3 (CH3)2CO -> X", "L1@3:3:(CH3)2CO | R1@15:-:X")]
    [InlineData("10 K4[Fe(CN)6] -> X", "L1@4:10:K4[Fe(CN)6] | R1@19:-:X")]
    [InlineData("2[Fe(CN)6]^3- -> X", "L1@2:2:[Fe(CN)6]^3- | R1@18:-:X")]
    public void Splits_sides_terms_and_coefficients(string text, string expected)
    {
        Assert.Equal(expected, Describe(Tokenize(text)));
    }

    [Theory]
    [InlineData("NH4^+ + OH^- -> NH3 + H2O", "L1@1:-:NH4^+ | L2@9:-:OH^- | R1@17:-:NH3 | R2@23:-:H2O")]
    [InlineData("Fe^3+ + e -> Fe^2+", "L1@1:-:Fe^3+ | L2@9:-:e | R1@14:-:Fe^2+")]
    [InlineData("MnO4^- + 5 Fe^2+ + 8 H^+ -> X", "L1@1:-:MnO4^- | L2@12:5:Fe^2+ | L3@22:8:H^+ | R1@29:-:X")]
    [InlineData("Cu^2+ -> Cu+2", "L1@1:-:Cu^2+ | R1@10:-:Cu+2")]
    public void A_plus_touching_other_characters_belongs_to_the_formula(string text, string expected)
    {
        Assert.Equal(expected, Describe(Tokenize(text)));
    }

    [Fact]
    public void A_known_name_starting_with_a_digit_is_not_split()
    {
        var known = new HashSet<string>(StringComparer.Ordinal) { "4AP" };

        var terms = Tokenize("4AP + 2 4AP -> 3AP", known.Contains);

        Assert.Equal("L1@1:-:4AP | L2@9:2:4AP | R1@17:3:AP", Describe(terms));
    }

    [Theory]
    [InlineData("", 1, "empty equation")]
    [InlineData("   ", 1, "empty equation")]
    [InlineData("H2 + O2", 1, "no arrow")]
    [InlineData("A -> B -> C", 8, "two arrows: one at 3 and another at 8")]
    [InlineData("A = B = C", 7, "two arrows: one at 3 and another at 7")]
    [InlineData("A <=> B → C", 9, "two arrows")]
    [InlineData(" -> H2O", 2, "empty side: nothing on the left")]
    [InlineData("H2O ->  ", 9, "empty side: nothing on the right")]
    [InlineData("H2 + + O2 -> H2O", 6, "species 2 on the left is empty")]
    [InlineData("H2 + O2 -> H2O +", 17, "species 2 on the right is empty")]
    [InlineData("H2 + O2 -> + H2O", 12, "species 1 on the right is empty")]
    [InlineData("H2 + two O2 -> H2O", 6, "species 2 on the left: expected a coefficient (such as 2, 0.5 or 1/2) before 'O2', found 'two'")]
    [InlineData("H2 + 2 O2 O3 -> H2O", 10, "species 2 on the left: unexpected space inside 'O2 O3'")]
    [InlineData("H2 + 0 O2 -> H2O", 6, "species 2 on the left: coefficient 0 must be positive")]
    [InlineData("H2 + -1 O2 -> H2O", 6, "species 2 on the left: coefficient -1 must be positive")]
    [InlineData("H2 + -1O2 -> H2O", 6, "species 2 on the left: coefficient -1 must be positive")]
    [InlineData("H2 + 1/0 O2 -> H2O", 6, "found '1/0'")]
    [InlineData("H2 + 1/0O2 -> H2O", 6, "'1/0' is not a coefficient")]
    [InlineData("H2 + 2 -> H2O", 6, "species 2 on the left: coefficient '2' has no species after it")]
    [InlineData("H2 -> 2^+", 8, "expected a species starting with a letter, '(' or '[' after the coefficient '2', found '^'")]
    public void Refuses_malformed_text_with_position_and_reason(string text, int position, string reason)
    {
        var error = Refuse(text);

        Assert.Equal(position, error.Position);
        Assert.Contains(reason, error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Coefficient_text_is_exact()
    {
        var terms = Tokenize("0.125 A + 10/4 B -> 3 C");

        Assert.Equal(Rational.Create(1, 8), terms[0].Coefficient);
        Assert.Equal(Rational.Create(5, 2), terms[1].Coefficient);
        Assert.Equal((Rational)3, terms[2].Coefficient);
    }
}
