using System.Globalization;
using System.Numerics;

namespace BatchReconcile.Chemistry.Numerics;

/// <summary>
/// An exact fraction of two <see cref="BigInteger"/>s, always in lowest terms with a positive
/// denominator. Equation balancing must be exact, so this is the only number type it uses.
/// </summary>
public readonly struct Rational : IEquatable<Rational>, IComparable<Rational>, IComparable
{
    // Stored as denominator - 1 so that default(Rational) is a valid zero (0/1), not 0/0.
    private readonly BigInteger _denominatorMinusOne;

    // Callers pass a numerator and denominator already in lowest terms with denominator > 0.
    private Rational(BigInteger numerator, BigInteger denominator)
    {
        Numerator = numerator;
        _denominatorMinusOne = denominator - BigInteger.One;
    }

    public static Rational Zero => default;

    public static Rational One => new(BigInteger.One, BigInteger.One);

    public BigInteger Numerator { get; }

    public BigInteger Denominator => _denominatorMinusOne + BigInteger.One;

    public int Sign => Numerator.Sign;

    public bool IsZero => Numerator.IsZero;

    public bool IsInteger => _denominatorMinusOne.IsZero;

    /// <summary>Creates numerator/denominator in lowest terms. A zero denominator is a bug and throws.</summary>
    public static Rational Create(BigInteger numerator, BigInteger denominator)
    {
        if (denominator.IsZero)
        {
            throw new DivideByZeroException("A rational number cannot have a zero denominator.");
        }

        if (denominator.Sign < 0)
        {
            numerator = -numerator;
            denominator = -denominator;
        }

        if (numerator.IsZero)
        {
            return Zero;
        }

        var gcd = BigInteger.GreatestCommonDivisor(numerator, denominator);
        if (!gcd.IsOne)
        {
            numerator /= gcd;
            denominator /= gcd;
        }

        return new Rational(numerator, denominator);
    }

    public static Rational FromInteger(BigInteger value) => new(value, BigInteger.One);

    /// <summary>Exact conversion: a decimal is an integer scaled by a power of ten.</summary>
    public static Rational FromDecimal(decimal value)
    {
        Span<int> bits = stackalloc int[4];
        decimal.GetBits(value, bits);
        // The three low words are an unsigned 96-bit magnitude; reinterpret, do not range-check.
        var magnitude = new BigInteger(unchecked((uint)bits[0]))
            | (new BigInteger(unchecked((uint)bits[1])) << 32)
            | (new BigInteger(unchecked((uint)bits[2])) << 64);
        var scale = (bits[3] >> 16) & 0xFF;
        var negative = bits[3] < 0;
        return Create(negative ? -magnitude : magnitude, BigInteger.Pow(10, scale));
    }

    public static implicit operator Rational(int value) => FromInteger(value);

    public static implicit operator Rational(long value) => FromInteger(value);

    public static implicit operator Rational(BigInteger value) => FromInteger(value);

    public static Rational operator +(Rational left, Rational right)
    {
        if (left.IsInteger && right.IsInteger)
        {
            return FromInteger(left.Numerator + right.Numerator);
        }

        return Create(
            (left.Numerator * right.Denominator) + (right.Numerator * left.Denominator),
            left.Denominator * right.Denominator);
    }

    public static Rational operator -(Rational value) =>
        new(-value.Numerator, value.Denominator);

    public static Rational operator -(Rational left, Rational right) => left + (-right);

    public static Rational operator *(Rational left, Rational right)
    {
        if (left.IsInteger && right.IsInteger)
        {
            return FromInteger(left.Numerator * right.Numerator);
        }

        return Create(left.Numerator * right.Numerator, left.Denominator * right.Denominator);
    }

    /// <summary>Division by zero is a bug in the caller and throws <see cref="DivideByZeroException"/>.</summary>
    public static Rational operator /(Rational left, Rational right)
    {
        if (right.IsZero)
        {
            throw new DivideByZeroException("Division of a rational number by zero.");
        }

        return Create(left.Numerator * right.Denominator, left.Denominator * right.Numerator);
    }

    public static bool operator ==(Rational left, Rational right) => left.Equals(right);

    public static bool operator !=(Rational left, Rational right) => !left.Equals(right);

    public static bool operator <(Rational left, Rational right) => left.CompareTo(right) < 0;

    public static bool operator >(Rational left, Rational right) => left.CompareTo(right) > 0;

    public static bool operator <=(Rational left, Rational right) => left.CompareTo(right) <= 0;

    public static bool operator >=(Rational left, Rational right) => left.CompareTo(right) >= 0;

    public Rational Abs() => Numerator.Sign < 0 ? -this : this;

    public Rational Reciprocal() => One / this;

    public bool Equals(Rational other) =>
        Numerator.Equals(other.Numerator) && _denominatorMinusOne.Equals(other._denominatorMinusOne);

    public override bool Equals(object? obj) => obj is Rational other && Equals(other);

    public override int GetHashCode() => HashCode.Combine(Numerator, _denominatorMinusOne);

    public int CompareTo(Rational other)
    {
        if (_denominatorMinusOne.Equals(other._denominatorMinusOne))
        {
            return Numerator.CompareTo(other.Numerator);
        }

        // Denominators are positive, so cross-multiplying keeps the order.
        return (Numerator * other.Denominator).CompareTo(other.Numerator * Denominator);
    }

    public int CompareTo(object? obj) => obj switch
    {
        null => 1,
        Rational other => CompareTo(other),
        _ => throw new ArgumentException("Object is not a Rational.", nameof(obj)),
    };

    /// <summary>Nearest double; for reporting only, never for balancing.</summary>
    public double ToDouble()
    {
        var numerator = Numerator;
        var denominator = Denominator;

        // Keep both parts inside double range while holding about 64 significant bits of each.
        var excess = Math.Max(BitLength(numerator), BitLength(denominator)) - 1000;
        if (excess > 0)
        {
            numerator >>= excess;
            denominator >>= excess;
            if (denominator.IsZero)
            {
                return numerator.Sign * double.PositiveInfinity;
            }
        }

        return (double)numerator / (double)denominator;
    }

    /// <summary>Invariant text: "3", "-3/2".</summary>
    public override string ToString() => IsInteger
        ? Numerator.ToString(CultureInfo.InvariantCulture)
        : Numerator.ToString(CultureInfo.InvariantCulture) + "/" + Denominator.ToString(CultureInfo.InvariantCulture);

    /// <summary>
    /// Parses invariant text: an integer ("3", "-2"), a decimal ("0.5", ".5", "2.") or a fraction
    /// ("1/2", "-3/4"). No whitespace, exponents, group separators or leading '+' are accepted.
    /// Returns false on malformed text or a zero denominator.
    /// </summary>
    public static bool TryParse(ReadOnlySpan<char> text, out Rational value)
    {
        value = Zero;
        if (text.IsEmpty)
        {
            return false;
        }

        var negative = text[0] == '-';
        var body = negative ? text[1..] : text;

        var slash = body.IndexOf('/');
        if (slash >= 0)
        {
            var top = body[..slash];
            var bottom = body[(slash + 1)..];
            if (!IsDigits(top) || !IsDigits(bottom))
            {
                return false;
            }

            var denominator = BigInteger.Parse(bottom, NumberStyles.None, CultureInfo.InvariantCulture);
            if (denominator.IsZero)
            {
                return false;
            }

            var numerator = BigInteger.Parse(top, NumberStyles.None, CultureInfo.InvariantCulture);
            value = Create(negative ? -numerator : numerator, denominator);
            return true;
        }

        var dot = body.IndexOf('.');
        var whole = dot >= 0 ? body[..dot] : body;
        var fraction = dot >= 0 ? body[(dot + 1)..] : [];
        if (whole.IsEmpty && fraction.IsEmpty)
        {
            return false;
        }

        if ((!whole.IsEmpty && !IsDigits(whole)) || (!fraction.IsEmpty && !IsDigits(fraction)))
        {
            return false;
        }

        var integerPart = whole.IsEmpty ? BigInteger.Zero : BigInteger.Parse(whole, NumberStyles.None, CultureInfo.InvariantCulture);
        var fractionPart = fraction.IsEmpty ? BigInteger.Zero : BigInteger.Parse(fraction, NumberStyles.None, CultureInfo.InvariantCulture);
        var scale = BigInteger.Pow(10, fraction.Length);
        var total = (integerPart * scale) + fractionPart;
        value = Create(negative ? -total : total, scale);
        return true;
    }

    /// <summary>Parses trusted text (constants in code); malformed text is a bug and throws <see cref="FormatException"/>.</summary>
    public static Rational Parse(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        return TryParse(text, out var value)
            ? value
            : throw new FormatException($"'{text}' is not an integer, decimal or fraction.");
    }

    private static bool IsDigits(ReadOnlySpan<char> text)
    {
        if (text.IsEmpty)
        {
            return false;
        }

        foreach (var c in text)
        {
            if (c is < '0' or > '9')
            {
                return false;
            }
        }

        return true;
    }

    private static int BitLength(BigInteger value) => (int)BigInteger.Abs(value).GetBitLength();
}
