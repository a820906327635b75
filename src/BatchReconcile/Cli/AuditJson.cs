using System.Text.Json;
using BatchReconcile.Storage.Audit;

namespace BatchReconcile.Cli;

/// <summary>An audit entry as <c>audit list --json</c>, <c>audit show --json</c> and <c>flags show --json</c> print it; <c>detail</c> is the stored JSON.</summary>
public sealed record AuditJson(
    long Id, string At, string Actor, string Kind, string Subject, string? FromState, string? ToState, string? Note, string? DeviationRef,
    JsonElement Detail, string PrevHash, string Hash)
{
    public static AuditJson From(AuditEntry e) => new(
        e.Id, e.At, e.Actor, e.Kind, e.Subject, e.FromState, e.ToState, e.Note, e.DeviationRef, Parse(e.Detail), e.PreviousHash, e.Hash);

    /// <summary>One line of an entry: id, time, kind, subject, actor and, for a review, the states and note.</summary>
    public static string Line(AuditEntry e)
    {
        var states = e.FromState is null && e.ToState is null ? string.Empty : $": {e.FromState ?? "-"} -> {e.ToState ?? "-"}";
        var note = e.Note is null ? string.Empty : $" \"{Records.SafeText.Escape(e.Note)}\"";
        var deviation = e.DeviationRef is null ? string.Empty : $" (deviation {Records.SafeText.Escape(e.DeviationRef)})";
        return $"#{e.Id.ToString(System.Globalization.CultureInfo.InvariantCulture)} {Short(e.At)} {Records.SafeText.Escape(e.Kind)} {Records.SafeText.Escape(e.Subject)} by {Records.SafeText.Escape(e.Actor)}{states}{note}{deviation}";
    }

    /// <summary>The stored time to the second: 2026-11-24T07:30:05Z.</summary>
    public static string Short(string at) => at.Length >= 19 ? at[..19] + "Z" : at;

    // Details are written by the program as JSON; one that is not (a row edited by hand) is shown as its text.
    private static JsonElement Parse(string detail)
    {
        try
        {
            using var document = JsonDocument.Parse(detail);
            return document.RootElement.Clone();
        }
        catch (JsonException)
        {
            return JsonSerializer.SerializeToElement(detail);
        }
    }
}
