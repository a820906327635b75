using System.Globalization;
using BatchReconcile.Digest.Model;
using BatchReconcile.Records.Definitions;
using CsvHelper;

namespace BatchReconcile.Digest.Rendering;

/// <summary>
/// The day's exception list as CSV for a spreadsheet (RFC 4180, CRLF, UTF-8, header row), in the digest's order.
/// </summary>
/// <remarks>
/// A text cell that starts with = + - @, a tab or a carriage return gets a leading apostrophe (CsvHelper's
/// injection escape), so a spreadsheet shows it as text instead of running it as a formula. The number
/// columns (flag_id, revision, measured, limit) are written as invariant-culture numbers and are left alone, so
/// a negative gap stays a number. Numbers are written in full (shortest round-trip form), not rounded as in the
/// page: the CSV is for further calculation.
/// </remarks>
public static class CsvExceptionList
{
    public static IReadOnlyList<string> Columns { get; } =
    [
        "flag_id", "severity", "batch", "revision", "recipe", "step", "code", "subject", "measured", "limit", "unit", "message", "review_state",
    ];

    public static CsvWriterOptions Options { get; } = CsvWriterOptions.Default with
    {
        Injection = CsvInjection.Escape,
        FormatProvider = CultureInfo.InvariantCulture,
    };

    public static string Render(DigestData data)
    {
        ArgumentNullException.ThrowIfNull(data);
        using var text = new StringWriter(CultureInfo.InvariantCulture);
        using (var csv = CsvWriter.Create(text, Options, leaveOpen: true))
        {
            csv.WriteHeader([.. Columns]);
            foreach (var e in ExceptionOrder.Sort(data.Exceptions))
            {
                csv.WriteField(e.FlagId, default);
                csv.WriteField(e.Severity.ToText());
                csv.WriteField(e.BatchId);
                csv.WriteField(e.Revision, default);
                csv.WriteField(e.Recipe);
                csv.WriteField(e.Step);
                csv.WriteField(e.Code.ToText());
                csv.WriteField(e.Subject);
                csv.WriteField(e.Measured, default);
                csv.WriteField(e.Limit, default);
                csv.WriteField(e.Unit);
                csv.WriteField(e.Message);
                csv.WriteField(e.Review.ToText());
                csv.EndRecord();
            }

            csv.Flush();
        }

        return text.ToString();
    }
}
