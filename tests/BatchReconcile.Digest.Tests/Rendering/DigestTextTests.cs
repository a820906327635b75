using BatchReconcile.Digest.Rendering;

namespace BatchReconcile.Digest.Tests.Rendering;

public class DigestTextTests
{
    [Theory]
    [InlineData(12.345, 2, "12.35")]
    [InlineData(1250.04, 1, "1250.0")]
    [InlineData(-0.004, 2, "0.00")]
    [InlineData(-3.456, 2, "-3.46")]
    [InlineData(0.005, 2, "0.01")]
    public void Kg_rounds_half_away_from_zero_and_never_prints_minus_zero(double kg, int decimals, string expected) =>
        Assert.Equal(expected, DigestText.Kg(kg, decimals));

    [Theory]
    [InlineData(99.5, 2)]
    [InlineData(100, 1)]
    [InlineData(-150, 1)]
    public void Kg_decimals_follow_the_size_of_the_step(double scale, int expected) =>
        Assert.Equal(expected, DigestText.KgDecimals(scale));

    [Theory]
    [InlineData(81.44, "%", "81.4 %")]
    [InlineData(42.5, "kg", "42.50 kg")]
    [InlineData(142.55, "kg", "142.6 kg")]
    [InlineData(1.3249, "equiv", "1.32 equiv")]
    [InlineData(3.0, "", "3.00")]
    public void Values_carry_their_unit(double value, string unit, string expected) =>
        Assert.Equal(expected, DigestText.WithUnit(value, unit));

    [Fact]
    public void A_missing_value_is_shown_as_not_available() => Assert.Equal("n/a", DigestText.WithUnit(null, "%"));

    [Theory]
    [InlineData(23, "23 h")]
    [InlineData(25, "25 h")]
    [InlineData(24.5, "24.5 h")]
    public void Day_length_in_hours(double hours, string expected) => Assert.Equal(expected, DigestText.Hours(TimeSpan.FromHours(hours)));
}
