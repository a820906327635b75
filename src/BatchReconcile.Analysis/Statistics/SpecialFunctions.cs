namespace BatchReconcile.Analysis.Statistics;

/// <summary>Log-gamma and the regularised incomplete beta function, the two pieces Student's t needs.</summary>
/// <remarks>
/// <para>
/// Log-gamma: the Lanczos approximation with g = 7 and nine coefficients (Lanczos, C. (1964), "A Precision
/// Approximation of the Gamma Function", SIAM J. Numer. Anal. B 1: 86-96; the coefficient set is the one
/// widely published for g = 7, n = 9, relative error about 1e-15), with the reflection formula below 1/2.
/// </para>
/// <para>
/// Incomplete beta: I_x(a, b) = x^a (1-x)^b / (a B(a, b)) · 1/(1+ d1/(1+ d2/(1+ ...))) with
/// d_{2m+1} = -(a+m)(a+b+m) x / ((a+2m)(a+2m+1)) and d_{2m} = m(b-m) x / ((a+2m-1)(a+2m))
/// (Abramowitz and Stegun 26.5.8), evaluated by the modified Lentz method (Lentz, W. J. (1976), Applied
/// Optics 15: 668-671; Thompson and Barnett (1986), J. Comput. Phys. 64: 490-509). The fraction converges
/// fast for x &lt; (a+1)/(a+b+2); above that the symmetry I_x(a, b) = 1 - I_{1-x}(b, a) is used. Both x and
/// 1 - x are taken from the caller so that neither is formed by a cancelling subtraction.
/// </para>
/// </remarks>
internal static class SpecialFunctions
{
    private const double LentzTiny = 1e-300;
    private const double LentzEpsilon = 1e-15;
    private const int MaxIterations = 100_000;

    private static readonly double[] Lanczos =
    [
        0.99999999999980993,
        676.5203681218851,
        -1259.1392167224028,
        771.32342877765313,
        -176.61502916214059,
        12.507343278686905,
        -0.13857109526572012,
        9.9843695780195716e-6,
        1.5056327351493116e-7,
    ];

    /// <summary>ln Γ(z) for z &gt; 0.</summary>
    public static double LogGamma(double z)
    {
        if (!(z > 0)) throw new ArgumentOutOfRangeException(nameof(z), z, "log-gamma needs z > 0");
        if (z < 0.5)
        {
            // Reflection: Γ(z) Γ(1 - z) = π / sin(π z).
            return Math.Log(Math.PI / Math.Sin(Math.PI * z)) - LogGamma(1 - z);
        }

        z -= 1;
        double sum = Lanczos[0];
        double t = z + 7.5;
        for (var i = 1; i < Lanczos.Length; i++) sum += Lanczos[i] / (z + i);
        return 0.5 * Math.Log(2 * Math.PI) + (z + 0.5) * Math.Log(t) - t + Math.Log(sum);
    }

    /// <summary>ln B(a, b) = ln Γ(a) + ln Γ(b) - ln Γ(a + b).</summary>
    public static double LogBeta(double a, double b) => LogGamma(a) + LogGamma(b) - LogGamma(a + b);

    /// <summary>
    /// I_x(a, b), with x and y = 1 - x both given (and their logarithms, so that a tail far out does not
    /// underflow before it is scaled).
    /// </summary>
    public static double RegularizedBeta(double a, double b, double x, double y, double lnX, double lnY)
    {
        if (x <= 0) return 0;
        if (y <= 0) return 1;
        if (x < (a + 1) / (a + b + 2))
            return Math.Exp(a * lnX + b * lnY - LogBeta(a, b)) * ContinuedFraction(a, b, x) / a;
        return 1 - Math.Exp(b * lnY + a * lnX - LogBeta(b, a)) * ContinuedFraction(b, a, y) / b;
    }

    /// <summary>
    /// ln of the leading factor and the continued fraction of I_x(a, b), for a caller that knows
    /// x &lt; (a+1)/(a+b+2) and wants the logarithm of a tiny result.
    /// </summary>
    public static double LogRegularizedBetaDirect(double a, double b, double x, double lnX, double lnY) =>
        a * lnX + b * lnY - LogBeta(a, b) + Math.Log(ContinuedFraction(a, b, x) / a);

    private static double ContinuedFraction(double a, double b, double x)
    {
        double qab = a + b, qap = a + 1, qam = a - 1;
        double c = 1;
        double d = 1 - qab * x / qap;
        if (Math.Abs(d) < LentzTiny) d = LentzTiny;
        d = 1 / d;
        double h = d;
        for (var m = 1; m <= MaxIterations; m++)
        {
            int m2 = 2 * m;
            double aa = m * (b - m) * x / ((qam + m2) * (a + m2));
            d = 1 + aa * d;
            if (Math.Abs(d) < LentzTiny) d = LentzTiny;
            c = 1 + aa / c;
            if (Math.Abs(c) < LentzTiny) c = LentzTiny;
            d = 1 / d;
            h *= d * c;

            aa = -(a + m) * (qab + m) * x / ((a + m2) * (qap + m2));
            d = 1 + aa * d;
            if (Math.Abs(d) < LentzTiny) d = LentzTiny;
            c = 1 + aa / c;
            if (Math.Abs(c) < LentzTiny) c = LentzTiny;
            d = 1 / d;
            double delta = d * c;
            h *= delta;
            if (Math.Abs(delta - 1) <= LentzEpsilon) return h;
        }

        throw new InvalidOperationException(
            FormattableString.Invariant($"incomplete beta continued fraction did not converge (a={a:R}, b={b:R}, x={x:R})"));
    }

    /// <summary>ln(1 + x), accurate for small x (.NET has no log1p).</summary>
    public static double Log1P(double x)
    {
        if (Math.Abs(x) < 1e-4)
        {
            // Taylor series: x - x^2/2 + x^3/3 - x^4/4, error below x^5/5 < 2e-21 relative.
            return x * (1 - x * (0.5 - x * (1.0 / 3 - x * 0.25)));
        }

        double u = 1 + x;
        // Corrects the rounding of 1 + x (Goldberg, D. (1991), "What Every Computer Scientist Should
        // Know About Floating-Point Arithmetic", ACM Computing Surveys 23(1), theorem 4).
        return Math.Log(u) - ((u - 1) - x) / u;
    }
}
