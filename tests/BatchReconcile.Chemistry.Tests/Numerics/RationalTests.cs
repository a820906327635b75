using System.Numerics;
using BatchReconcile.Chemistry.Numerics;

namespace BatchReconcile.Chemistry.Tests.Numerics;

public class RationalTests
{
    [Theory]
    [InlineData(2, 4, "1/2")]
    [InlineData(-6, 4, "-3/2")]
    [InlineData(6, -4, "-3/2")]
    [InlineData(-6, -4, "3/2")]
    [InlineData(0, -7, "0")]
    [InlineData(9, 3, "3")]
    [InlineData(17, 1, "17")]
    public void Create_normalises_to_lowest_terms_with_positive_denominator(long numerator, long denominator, string expected)
    {
        var value = Rational.Create(numerator, denominator);

        Assert.Equal(expected, value.ToString());
        Assert.True(value.Denominator.Sign > 0);
        Assert.True(BigInteger.GreatestCommonDivisor(value.Numerator, value.Denominator).IsOne);
    }

    [Fact]
    public void Default_is_zero_over_one()
    {
        Rational value = default;

        Assert.True(value.IsZero);
        Assert.Equal(BigInteger.One, value.Denominator);
        Assert.Equal(Rational.Zero, value);
        Assert.Equal(Rational.Create(0, 5), value);
        Assert.Equal("0", value.ToString());
    }

    [Theory]
    [InlineData("1/2", "1/3", "5/6", "1/6", "1/6", "3/2")]
    [InlineData("3", "-1/4", "11/4", "13/4", "-3/4", "-12")]
    [InlineData("-2/3", "-2/3", "-4/3", "0", "4/9", "1")]
    [InlineData("7/10", "3/10", "1", "2/5", "21/100", "7/3")]
    public void Arithmetic_is_exact(string a, string b, string sum, string difference, string product, string quotient)
    {
        var x = Rational.Parse(a);
        var y = Rational.Parse(b);

        Assert.Equal(Rational.Parse(sum), x + y);
        Assert.Equal(Rational.Parse(difference), x - y);
        Assert.Equal(Rational.Parse(product), x * y);
        Assert.Equal(Rational.Parse(quotient), x / y);
    }

    [Fact]
    public void Arithmetic_stays_exact_beyond_64_bits()
    {
        var third = Rational.Create(1, 3);
        var big = Rational.FromInteger(BigInteger.Pow(10, 40));

        var value = (big * third) - (big / 3) + third;

        Assert.Equal(third, value);
    }

    [Fact]
    public void Division_by_zero_is_a_bug_and_throws()
    {
        Assert.Throws<DivideByZeroException>(() => Rational.One / Rational.Zero);
        Assert.Throws<DivideByZeroException>(() => Rational.Create(1, 0));
        Assert.Throws<DivideByZeroException>(() => Rational.Zero.Reciprocal());
    }

    [Theory]
    [InlineData("1/3", "1/2", -1)]
    [InlineData("-1/2", "-1/3", -1)]
    [InlineData("2/4", "1/2", 0)]
    [InlineData("5", "9/2", 1)]
    public void Comparison_orders_by_value(string a, string b, int expectedSign)
    {
        var x = Rational.Parse(a);
        var y = Rational.Parse(b);

        Assert.Equal(expectedSign, Math.Sign(x.CompareTo(y)));
        Assert.Equal(expectedSign < 0, x < y);
        Assert.Equal(expectedSign > 0, x > y);
        Assert.Equal(expectedSign == 0, x == y);
        Assert.Equal(expectedSign == 0, x.GetHashCode() == y.GetHashCode() && x.Equals(y));
    }

    [Theory]
    [InlineData("3", "3")]
    [InlineData("-3", "-3")]
    [InlineData("0", "0")]
    [InlineData("0.5", "1/2")]
    [InlineData(".5", "1/2")]
    [InlineData("2.", "2")]
    [InlineData("-0.25", "-1/4")]
    [InlineData("1.50", "3/2")]
    [InlineData("1/2", "1/2")]
    [InlineData("4/6", "2/3")]
    [InlineData("-3/9", "-1/3")]
    [InlineData("0/5", "0")]
    [InlineData("123456789012345678901234567890", "123456789012345678901234567890")]
    [InlineData("0.000000000000000000000000000001", "1/1000000000000000000000000000000")]
    public void TryParse_accepts_integer_decimal_and_fraction_text(string text, string expected)
    {
        Assert.True(Rational.TryParse(text, out var value));
        Assert.Equal(expected, value.ToString());
    }

    [Theory]
    [InlineData("")]
    [InlineData("-")]
    [InlineData(".")]
    [InlineData("+1")]
    [InlineData(" 1")]
    [InlineData("1 ")]
    [InlineData("1,5")]
    [InlineData("1e3")]
    [InlineData("1/0")]
    [InlineData("1/")]
    [InlineData("/2")]
    [InlineData("1/-2")]
    [InlineData("1.5/2")]
    [InlineData("1..5")]
    [InlineData("--1")]
    [InlineData("1 000")]
    [InlineData("½")]
    [InlineData("١")]
    public void TryParse_rejects_malformed_text(string text)
    {
        Assert.False(Rational.TryParse(text, out _));
        Assert.Throws<FormatException>(() => Rational.Parse(text));
    }

    [Theory]
    [InlineData("0.5", "1/2")]
    [InlineData("-12.125", "-97/8")]
    [InlineData("3", "3")]
    [InlineData("0.0001", "1/10000")]
    [InlineData("79228162514264337593543950335", "79228162514264337593543950335")]
    public void FromDecimal_is_exact(string decimalText, string expected)
    {
        var value = decimal.Parse(decimalText, System.Globalization.CultureInfo.InvariantCulture);

        Assert.Equal(expected, Rational.FromDecimal(value).ToString());
    }

    [Theory]
    [InlineData("1/2", 0.5)]
    [InlineData("-7/4", -1.75)]
    [InlineData("1/3", 1.0 / 3.0)]
    public void ToDouble_is_the_nearest_double(string text, double expected)
    {
        Assert.Equal(expected, Rational.Parse(text).ToDouble());
    }

    [Fact]
    public void ToDouble_handles_parts_beyond_double_range()
    {
        var huge = BigInteger.Pow(10, 400);
        var value = Rational.Create((huge * 3) + 1, huge * 2);

        Assert.Equal(1.5, value.ToDouble(), 12);
    }

    [Fact]
    public void Abs_and_sign_follow_the_numerator()
    {
        var value = Rational.Create(-5, 7);

        Assert.Equal(-1, value.Sign);
        Assert.Equal(Rational.Create(5, 7), value.Abs());
        Assert.Equal(Rational.Create(-7, 5), value.Reciprocal());
        Assert.False(value.IsInteger);
        Assert.True(Rational.Create(14, 7).IsInteger);
    }
}
