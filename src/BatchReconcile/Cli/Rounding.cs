namespace BatchReconcile.Cli;

/// <summary>How figures are rounded for display and JSON.</summary>
/// <remarks>
/// Molar masses and percentages are given to 0.01: the abridged (five significant figure) atomic
/// weights do not support more for typical molecules. The value is taken to decimal first, which
/// drops binary noise (206.285 stays 206.285, not 206.28499999...), then rounded half to even, the
/// rule of ISO 80000-1 Annex B, so that a true tie does not always round up.
/// </remarks>
public static class Rounding
{
    public static double Hundredths(double value) => To(value, 2);

    /// <summary>Rounds to <paramref name="digits"/> decimals the same way; values too large for decimal are left as they are.</summary>
    public static double To(double value, int digits) =>
        double.IsFinite(value) && Math.Abs(value) < 1e15 ? (double)Math.Round((decimal)value, digits, MidpointRounding.ToEven) : value;
}
