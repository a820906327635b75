using System.Globalization;

namespace BatchReconcile.Chemistry.Metrics;

/// <summary>The numbers that decide whether a mass-balance gap is significant.</summary>
/// <remarks>
/// The tolerance comes from the recipe step, the weighing uncertainty from the site's balance
/// settings; the step computation needs both together, so they travel as one value.
/// </remarks>
public sealed record BalanceCheckSettings
{
    /// <summary>Coverage factor k = 2 (about 95 % coverage for a normal distribution, JCGM 100:2008 (GUM) 6.3.3).</summary>
    public const double DefaultCoverageFactor = 2;

    private BalanceCheckSettings(double tolerancePct, double relativeUncertainty, double absoluteUncertaintyKg, double coverageFactor)
    {
        TolerancePct = tolerancePct;
        RelativeUncertainty = relativeUncertainty;
        AbsoluteUncertaintyKg = absoluteUncertaintyKg;
        CoverageFactor = coverageFactor;
    }

    /// <summary>Allowed gap as % of the charged mass m_in.</summary>
    public double TolerancePct { get; }

    /// <summary>Relative part of a weighing's standard uncertainty, as a fraction (0.001 = 0.1 %).</summary>
    public double RelativeUncertainty { get; }

    /// <summary>Absolute part of a weighing's standard uncertainty, in kg.</summary>
    public double AbsoluteUncertaintyKg { get; }

    public double CoverageFactor { get; }

    /// <exception cref="ArgumentException">A negative or non-finite number, or a coverage factor that is not positive.</exception>
    public static BalanceCheckSettings Create(
        double tolerancePct,
        double relativeUncertainty,
        double absoluteUncertaintyKg,
        double coverageFactor = DefaultCoverageFactor)
    {
        Guard.FiniteNonNegative(tolerancePct, nameof(tolerancePct), "balance check");
        Guard.FiniteNonNegative(relativeUncertainty, nameof(relativeUncertainty), "balance check");
        Guard.FiniteNonNegative(absoluteUncertaintyKg, nameof(absoluteUncertaintyKg), "balance check");
        Guard.FinitePositive(coverageFactor, nameof(coverageFactor), "balance check");
        return new BalanceCheckSettings(tolerancePct, relativeUncertainty, absoluteUncertaintyKg, coverageFactor);
    }

    /// <summary>u = sqrt((rel·m)² + abs²) in kg for one weighing of <paramref name="massKg"/>.</summary>
    /// <remarks>The two parts are treated as independent and added in quadrature (JCGM 100:2008 (GUM) 5.1.2).</remarks>
    public double StandardUncertaintyKg(double massKg)
    {
        if (!double.IsFinite(massKg) || massKg < 0)
        {
            throw new ArgumentOutOfRangeException(nameof(massKg), massKg.ToString(CultureInfo.InvariantCulture), "A weighed mass is finite and >= 0.");
        }

        double relativePart = RelativeUncertainty * massKg;
        return Math.Sqrt((relativePart * relativePart) + (AbsoluteUncertaintyKg * AbsoluteUncertaintyKg));
    }
}
