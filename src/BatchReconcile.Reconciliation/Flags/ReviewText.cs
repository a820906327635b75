using BatchReconcile.Reconciliation.Flags;
using System.Diagnostics.CodeAnalysis;

namespace BatchReconcile.Reconciliation.Flags;

/// <summary>The text forms of review states and close outcomes, as stored, printed and typed on the command line.</summary>
public static class ReviewText
{
    public static string ToText(this ReviewState state) => state switch
    {
        ReviewState.Open => "open",
        ReviewState.InReview => "in-review",
        ReviewState.Closed => "closed",
        _ => throw new ArgumentOutOfRangeException(nameof(state), state, null),
    };

    public static string ToText(this CloseOutcome outcome) => outcome switch
    {
        CloseOutcome.Explained => "explained",
        CloseOutcome.Deviation => "deviation",
        CloseOutcome.Corrected => "corrected",
        CloseOutcome.Superseded => "superseded",
        _ => throw new ArgumentOutOfRangeException(nameof(outcome), outcome, null),
    };

    public static bool TryParseState(string? text, [NotNullWhen(true)] out ReviewState? state)
    {
        state = text switch
        {
            "open" => ReviewState.Open,
            "in-review" => ReviewState.InReview,
            "closed" => ReviewState.Closed,
            _ => null,
        };
        return state is not null;
    }

    public static bool TryParseOutcome(string? text, [NotNullWhen(true)] out CloseOutcome? outcome)
    {
        outcome = text switch
        {
            "explained" => CloseOutcome.Explained,
            "deviation" => CloseOutcome.Deviation,
            "corrected" => CloseOutcome.Corrected,
            "superseded" => CloseOutcome.Superseded,
            _ => null,
        };
        return outcome is not null;
    }

    public static ReviewState ParseStoredState(string text) =>
        TryParseState(text, out var state) ? state.Value : throw new InvalidDataException($"Unknown review state '{text}' in the database.");

    public static CloseOutcome? ParseStoredOutcome(string? text) =>
        text is null ? null
        : TryParseOutcome(text, out var outcome) ? outcome
        : throw new InvalidDataException($"Unknown close outcome '{text}' in the database.");
}
