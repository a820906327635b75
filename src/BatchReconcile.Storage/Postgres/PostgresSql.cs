using System.Collections;
using System.Collections.Concurrent;
using System.Data.Common;
using System.Globalization;
using System.Text;
using System.Text.RegularExpressions;

namespace BatchReconcile.Storage;

/// <summary>What the store's SQL needs to run on PostgreSQL as written for SQLite.</summary>
internal static partial class PostgresSql
{
    private static readonly ConcurrentDictionary<string, string> Rewritten = new(StringComparer.Ordinal);

    /// <summary>
    /// The statement with SQLite's <c>$name</c> parameters written as Npgsql's <c>@name</c>. Text in single
    /// quotes (a JSON path such as <c>'$.a'</c>), double-quoted names and comments are left as they are.
    /// </summary>
    public static string Parameters(string sql)
    {
        ArgumentNullException.ThrowIfNull(sql);
        return Rewritten.GetOrAdd(sql, static text =>
        {
            var result = new StringBuilder(text.Length);
            var quote = '\0';
            for (var i = 0; i < text.Length; i++)
            {
                var c = text[i];
                if (quote != '\0')
                {
                    result.Append(c);
                    if (c == quote)
                    {
                        quote = '\0';
                    }
                    else if (quote == '\n' && c == '\n')
                    {
                        quote = '\0';
                    }

                    continue;
                }

                if (c is '\'' or '"')
                {
                    quote = c;
                }
                else if (c == '-' && i + 1 < text.Length && text[i + 1] == '-')
                {
                    quote = '\n';
                }
                else if (c == '$' && i + 1 < text.Length && (char.IsAsciiLetter(text[i + 1]) || text[i + 1] == '_'))
                {
                    result.Append('@');
                    continue;
                }

                result.Append(c);
            }

            return NullsAsSqlite(IndexHint().Replace(result.ToString(), string.Empty));
        });
    }

    /// <summary>
    /// Every ORDER BY term with SQLite's place for NULL (smallest: first ascending, last descending), which
    /// PostgreSQL reverses unless told; a term that already says NULLS FIRST/LAST is left alone.
    /// </summary>
    public static string NullsAsSqlite(string sql)
    {
        var result = new StringBuilder(sql.Length + 32);
        var i = 0;
        while (i < sql.Length)
        {
            var at = OrderBy().Match(sql, i);
            if (!at.Success)
            {
                result.Append(sql, i, sql.Length - i);
                break;
            }

            result.Append(sql, i, at.Index + at.Length - i);
            i = at.Index + at.Length;
            var term = new StringBuilder();
            var depth = 0;
            var quote = '\0';
            while (i < sql.Length)
            {
                var c = sql[i];
                if (quote != '\0')
                {
                    term.Append(c);
                    quote = c == quote ? '\0' : quote;
                    i++;
                    continue;
                }

                if (c is '\'' or '"')
                {
                    quote = c;
                }
                else if (c == '(')
                {
                    depth++;
                }
                else if (c == ')' && depth-- == 0)
                {
                    break;
                }
                else if (depth == 0 && (c is ',' or ';' || (char.IsWhiteSpace(c) && ClauseEnd().IsMatch(sql.AsSpan(i)))))
                {
                    if (c != ',')
                    {
                        break;
                    }

                    result.Append(WithNulls(term.ToString())).Append(',');
                    term.Clear();
                    i++;
                    continue;
                }

                term.Append(c);
                i++;
            }

            result.Append(WithNulls(term.ToString()));
        }

        return result.ToString();
    }

    private static string WithNulls(string term)
    {
        var trimmed = term.TrimEnd();
        var trailing = term[trimmed.Length..];
        if (trimmed.Length == 0 || trimmed.Contains(" NULLS ", StringComparison.OrdinalIgnoreCase))
        {
            return term;
        }

        var descending = trimmed.EndsWith(" DESC", StringComparison.OrdinalIgnoreCase);
        return trimmed + (descending ? " NULLS LAST" : " NULLS FIRST") + trailing;
    }

    [GeneratedRegex(@"\bORDER\s+BY\b", RegexOptions.IgnoreCase | RegexOptions.CultureInvariant)]
    private static partial Regex OrderBy();

    [GeneratedRegex(@"^\s*\b(LIMIT|OFFSET|UNION|EXCEPT|INTERSECT|FOR)\b", RegexOptions.IgnoreCase | RegexOptions.CultureInvariant)]
    private static partial Regex ClauseEnd();

    // SQLite's INDEXED BY names the index a query must use; PostgreSQL has no such clause (its planner chooses).
    [GeneratedRegex(@"\s+INDEXED\s+BY\s+\w+", RegexOptions.IgnoreCase | RegexOptions.CultureInvariant)]
    private static partial Regex IndexHint();
}

/// <summary>
/// Npgsql's reader with SQLite's leniency about number types: the query code reads whole numbers with
/// <see cref="GetInt32"/> or <see cref="GetInt64"/> and sums with <see cref="GetDouble"/> whatever width
/// PostgreSQL gives them (bigint, numeric of a SUM), as Microsoft.Data.Sqlite does.
/// </summary>
internal sealed class LenientReader(DbDataReader inner) : DbDataReader
{
    public override object this[int ordinal] => GetValue(ordinal);

    public override object this[string name] => inner[name];

    public override int Depth => inner.Depth;

    public override int FieldCount => inner.FieldCount;

    public override bool HasRows => inner.HasRows;

    public override bool IsClosed => inner.IsClosed;

    public override int RecordsAffected => inner.RecordsAffected;

    public override bool GetBoolean(int ordinal) => inner.GetValue(ordinal) switch
    {
        bool b => b,
        var v => Convert.ToInt64(v, CultureInfo.InvariantCulture) != 0,
    };

    public override byte GetByte(int ordinal) => Convert.ToByte(inner.GetValue(ordinal), CultureInfo.InvariantCulture);

    public override long GetBytes(int ordinal, long dataOffset, byte[]? buffer, int bufferOffset, int length) =>
        inner.GetBytes(ordinal, dataOffset, buffer, bufferOffset, length);

    public override char GetChar(int ordinal) => inner.GetChar(ordinal);

    public override long GetChars(int ordinal, long dataOffset, char[]? buffer, int bufferOffset, int length) =>
        inner.GetChars(ordinal, dataOffset, buffer, bufferOffset, length);

    public override string GetDataTypeName(int ordinal) => inner.GetDataTypeName(ordinal);

    public override DateTime GetDateTime(int ordinal) => inner.GetDateTime(ordinal);

    public override decimal GetDecimal(int ordinal) => Convert.ToDecimal(inner.GetValue(ordinal), CultureInfo.InvariantCulture);

    public override double GetDouble(int ordinal) => Convert.ToDouble(inner.GetValue(ordinal), CultureInfo.InvariantCulture);

    public override IEnumerator GetEnumerator() => inner.GetEnumerator();

    public override Type GetFieldType(int ordinal) => inner.GetFieldType(ordinal);

    public override float GetFloat(int ordinal) => Convert.ToSingle(inner.GetValue(ordinal), CultureInfo.InvariantCulture);

    public override Guid GetGuid(int ordinal) => inner.GetGuid(ordinal);

    public override short GetInt16(int ordinal) => Convert.ToInt16(inner.GetValue(ordinal), CultureInfo.InvariantCulture);

    public override int GetInt32(int ordinal) => Convert.ToInt32(inner.GetValue(ordinal), CultureInfo.InvariantCulture);

    public override long GetInt64(int ordinal) => Convert.ToInt64(inner.GetValue(ordinal), CultureInfo.InvariantCulture);

    public override string GetName(int ordinal) => inner.GetName(ordinal);

    public override int GetOrdinal(string name) => inner.GetOrdinal(name);

    public override string GetString(int ordinal) => inner.GetValue(ordinal) switch
    {
        string s => s,
        var v => Convert.ToString(v, CultureInfo.InvariantCulture) ?? string.Empty,
    };

    public override object GetValue(int ordinal) => inner.GetValue(ordinal);

    public override int GetValues(object[] values) => inner.GetValues(values);

    public override bool IsDBNull(int ordinal) => inner.IsDBNull(ordinal);

    public override bool NextResult() => inner.NextResult();

    public override bool Read() => inner.Read();

    public override T GetFieldValue<T>(int ordinal)
    {
        if (typeof(T) == typeof(long))
        {
            return (T)(object)GetInt64(ordinal);
        }

        if (typeof(T) == typeof(int))
        {
            return (T)(object)GetInt32(ordinal);
        }

        if (typeof(T) == typeof(double))
        {
            return (T)(object)GetDouble(ordinal);
        }

        return inner.GetFieldValue<T>(ordinal);
    }

    public override Stream GetStream(int ordinal) => inner.GetStream(ordinal);

    public override TextReader GetTextReader(int ordinal) => inner.GetTextReader(ordinal);

    protected override void Dispose(bool disposing)
    {
        if (disposing)
        {
            inner.Dispose();
        }

        base.Dispose(disposing);
    }
}
