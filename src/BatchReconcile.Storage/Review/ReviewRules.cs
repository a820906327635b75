using BatchReconcile.Reconciliation.Flags;
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
