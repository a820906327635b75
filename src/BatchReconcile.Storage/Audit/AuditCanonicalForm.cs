using System.Globalization;
using System.Security.Cryptography;
using System.Text;

namespace BatchReconcile.Storage.Audit;

/// <summary>
/// The canonical content of an audit entry, which its hash covers: a JSON object serialised by
/// the JSON Canonicalization Scheme (RFC 8785), so that anyone can recompute a hash with a JCS
/// library. Members in code-unit order: actor, at, detail, deviationRef, from, id, kind, note,
/// prev, subject, to. Strings are escaped as JCS requires (only <c>"</c>, <c>\</c> and control
/// characters; <c>\b \t \n \f \r</c> short, the others as <c>\u00xx</c>); an absent value is
/// <c>null</c>; <c>id</c> is a plain integer; <c>at</c> and <c>detail</c> are the stored texts.
/// The hash is SHA-256 of the UTF-8 bytes, in lower-case hex.
/// </summary>
public static class AuditCanonicalForm
{
    /// <summary>The previous hash of the first entry.</summary>
    public static readonly string GenesisHash = new('0', 64);

    /// <summary>The member names in the order they are written (RFC 8785 sorts by UTF-16 code units).</summary>
    public static IReadOnlyList<string> MemberOrder { get; } =
        ["actor", "at", "detail", "deviationRef", "from", "id", "kind", "note", "prev", "subject", "to"];

    public static string Text(AuditEntry entry)
    {
        ArgumentNullException.ThrowIfNull(entry);
        var text = new StringBuilder(256 + entry.Detail.Length);
        text.Append('{');
        Member(text, "actor", entry.Actor, first: true);
        Member(text, "at", entry.At);
        Member(text, "detail", entry.Detail);
        Member(text, "deviationRef", entry.DeviationRef);
        Member(text, "from", entry.FromState);
        text.Append(",\"id\":").Append(entry.Id.ToString(CultureInfo.InvariantCulture));
        Member(text, "kind", entry.Kind);
        Member(text, "note", entry.Note);
        Member(text, "prev", entry.PreviousHash);
        Member(text, "subject", entry.Subject);
        Member(text, "to", entry.ToState);
        text.Append('}');
        return text.ToString();
    }

    /// <summary>SHA-256 of <see cref="Text"/> (the entry's own <see cref="AuditEntry.Hash"/> is not part of it).</summary>
    public static string Hash(AuditEntry entry) =>
        Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(Text(entry))));

    private static void Member(StringBuilder text, string name, string? value, bool first = false)
    {
        if (!first)
        {
            text.Append(',');
        }

        text.Append('"').Append(name).Append("\":");
        if (value is null)
        {
            text.Append("null");
            return;
        }

        text.Append('"');
        foreach (var c in value)
        {
            switch (c)
            {
                case '"': text.Append("\\\""); break;
                case '\\': text.Append("\\\\"); break;
                case '\b': text.Append("\\b"); break;
                case '\t': text.Append("\\t"); break;
                case '\n': text.Append("\\n"); break;
                case '\f': text.Append("\\f"); break;
                case '\r': text.Append("\\r"); break;
                case < ' ':
                    text.Append("\\u").Append(((int)c).ToString("x4", CultureInfo.InvariantCulture));
                    break;
                default: text.Append(c); break;
            }
        }

        text.Append('"');
    }
}
