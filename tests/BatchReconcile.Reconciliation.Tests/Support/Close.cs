namespace BatchReconcile.Reconciliation.Tests.Support;

internal static class Close
{
    /// <summary>Relative comparison (absolute below 1): hand arithmetic and the engine differ only by rounding of doubles.</summary>
    public static void Equal(double expected, double? actual, string what, double relative = 1e-9)
    {
        Assert.True(actual.HasValue, $"{what}: expected {expected}, got null");
        double scale = Math.Max(1.0, Math.Abs(expected));
        Assert.True(
            Math.Abs(actual!.Value - expected) <= relative * scale,
            FormattableString.Invariant($"{what}: expected {expected}, got {actual.Value}"));
    }
}
