using System.Globalization;
using System.Runtime.CompilerServices;
using BatchReconcile.Chemistry.Elements;

namespace BatchReconcile.Chemistry.Formulas;

/// <summary>
/// The one formula grammar, shared by <see cref="Formula.Parse"/> and <see cref="Formula.TryGetMolarMass"/>.
/// <code>
/// formula   := part (separator part)* charge?
/// part      := multiplier? unit+
/// unit      := symbol count? | open unit+ close count?
/// separator := '·' | '•' | '*' | '.'     ('.' only where it is not a decimal point, see IsDecimalPoint)
/// charge    := '^' digits sign | '^' sign digits?
/// </code>
/// Surrounding white space is ignored; white space inside is an error. Positions in failures refer to
/// the text as given. Nothing here allocates on the success path.
/// </summary>
internal static class FormulaReader
{
    public const int MaxLength = 1024;
    public const int MaxDepth = 16;
    public const int MaxIntegerDigits = 7;
    public const int MaxDecimals = 6;
    public const long MaxNumber = 1_000_000;
    public const int MaxChargeDigits = 3;

    // Limits on an element count after all multipliers are applied. They keep decimal arithmetic far
    // from overflow and from rounding a tiny product to zero, whatever the nesting.
    public const double MaxTotal = 1e9;
    public const double MinTotal = 1e-9;

    private struct Level
    {
        public char Open;
        public int OpenIndex;
        public double Max;
        public double Min;
    }

    public static bool Read<TSink>(ReadOnlySpan<char> text, ref TSink sink, out int charge, out ReadFailure failure)
        where TSink : IFormulaSink, allows ref struct
    {
        charge = 0;
        failure = default;
        int pos = 0;
        int end = text.Length;
        while (pos < end && char.IsWhiteSpace(text[pos])) pos++;
        while (end > pos && char.IsWhiteSpace(text[end - 1])) end--;
        if (pos == end) return Fail(out failure, FormulaProblem.Empty, 0);
        if (end - pos > MaxLength) return Fail(out failure, FormulaProblem.TooLong, pos);

        Span<Level> levels = stackalloc Level[MaxDepth + 1];
        while (true)
        {
            // One part: the whole formula, or one component of an adduct/hydrate.
            var multiplier = FormulaNumber.One;
            int multiplierIndex = pos;
            if (char.IsAsciiDigit(text[pos]))
            {
                if (!ReadNumber(text, ref pos, end, isMultiplier: true, out multiplier, out failure)) return false;
                if (multiplier.IsZero) return Fail(out failure, FormulaProblem.ZeroNumber, multiplierIndex, isMultiplier: true);
            }

            sink.BeginPart(multiplier);
            int depth = 0;
            levels[0] = new Level { Open = '\0', OpenIndex = pos, Max = 0, Min = double.PositiveInfinity };
            while (pos < end)
            {
                char c = text[pos];
                if (char.IsAsciiLetterUpper(c))
                {
                    int symbolIndex = pos;
                    char lower = pos + 1 < end && char.IsAsciiLetterLower(text[pos + 1]) ? text[pos + 1] : '\0';
                    int slot = PeriodicTable.Lookup(c, lower);
                    if (slot == 0) return Fail(out failure, FormulaProblem.UnknownElement, symbolIndex, lower == '\0' ? 1 : 2);
                    if (slot == PeriodicTable.NoWeight) return Fail(out failure, FormulaProblem.NoStandardWeight, symbolIndex, lower == '\0' ? 1 : 2);
                    pos += lower == '\0' ? 1 : 2;

                    var count = FormulaNumber.One;
                    if (pos < end && char.IsAsciiDigit(text[pos]))
                    {
                        int countIndex = pos;
                        if (!ReadNumber(text, ref pos, end, isMultiplier: false, out count, out failure)) return false;
                        if (count.IsZero) return Fail(out failure, FormulaProblem.ZeroNumber, countIndex);
                    }

                    sink.Atom(slot - 1, count);
                    double value = count.ToDouble();
                    ref Level level = ref levels[depth];
                    level.Max = Math.Max(level.Max, value);
                    level.Min = Math.Min(level.Min, value);
                }
                else if (c is '(' or '[' or '{')
                {
                    if (depth == MaxDepth) return Fail(out failure, FormulaProblem.TooDeep, pos);
                    depth++;
                    levels[depth] = new Level { Open = c, OpenIndex = pos, Max = 0, Min = double.PositiveInfinity };
                    sink.OpenGroup();
                    pos++;
                }
                else if (c is ')' or ']' or '}')
                {
                    if (depth == 0) return Fail(out failure, FormulaProblem.NoMatchingOpen, pos);
                    ref Level level = ref levels[depth];
                    if (level.Open != OpeningFor(c)) return Fail(out failure, FormulaProblem.MismatchedBracket, level.OpenIndex, pos);
                    if (level.Max == 0) return Fail(out failure, FormulaProblem.EmptyBrackets, level.OpenIndex, pos);
                    pos++;

                    var count = FormulaNumber.One;
                    int countIndex = pos;
                    if (pos < end && char.IsAsciiDigit(text[pos]))
                    {
                        if (!ReadNumber(text, ref pos, end, isMultiplier: false, out count, out failure)) return false;
                        if (count.IsZero) return Fail(out failure, FormulaProblem.ZeroNumber, countIndex);
                    }

                    double value = count.ToDouble();
                    double max = level.Max * value;
                    double min = level.Min * value;
                    if (max > MaxTotal) return Fail(out failure, FormulaProblem.TotalTooLarge, countIndex);
                    if (min < MinTotal) return Fail(out failure, FormulaProblem.TotalTooSmall, countIndex);
                    depth--;
                    ref Level parent = ref levels[depth];
                    parent.Max = Math.Max(parent.Max, max);
                    parent.Min = Math.Min(parent.Min, min);
                    sink.CloseGroup(count);
                }
                else
                {
                    break;
                }
            }

            // pos is at the end, at a separator, at '^', or at something that cannot be there.
            if (pos < end && !IsSeparator(text[pos]) && text[pos] != '^')
                return Fail(out failure, FormulaProblem.ExpectedSymbol, pos);
            if (depth > 0) return Fail(out failure, FormulaProblem.NeverClosed, levels[depth].OpenIndex);
            if (levels[0].Max == 0) return Fail(out failure, FormulaProblem.ExpectedSymbol, pos);

            double partMultiplier = multiplier.ToDouble();
            if (levels[0].Max * partMultiplier > MaxTotal) return Fail(out failure, FormulaProblem.TotalTooLarge, multiplierIndex, isMultiplier: true);
            if (levels[0].Min * partMultiplier < MinTotal) return Fail(out failure, FormulaProblem.TotalTooSmall, multiplierIndex, isMultiplier: true);
            sink.EndPart(multiplier);

            if (pos == end) return true;
            if (text[pos] == '^') return ReadCharge(text, pos, end, out charge, out failure);

            int separatorIndex = pos;
            pos++;
            if (pos == end) return Fail(out failure, FormulaProblem.NothingAfterSeparator, separatorIndex);
        }
    }

    /// <summary>Reads digits, and a decimal part when the '.' after them is a decimal point.</summary>
    private static bool ReadNumber(ReadOnlySpan<char> text, ref int pos, int end, bool isMultiplier, out FormulaNumber value, out ReadFailure failure)
    {
        value = default;
        int start = pos;
        long whole = 0;
        while (pos < end && char.IsAsciiDigit(text[pos]))
        {
            if (pos - start == MaxIntegerDigits) return Fail(out failure, FormulaProblem.TooManyDigits, start, isMultiplier: isMultiplier);
            whole = whole * 10 + (text[pos] - '0');
            pos++;
        }

        if (whole > MaxNumber) return Fail(out failure, FormulaProblem.NumberTooLarge, start, isMultiplier: isMultiplier);

        long mantissa = whole;
        int scale = 0;
        if (pos + 1 < end && text[pos] == '.' && char.IsAsciiDigit(text[pos + 1]) && IsDecimalPoint(text, pos, end, whole, isMultiplier))
        {
            pos++;
            while (pos < end && char.IsAsciiDigit(text[pos]))
            {
                if (scale == MaxDecimals) return Fail(out failure, FormulaProblem.TooManyDecimals, start, isMultiplier: isMultiplier);
                mantissa = mantissa * 10 + (text[pos] - '0');
                scale++;
                pos++;
            }

            if (whole == MaxNumber && mantissa != MaxNumber * Pow10(scale))
                return Fail(out failure, FormulaProblem.NumberTooLarge, start, isMultiplier: isMultiplier);
        }

        value = new FormulaNumber(mantissa, scale);
        failure = default;
        return true;
    }

    /// <summary>
    /// Decides whether the '.' at <paramref name="dot"/>, which sits between two digits, is a decimal point.
    /// Why this rule: '.' is written both as a decimal point (Fe0.95O) and as the hydrate dot
    /// (CuSO4.5H2O, Na2CO3.10H2O); "4.5H2O" cannot be told apart by syntax alone, and the hydrate
    /// reading is by far the more common in batch records. So, in this order:
    /// <list type="number">
    /// <item>in a multiplier (start of the formula or of an adduct part) it is a decimal point ("CaSO4·0.5H2O", "2.5H2O"), because a bare number cannot be a part;</item>
    /// <item>after a count whose whole part is 0 it is a decimal point ("Fe0.95O", "La0.7Sr0.3MnO3");</item>
    /// <item>when the digits after it are followed by the end, a closing bracket, '^' or another separator it is a decimal point, since an adduct reading would leave a part with no atoms ("YBa2Cu3O6.95");</item>
    /// <item>otherwise it separates an adduct whose multiplier is the digits after it ("CuSO4.5H2O" is CuSO4·5H2O).</item>
    /// </list>
    /// Consequence: a decimal count of 1 or more followed by more atoms ("Fe1.5O") reads as an adduct;
    /// write '·' for adducts to be unambiguous and put such a count last or scale the formula.
    /// </summary>
    private static bool IsDecimalPoint(ReadOnlySpan<char> text, int dot, int end, long whole, bool isMultiplier)
    {
        if (isMultiplier || whole == 0) return true;
        int j = dot + 1;
        while (j < end && char.IsAsciiDigit(text[j])) j++;
        if (j == end) return true;
        char next = text[j];
        return next is ')' or ']' or '}' or '^' or '·' or '•' or '*';
    }

    private static bool ReadCharge(ReadOnlySpan<char> text, int pos, int end, out int charge, out ReadFailure failure)
    {
        charge = 0;
        int caret = pos;
        pos++;
        int magnitude = 1;
        int sign;
        if (pos < end && char.IsAsciiDigit(text[pos]))
        {
            if (!ReadChargeDigits(text, ref pos, end, out magnitude, out failure)) return false;
            if (pos == end || SignOf(text[pos]) == 0) return Fail(out failure, FormulaProblem.ChargeSignMissing, pos);
            sign = SignOf(text[pos]);
            pos++;
        }
        else if (pos < end && SignOf(text[pos]) != 0)
        {
            sign = SignOf(text[pos]);
            pos++;
            if (pos < end && char.IsAsciiDigit(text[pos]) && !ReadChargeDigits(text, ref pos, end, out magnitude, out failure)) return false;
        }
        else
        {
            return Fail(out failure, FormulaProblem.ExpectedCharge, caret, pos);
        }

        if (magnitude == 0) return Fail(out failure, FormulaProblem.ChargeZero, caret);
        if (pos != end) return Fail(out failure, FormulaProblem.ChargeNotLast, pos);
        charge = sign * magnitude;
        failure = default;
        return true;
    }

    private static bool ReadChargeDigits(ReadOnlySpan<char> text, ref int pos, int end, out int magnitude, out ReadFailure failure)
    {
        int start = pos;
        magnitude = 0;
        while (pos < end && char.IsAsciiDigit(text[pos]))
        {
            if (pos - start == MaxChargeDigits) return Fail(out failure, FormulaProblem.ChargeTooManyDigits, start);
            magnitude = magnitude * 10 + (text[pos] - '0');
            pos++;
        }

        failure = default;
        return true;
    }

    // U+2212 MINUS SIGN is accepted because text copied from documents often carries it.
    private static int SignOf(char c) => c switch { '+' => 1, '-' or '\u2212' => -1, _ => 0 };

    private static bool IsSeparator(char c) => c is '·' or '•' or '*' or '.';

    private static char OpeningFor(char close) => close switch { ')' => '(', ']' => '[', _ => '{' };

    private static char ClosingFor(char open) => open switch { '(' => ')', '[' => ']', _ => '}' };

    private static long Pow10(int n)
    {
        long p = 1;
        for (int i = 0; i < n; i++) p *= 10;
        return p;
    }

    [MethodImpl(MethodImplOptions.NoInlining)]
    private static bool Fail(out ReadFailure failure, FormulaProblem problem, int index, int other = -1, bool isMultiplier = false)
    {
        failure = new ReadFailure(problem, index, other, isMultiplier);
        return false;
    }

    /// <summary>Turns a failure into the message users see; only called when an error is reported.</summary>
    public static FormulaError Describe(ReadOnlySpan<char> text, ReadFailure failure)
    {
        var inv = CultureInfo.InvariantCulture;
        int i = failure.Index;
        int at = i + 1;
        string number = failure.IsMultiplier ? "multiplier" : "count";
        string message = failure.Problem switch
        {
            FormulaProblem.Empty => "empty formula",
            FormulaProblem.TooLong => string.Create(inv, $"formula is longer than {MaxLength} characters"),
            FormulaProblem.UnknownElement => string.Create(inv, $"unknown element '{text.Slice(i, failure.OtherIndex)}' at {at}"),
            FormulaProblem.NoStandardWeight => string.Create(inv, $"element '{text.Slice(i, failure.OtherIndex)}' at {at} has no standard atomic weight"),
            FormulaProblem.ExpectedSymbol => ExpectedSymbol(text, i),
            FormulaProblem.NeverClosed => string.Create(inv, $"'{text[i]}' at {at} is never closed"),
            FormulaProblem.NoMatchingOpen => string.Create(inv, $"'{text[i]}' at {at} has no matching '{OpeningFor(text[i])}'"),
            FormulaProblem.MismatchedBracket => string.Create(inv, $"mismatched bracket: '{text[i]}' at {at} closed by '{text[failure.OtherIndex]}' at {failure.OtherIndex + 1}"),
            FormulaProblem.EmptyBrackets => string.Create(inv, $"empty brackets '{text[i]}{ClosingFor(text[i])}' at {at}"),
            FormulaProblem.TooDeep => string.Create(inv, $"brackets nested more than {MaxDepth} deep at {at}"),
            FormulaProblem.ZeroNumber => string.Create(inv, $"{number} at {at} is zero"),
            FormulaProblem.TooManyDigits => string.Create(inv, $"{number} at {at} has more than {MaxIntegerDigits} digits"),
            FormulaProblem.NumberTooLarge => string.Create(inv, $"{number} at {at} is larger than {MaxNumber}"),
            FormulaProblem.TooManyDecimals => string.Create(inv, $"{number} at {at} has more than {MaxDecimals} decimal places"),
            FormulaProblem.TotalTooLarge => string.Create(inv, $"{number} at {at} makes an element count larger than {MaxTotal:0}"),
            FormulaProblem.TotalTooSmall => string.Create(inv, $"{number} at {at} makes an element count smaller than {MinTotal:0.#########}"),
            FormulaProblem.NothingAfterSeparator => string.Create(inv, $"expected a formula after '{text[i]}' at {at}"),
            FormulaProblem.ExpectedCharge => string.Create(inv, $"expected a charge after '^' at {at}, such as '^2-', '^-2' or '^+', found {Found(text, failure.OtherIndex)}"),
            FormulaProblem.ChargeSignMissing => string.Create(inv, $"expected '+' or '-' at {at} after the charge number, found {Found(text, i)}"),
            FormulaProblem.ChargeZero => string.Create(inv, $"charge after '^' at {at} is zero"),
            FormulaProblem.ChargeTooManyDigits => string.Create(inv, $"charge at {at} has more than {MaxChargeDigits} digits"),
            FormulaProblem.ChargeNotLast => string.Create(inv, $"unexpected {Found(text, i)} at {at}: the charge must come last"),
            _ => throw new InvalidOperationException($"No message for {failure.Problem}."),
        };
        return new FormulaError(failure.Problem == FormulaProblem.Empty ? 1 : at, message);
    }

    private static string ExpectedSymbol(ReadOnlySpan<char> text, int i)
    {
        string message = string.Create(CultureInfo.InvariantCulture, $"expected an element symbol at {i + 1}, found {Found(text, i)}");
        if (i < text.Length && char.IsAsciiLetterLower(text[i])) message += " (element symbols start with a capital letter)";
        return message;
    }

    /// <summary>Names the character at <paramref name="i"/> so that invisible ones are still readable.</summary>
    private static string Found(ReadOnlySpan<char> text, int i)
    {
        // The end of the trimmed text counts as the end even if white space follows.
        bool atEnd = true;
        for (int k = i; k < text.Length; k++)
        {
            if (!char.IsWhiteSpace(text[k])) { atEnd = false; break; }
        }

        if (i < 0 || atEnd) return "the end of the formula";
        char c = text[i];
        if (char.IsControl(c) || char.IsSurrogate(c) || char.IsWhiteSpace(c) || c == '\uFFFD')
            return string.Create(CultureInfo.InvariantCulture, $"U+{(int)c:X4}");
        return "'" + c + "'";
    }
}
