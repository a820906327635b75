using BatchReconcile.Reconciliation.Flags;
using System.Text;
using BatchReconcile.Records;
namespace BatchReconcile.Storage.Review;

/// <summary>Which review changes are allowed, and the checks on what a reviewer types.</summary>
public static class ReviewRules
{
    public const int MaxNameLength = 200;
    public const int MaxNoteLength = 4000;
    public const int MaxDeviationRefLength = 200;

    /// <summary>
    /// open → in-review, open → closed, in-review → closed, closed → in-review (reopening). Nothing
    /// goes back to open: once someone has looked at a flag, the trail says so.
    /// </summary>
    public static bool IsAllowed(ReviewState from, ReviewState to) =>
        (from, to) is (ReviewState.Open, ReviewState.InReview)
            or (ReviewState.Open, ReviewState.Closed)
            or (ReviewState.InReview, ReviewState.Closed)
            or (ReviewState.Closed, ReviewState.InReview);

    /// <summary>The states a flag may move to from <paramref name="from"/>.</summary>
    public static IReadOnlyList<ReviewState> Next(ReviewState from) =>
        Enum.GetValues<ReviewState>().Where(to => IsAllowed(from, to)).ToList();

    /// <summary>
    /// Look-alikes of Latin letters, mapped to the letter before a name is compared with a reserved word.
    /// A small, hand-made table (from memory, after the "confusables" data of Unicode UTS #39): the
    /// Cyrillic and Greek letters that look like Latin ones, and the Latin small capitals of the letters of
    /// "system". It is NOT complete: it is a stop-gap against the obvious spoofs until reviewers have real
    /// identities, not a security boundary.
    /// </summary>
    private static readonly Dictionary<char, char> LookAlikes = new()
    {
        // Cyrillic
        ['\u0430'] = 'a', ['\u0410'] = 'A', ['\u0412'] = 'B', ['\u0441'] = 'c', ['\u0421'] = 'C',
        ['\u0501'] = 'd', ['\u0435'] = 'e', ['\u0415'] = 'E', ['\u04BD'] = 'e', ['\u041D'] = 'H', ['\u04BB'] = 'h',
        ['\u0456'] = 'i', ['\u0406'] = 'I', ['\u0458'] = 'j', ['\u0408'] = 'J', ['\u041A'] = 'K', ['\u041C'] = 'M',
        ['\u043E'] = 'o', ['\u041E'] = 'O', ['\u0440'] = 'p', ['\u0420'] = 'P', ['\u051B'] = 'q', ['\u0455'] = 's',
        ['\u0405'] = 'S', ['\u0422'] = 'T', ['\u051D'] = 'w', ['\u0445'] = 'x', ['\u0425'] = 'X', ['\u0443'] = 'y',
        ['\u0423'] = 'Y', ['\u04AF'] = 'y', ['\u04AE'] = 'Y',

        // Greek
        ['\u0391'] = 'A', ['\u03B1'] = 'a', ['\u0392'] = 'B', ['\u0395'] = 'E', ['\u0396'] = 'Z', ['\u0397'] = 'H',
        ['\u0399'] = 'I', ['\u03B9'] = 'i', ['\u039A'] = 'K', ['\u039C'] = 'M', ['\u039D'] = 'N', ['\u03BD'] = 'v',
        ['\u039F'] = 'O', ['\u03BF'] = 'o', ['\u03A1'] = 'P', ['\u03C1'] = 'p', ['\u03A4'] = 'T', ['\u03A5'] = 'Y',
        ['\u03B3'] = 'y', ['\u03A7'] = 'X',

        // Latin small capitals
        ['\uA731'] = 's', ['\u028F'] = 'y', ['\u1D1B'] = 't', ['\u1D07'] = 'e', ['\u1D0D'] = 'm',
    };

    /// <summary>
    /// Whether <paramref name="name"/> is, or looks like, the name the program uses for its own audit
    /// entries: compared after NFKC (full-width, mathematical and circled letters fold to plain ones; see
    /// <see cref="CompatibilityLatin"/>), without
    /// invisible format characters (zero-width spaces, soft hyphens, bidirectional marks: Unicode category
    /// Cf), with the look-alikes above mapped to Latin, and without case.
    /// </summary>
    public static bool IsReservedName(string name, string reserved)
    {
        ArgumentNullException.ThrowIfNull(name);
        return string.Equals(Skeleton(name), Skeleton(reserved), StringComparison.Ordinal);
    }

    /// <summary>The form in which names are compared with a reserved word (see <see cref="IsReservedName"/>).</summary>
    internal static string Skeleton(string name)
    {
        var folded = name.Normalize(System.Text.NormalizationForm.FormKC);
        var skeleton = new System.Text.StringBuilder(folded.Length);
        foreach (var rune in folded.EnumerateRunes())
        {
            if (Rune.GetUnicodeCategory(rune) == System.Globalization.UnicodeCategory.Format)
            {
                continue;
            }

            if (CompatibilityLatin(rune.Value) is { } letter)
            {
                skeleton.Append(letter);
            }
            else if (rune.IsBmp && LookAlikes.TryGetValue((char)rune.Value, out var latin))
            {
                skeleton.Append(latin);
            }
            else
            {
                skeleton.Append(rune.ToString());
            }
        }

        return skeleton.ToString().Trim().ToLowerInvariant();
    }

    /// <summary>
    /// The NFKC folding of the compatibility forms of Latin letters, done here because the program runs
    /// with invariant globalization, where <see cref="string.Normalize(System.Text.NormalizationForm)"/>
    /// leaves non-ASCII text as it is: full-width forms (U+FF01 to U+FF5E), the mathematical alphanumeric
    /// letters (U+1D400 to U+1D6A3, thirteen alphabets of 52 letters A-Z a-z) and the circled letters
    /// (U+24B6 to U+24E9). Code points from the Unicode Standard's code charts.
    /// </summary>
    private static char? CompatibilityLatin(int cp) => cp switch
    {
        >= 0xFF01 and <= 0xFF5E => (char)(cp - 0xFEE0),
        >= 0x1D400 and <= 0x1D6A3 => (cp - 0x1D400) % 52 is var i && i < 26 ? (char)('A' + i) : (char)('a' + i - 26),
        >= 0x24B6 and <= 0x24CF => (char)('A' + cp - 0x24B6),
        >= 0x24D0 and <= 0x24E9 => (char)('a' + cp - 0x24D0),
        _ => null,
    };

    /// <summary>
    /// Null when the text may be stored, else where it goes wrong. Control characters are refused
    /// (line breaks and tabs only in notes) so that what a reviewer typed prints as it was meant.
    /// </summary>
    internal static string? CheckText(string what, string text, int maxLength, bool multiLine)
    {
        if (text.Length > maxLength)
        {
            return $"the {what} is {text.Length} characters long; at most {maxLength} are kept";
        }

        for (var i = 0; i < text.Length; i++)
        {
            var c = text[i];
            if (char.IsControl(c) && !(multiLine && c is '\n' or '\t' or '\r'))
            {
                return $"the {what} has a control character (U+{(int)c:X4}) at position {i + 1}";
            }

            if (SafeText.IsRefused(c) && !char.IsControl(c))
            {
                // The bidirectional controls: printed raw they reverse what follows them.
                return $"the {what} has a bidirectional control character (U+{(int)c:X4}) at position {i + 1}";
            }

            if (char.IsSurrogate(c) && !(i + 1 < text.Length && char.IsSurrogatePair(c, text[i + 1])))
            {
                return $"the {what} has a broken character (an unpaired surrogate) at position {i + 1}";
            }

            if (char.IsHighSurrogate(c))
            {
                i++;
            }
        }

        return null;
    }
}
