using BatchReconcile.Analysis.Trends;

namespace BatchReconcile.Analysis.Tests.Trends;

/// <summary>
/// Hand-built sequences (centre line 0, sigma 1) that complete exactly one rule, and the same sequences one
/// point short or one step below the threshold. Counts from Nelson, L. S. (1984), "The Shewhart Control
/// Chart—Tests for Special Causes", Journal of Quality Technology 16(4): 237-239; the zone tests (rules 1, 5
/// and 6) are also Western Electric Company (1956), Statistical Quality Control Handbook.
/// </summary>
public class RunRulesTests
{
    // Sequences chosen so that no other rule fires: side changes stop rule 2, ties or sign patterns
    // (+, -, -, +) stop rules 3 and 4, and magnitudes keep clear of zones not under test.
    public static TheoryData<string, double[], int> Triggering() => new()
    {
        // rule-1: one point beyond 3 sigma.
        { "rule-1", [0.5, -0.5, 3.2], 2 },
        { "rule-1", [0.5, -0.5, -3.2], 2 },
        // rule-2: 9 in a row on one side (Nelson's count; Western Electric used 8).
        { "rule-2", [0.2, 0.4, 0.2, 0.4, 0.2, 0.4, 0.2, 0.4, 0.2], 8 },
        // rule-3: 6 in a row steadily increasing (5 rises) or decreasing.
        { "rule-3", [-0.5, -0.3, -0.1, 0.1, 0.3, 0.5], 5 },
        { "rule-3", [0.5, 0.3, 0.1, -0.1, -0.3, -0.5], 5 },
        // rule-4: 14 in a row alternating up and down (13 alternating steps).
        { "rule-4", Alternate(14, 0.3), 13 },
        // rule-5: 2 of 3 beyond 2 sigma on one side, the completing point among them.
        { "rule-5", [0, 2.5, 0.5, 2.5], 3 },
        { "rule-5", [0, -2.5, -2.6, 0.1], 2 },
        // rule-6: 4 of 5 beyond 1 sigma on one side.
        { "rule-6", [1.5, 1.5, 0.5, 1.5, 1.5], 4 },
        // rule-7: 15 in a row within 1 sigma.
        { "rule-7", Pattern(15, 0.5, 0.6), 14 },
        // rule-8: 8 in a row beyond 1 sigma, on both sides.
        { "rule-8", Pattern(8, 1.5, 1.6), 7 },
    };

    [Theory]
    [MemberData(nameof(Triggering))]
    public void Each_rule_is_marked_on_the_point_that_completes_it_and_nowhere_else(string code, double[] values, int completing)
    {
        var signals = RunRules.Evaluate(values, 0, 1);

        for (var i = 0; i < values.Length; i++)
        {
            if (i == completing) Assert.Equal([code], signals[i]);
            else Assert.Empty(signals[i]);
        }
    }

    public static TheoryData<string, double[]> OneBelow() => new()
    {
        { "rule-1", [0.5, -0.5, 3.0] },                                 // exactly 3 sigma is not beyond
        { "rule-1", [0.5, -0.5, 2.99] },
        { "rule-2", [0.2, 0.4, 0.2, 0.4, 0.2, 0.4, 0.2, 0.4] },         // 8 in a row
        { "rule-2", [0.2, 0.4, 0.2, 0.4, 0, 0.4, 0.2, 0.4, 0.2] },      // a point on the centre line breaks the run
        { "rule-3", [-0.3, -0.1, 0.1, 0.3, 0.5] },                      // 5 rising points
        { "rule-3", [-0.5, -0.3, -0.1, -0.1, 0.3, 0.5] },               // a tie breaks the rise
        { "rule-4", Alternate(13, 0.3) },
        { "rule-5", [0, 2.5, 0.5, 1.9] },                               // second point short of 2 sigma
        { "rule-5", [0, 2.5, 0.5, -2.5] },                              // opposite sides
        { "rule-5", [2.5, 0.5, 0.5, 2.5] },                             // 2 of 4, not 2 of 3
        { "rule-6", [1.5, 1.5, 0.5, 0.5, 1.5] },                        // 3 of 5
        { "rule-7", Pattern(14, 0.5, 0.6) },
        { "rule-8", Pattern(7, 1.5, 1.6) },
    };

    [Theory]
    [MemberData(nameof(OneBelow))]
    public void One_short_of_the_threshold_does_not_signal(string code, double[] values)
    {
        var signals = RunRules.Evaluate(values, 0, 1);

        Assert.DoesNotContain(signals, s => s.Contains(code));
    }

    [Fact]
    public void Only_the_completing_point_carries_the_signal_and_a_longer_run_marks_each_further_point()
    {
        double[] values = [0.2, 0.4, 0.2, 0.4, 0.2, 0.4, 0.2, 0.4, 0.2, 0.4, 0.2];

        var signals = RunRules.Evaluate(values, 0, 1);

        Assert.Equal([8, 9, 10], Enumerable.Range(0, values.Length).Where(i => signals[i].Contains("rule-2")));
    }

    [Fact]
    public void The_third_point_of_two_of_three_that_falls_back_does_not_carry_rule_5()
    {
        var signals = RunRules.Evaluate([0, 2.5, 2.5, 0.2], 0, 1);

        Assert.Equal(["rule-5"], signals[2]);
        Assert.Empty(signals[3]);
    }

    [Fact]
    public void Eight_points_beyond_one_sigma_all_on_one_side_are_not_rule_8()
    {
        var signals = RunRules.Evaluate([1.5, 1.6, 1.5, 1.6, 1.5, 1.6, 1.5, 1.6], 0, 1);

        Assert.DoesNotContain(signals, s => s.Contains("rule-8"));
        Assert.Contains("rule-6", signals[7]);
    }

    [Fact]
    public void A_point_can_complete_several_rules_and_lists_them_in_rule_order()
    {
        double[] values = [0.2, 0.4, 0.6, 0.8, 0.9, 1.0, 1.1, 1.2, 3.5];

        var signals = RunRules.Evaluate(values, 0, 1);

        Assert.Equal(["rule-1", "rule-2", "rule-3"], signals[8]);
    }

    [Fact]
    public void Zero_sigma_skips_the_zone_rules_but_keeps_the_run_rules()
    {
        double[] values = [5, 5, 5, 9, 6, 6, 6, 6, 6, 6, 6, 6];

        var signals = RunRules.Evaluate(values, 5, 0);

        Assert.DoesNotContain(signals, s => s.Contains("rule-1") || s.Contains("rule-5") || s.Contains("rule-6") || s.Contains("rule-7") || s.Contains("rule-8"));
        Assert.Equal(["rule-2"], signals[11]);
        Assert.All(signals.Take(11), s => Assert.Empty(s));
    }

    [Theory]
    [InlineData(-1.0)]
    [InlineData(double.NaN)]
    [InlineData(double.PositiveInfinity)]
    public void A_sigma_that_is_negative_or_not_finite_is_refused(double sigma) =>
        Assert.Throws<ArgumentOutOfRangeException>(() => RunRules.Evaluate([1, 2], 0, sigma));

    [Fact]
    public void Every_code_has_a_description_and_unknown_codes_are_refused()
    {
        Assert.Equal(["rule-1", "rule-2", "rule-3", "rule-4", "rule-5", "rule-6", "rule-7", "rule-8"], RunRules.Codes);
        Assert.All(RunRules.Codes, c => Assert.EndsWith(".", RunRules.Describe(c), StringComparison.Ordinal));
        Assert.Contains("Nine points", RunRules.Describe("rule-2"), StringComparison.Ordinal);
        Assert.Throws<ArgumentException>(() => RunRules.Describe("rule-9"));
    }

    private static double[] Alternate(int count, double size) =>
        Enumerable.Range(0, count).Select(i => i % 2 == 0 ? size : -size).ToArray();

    // +a, +b, -a, -b, ...: steps +, -, -, +, +, -, ... so neither alternating nor monotone, and two points per side.
    private static double[] Pattern(int count, double a, double b) =>
        Enumerable.Range(0, count).Select(i => (i % 4) switch { 0 => a, 1 => b, 2 => -a, _ => -b }).ToArray();
}
