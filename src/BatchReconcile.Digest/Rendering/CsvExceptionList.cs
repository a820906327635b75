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
/// a negative gap stays a number. measured and limit are rounded as the page shows them (0.1 for %, 0.01 or 0.1 for kg,
/// 0.01 for equivalents; <see cref="DigestText.Rounded"/>) and written in their shortest form, so a spreadsheet shows
/// the figures the reviewer read (76.5, never 76.54999999999995). The full values are in the store (<c>flags list --json</c>).
/// review_state is the state (and outcome); deviation_ref and reviewed_by say which deviation and who decided.
/// The CSV has no header note for a rewritten digest: it is a table, and every line stays a record; the HTML and
/// Markdown of the same issue say what it replaces.
/// </remarks>
public static class CsvExceptionList
{
    public static IReadOnlyList<string> Columns { get; } =
    [
        "flag_id", "severity", "batch", "revision", "recipe", "step", "code", "subject", "measured", "limit", "unit", "message", "review_state",
        "deviation_ref", "reviewed_by",
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
                csv.WriteField(DigestText.Rounded(e.Measured, e.Unit), default);
                csv.WriteField(DigestText.Rounded(e.Limit, e.Unit), default);
                csv.WriteField(e.Unit);
                csv.WriteField(e.Message);
                csv.WriteField(e.Review.ToText());
                csv.WriteField(e.Review.DeviationRef);
                csv.WriteField(e.Review.By);
                csv.EndRecord();
            }

            csv.Flush();
        }

        return text.ToString();
    }
}
