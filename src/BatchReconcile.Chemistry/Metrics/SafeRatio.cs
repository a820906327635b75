namespace BatchReconcile.Chemistry.Metrics;

internal static class SafeRatio
{
    /// <summary>numerator / denominator, or null when the denominator is not positive or the quotient is not finite.</summary>
    /// <remarks>
    /// Every denominator in the metrics is a mass that is positive in a meaningful step. Zero (nothing
    /// charged, no product) or negative (more recovered than charged) leaves the ratio without meaning,
    /// so it is reported as absent rather than as an exception, an infinity or a sign-flipped number.
    /// </remarks>
    public static double? Of(double numerator, double denominator)
    {
        if (!(denominator > 0))
        {
            return null;
        }

        double q = numerator / denominator;
        return double.IsFinite(q) ? q : null;
    }
}
