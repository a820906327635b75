namespace BatchReconcile.Cli;

/// <summary>How figures are rounded for display and JSON.</summary>
/// <remarks>
/// Molar masses and percentages are given to 0.01: the abridged (five significant figure)
/// atomic weights do not support more for typical molecules, and it matches the interface spec.
/// Rounding is half away from zero, as a chemist rounds by hand.
/// </remarks>
public static class Rounding
{
    public static double Hundredths(double value) => Math.Round(value, 2, MidpointRounding.AwayFromZero);
}
