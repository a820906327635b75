namespace BatchReconcile.Digest.Rendering;

/// <summary>Compares codes with their digit runs as numbers, so step "S2" comes before "S10" and batch "B-9" before "B-10".</summary>
public sealed class NaturalOrder : IComparer<string>
{
    public static NaturalOrder Instance { get; } = new();

    private NaturalOrder()
    {
    }

    public int Compare(string? x, string? y)
    {
        if (ReferenceEquals(x, y))
        {
            return 0;
        }

        if (x is null || y is null)
        {
            return x is null ? -1 : 1;
        }

        int i = 0, j = 0;
        while (i < x.Length && j < y.Length)
        {
            if (char.IsAsciiDigit(x[i]) && char.IsAsciiDigit(y[j]))
            {
                var (a, nextI) = DigitRun(x, i);
                var (b, nextJ) = DigitRun(y, j);
                var byValue = CompareDigits(a, b);
                if (byValue != 0)
                {
                    return byValue;
                }

                i = nextI;
                j = nextJ;
                continue;
            }

            var byChar = x[i].CompareTo(y[j]);
            if (byChar != 0)
            {
                return byChar;
            }

            i++;
            j++;
        }

        var byLength = (x.Length - i).CompareTo(y.Length - j);
        // Equal under the rule ("B-01" and "B-1"): fall back to ordinal so the order stays total and stable.
        return byLength != 0 ? byLength : string.CompareOrdinal(x, y);
    }

    private static (ReadOnlyMemory<char> Digits, int Next) DigitRun(string s, int start)
    {
        var end = start;
        while (end < s.Length && char.IsAsciiDigit(s[end]))
        {
            end++;
        }

        var first = start;
        while (first < end - 1 && s[first] == '0')
        {
            first++;
        }

        return (s.AsMemory(first, end - first), end);
    }

    // Digit runs of any length (batch numbers can be long): compare by length first, then digit by digit.
    private static int CompareDigits(ReadOnlyMemory<char> a, ReadOnlyMemory<char> b) =>
        a.Length != b.Length ? a.Length.CompareTo(b.Length) : a.Span.SequenceCompareTo(b.Span);
}
