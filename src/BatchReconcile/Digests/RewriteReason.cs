using System.Globalization;
using BatchReconcile.Storage.Digests;

namespace BatchReconcile.Digests;

/// <summary>Why a day's digest is written again, in plain words, from what was stored since the issue it replaces.</summary>
public static class RewriteReason
{
    /// <summary>
    /// "2 batches arrived and 1 review decision was recorded since that issue"; with a person's request,
    /// "rewritten at the request of A. Chen" (and the changes, when there are any).
    /// </summary>
    public static string Of(DayChanges since, string by)
    {
        ArgumentNullException.ThrowIfNull(since);
        ArgumentException.ThrowIfNullOrWhiteSpace(by);
        var parts = new List<string>();
        if (since.Batches > 0)
        {
            parts.Add(Count(since.Batches, "batch", "batches") + " arrived");
        }

        if (since.Revisions > 0)
        {
            parts.Add(Count(since.Revisions, "re-exported revision", "re-exported revisions") + " " + (since.Revisions == 1 ? "was" : "were") + " stored");
        }

        if (since.Withdrawn > 0)
        {
            parts.Add(Count(since.Withdrawn, "batch", "batches") + " moved to another production day by a later revision");
        }

        if (since.Reviews > 0)
        {
            parts.Add(Count(since.Reviews, "review decision", "review decisions") + " " + (since.Reviews == 1 ? "was" : "were") + " recorded");
        }

        var changes = parts.Count switch
        {
            0 => null,
            1 => parts[0] + " since that issue",
            _ => string.Join(", ", parts[..^1]) + " and " + parts[^1] + " since that issue",
        };
        var asked = by == DigestService.By ? null : "rewritten at the request of " + by;
        return (asked, changes) switch
        {
            (null, null) => "rewritten by the service; nothing was stored for the day since that issue",
            (null, { } c) => c,
            ({ } a, null) => a + "; nothing was stored for the day since that issue",
            ({ } a, { } c) => a + "; " + c,
        };
    }

    private static string Count(int n, string one, string many) =>
        n.ToString(CultureInfo.InvariantCulture) + " " + (n == 1 ? one : many);
}
