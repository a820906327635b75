using System.Globalization;

namespace BatchReconcile.Chemistry.Metrics;

/// <remarks>
/// Inputs reach this layer after the batch-record layer has validated them, so a bad number here
/// is a bug in the caller and throws; it is not a finding to report.
/// </remarks>
internal static class Guard
{
    public static void FinitePositive(double value, string parameter, string what)
    {
        if (!double.IsFinite(value) || value <= 0)
        {
            throw new ArgumentException(
                string.Create(CultureInfo.InvariantCulture, $"{what}: {parameter} must be finite and > 0, got {value}."),
                parameter);
        }
    }

    public static void FiniteNonNegative(double value, string parameter, string what)
    {
        if (!double.IsFinite(value) || value < 0)
        {
            throw new ArgumentException(
                string.Create(CultureInfo.InvariantCulture, $"{what}: {parameter} must be finite and >= 0, got {value}."),
                parameter);
        }
    }

    public static void AssayPct(double value, string parameter, string what)
    {
        if (!double.IsFinite(value) || value <= 0 || value > 100)
        {
            throw new ArgumentException(
                string.Create(CultureInfo.InvariantCulture, $"{what}: {parameter} must be in (0, 100], got {value}."),
                parameter);
        }
    }
}
