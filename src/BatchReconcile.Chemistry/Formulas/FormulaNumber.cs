namespace BatchReconcile.Chemistry.Formulas;

/// <summary>
/// A count or multiplier as written: an integer mantissa and a count of decimal places, so
/// "0.95" stays exactly 95 / 10^2 until a consumer picks decimal (exact) or double (fast).
/// </summary>
internal readonly struct FormulaNumber
{
    private static readonly double[] PowersOfTen = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8];

    public static readonly FormulaNumber One = new(1, 0);

    public FormulaNumber(long mantissa, int scale)
    {
        Mantissa = mantissa;
        Scale = scale;
    }

    public long Mantissa { get; }

    public int Scale { get; }

    public bool IsZero => Mantissa == 0;

    public bool IsOne => Mantissa == 1 && Scale == 0;

    // Mantissa and 10^scale are both exact in a double, so the division is correctly rounded.
    public double ToDouble() => Scale == 0 ? Mantissa : Mantissa / PowersOfTen[Scale];

    // The reader keeps the mantissa below 2^63 and the scale at most 6, so the two low words and a zero high word hold it.
    public decimal ToDecimal() => new(unchecked((int)(uint)Mantissa), unchecked((int)(uint)(Mantissa >> 32)), 0, false, (byte)Scale);
}
