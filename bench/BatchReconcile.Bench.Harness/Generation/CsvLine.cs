using System.Text;

namespace BatchReconcile.Bench.Harness.Generation;

/// <summary>Splits and writes single CSV lines (RFC 4180 quoting) for the templates and the generated rows.</summary>
internal static class CsvLine
{
    public static List<string> Split(string line)
    {
        var fields = new List<string>();
        var field = new StringBuilder();
        var quoted = false;
        for (var i = 0; i < line.Length; i++)
        {
            var c = line[i];
            if (quoted)
            {
                if (c == '"' && i + 1 < line.Length && line[i + 1] == '"') { field.Append('"'); i++; }
                else if (c == '"') { quoted = false; }
                else { field.Append(c); }
            }
            else if (c == '"') { quoted = true; }
            else if (c == ',') { fields.Add(field.ToString()); field.Clear(); }
            else { field.Append(c); }
        }

        fields.Add(field.ToString());
        return fields;
    }

    public static string Quote(string value) =>
        value.Contains(',', StringComparison.Ordinal) || value.Contains('"', StringComparison.Ordinal)
            ? "\"" + value.Replace("\"", "\"\"", StringComparison.Ordinal) + "\""
            : value;
}
