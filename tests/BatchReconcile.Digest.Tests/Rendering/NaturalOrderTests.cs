using BatchReconcile.Digest.Rendering;

namespace BatchReconcile.Digest.Tests.Rendering;

public class NaturalOrderTests
{
    [Theory]
    [InlineData("S2", "S10", -1)]
    [InlineData("S10", "S2", 1)]
    [InlineData("B-26-9", "B-26-10", -1)]
    [InlineData("S2", "S2", 0)]
    [InlineData("S2a", "S2b", -1)]
    [InlineData("S", "S1", -1)]
    [InlineData("A9", "B1", -1)]
    [InlineData("B-0001", "B-2", -1)]
    [InlineData("B-01", "B-1", -1)]
    [InlineData("B-123456789012345678901234567890", "B-123456789012345678901234567891", -1)]
    public void Digit_runs_compare_as_numbers(string x, string y, int sign)
    {
        Assert.Equal(sign, Math.Sign(NaturalOrder.Instance.Compare(x, y)));
        Assert.Equal(-sign, Math.Sign(NaturalOrder.Instance.Compare(y, x)));
    }
}
