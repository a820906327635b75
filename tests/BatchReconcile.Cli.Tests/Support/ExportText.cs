using System.Text;

namespace BatchReconcile.Cli.Tests.Support;

/// <summary>
/// An export file's text, line by line, for making test files from the sample exports: rename a
/// batch, change one field, join batches into one file. Immutable; every edit returns a new value.
/// Only for files whose fields hold no quoted commas (the edits split lines on ',').
/// </summary>
public sealed class ExportText
{
    private static readonly UTF8Encoding Utf8NoBom = new(encoderShouldEmitUTF8Identifier: false);
    private readonly string[] _lines;
    private readonly string _newline;

    private ExportText(string[] lines, string newline)
    {
        _lines = lines;
        _newline = newline;
    }

    /// <summary>A file of sample-data/inbox/ as it is in the repository.</summary>
    public static ExportText FromSample(string fileName)
    {
        var text = File.ReadAllText(Path.Combine(RepoPaths.Root, "sample-data", "inbox", fileName), Encoding.UTF8);
        var newline = text.Contains("\r\n", StringComparison.Ordinal) ? "\r\n" : "\n";
        var lines = text.Split(newline);
        // The last line ends with a line end, which leaves one empty string behind.
        return new ExportText(lines[^1].Length == 0 ? lines[..^1] : lines, newline);
    }

    /// <summary>Line 1 is the header, as in the program's error messages.</summary>
    public string Line(int line) => _lines[line - 1];

    public int LineCount => _lines.Length;

    public int DataRowCount => _lines.Length - 1;

    /// <summary>The distinct values of the batch column, in file order.</summary>
    public IReadOnlyList<string> BatchIds => _lines.Skip(1).Select(l => l.Split(',')[Index("batch")]).Distinct(StringComparer.Ordinal).ToList();

    public string Text => string.Join(_newline, _lines) + _newline;

    public byte[] Bytes => Utf8NoBom.GetBytes(Text);

    /// <summary>Every occurrence of one batch id replaced by another (in the batch column only).</summary>
    public ExportText WithBatchId(string newId)
    {
        var ids = BatchIds;
        if (ids.Count != 1)
        {
            throw new InvalidOperationException($"WithBatchId needs a one-batch file; this one has {ids.Count}");
        }

        var column = Index("batch");
        return new ExportText([_lines[0], .. _lines.Skip(1).Select(l => SetField(l, column, newId))], _newline);
    }

    /// <summary>The field of <paramref name="column"/> on file line <paramref name="line"/> set to <paramref name="raw"/>, written as is (quotes included).</summary>
    public ExportText WithField(int line, string column, string raw)
    {
        if (line < 2 || line > _lines.Length)
        {
            throw new ArgumentOutOfRangeException(nameof(line), line, $"data lines are 2..{_lines.Length}");
        }

        var lines = (string[])_lines.Clone();
        lines[line - 1] = SetField(lines[line - 1], Index(column), raw);
        return new ExportText(lines, _newline);
    }

    /// <summary>The same rows with another delimiter (the file has no quoted fields).</summary>
    public ExportText WithDelimiter(char delimiter) =>
        new(_lines.Select(l => l.Replace(',', delimiter)).ToArray(), _newline);

    /// <summary>This file's rows followed by the data rows of <paramref name="other"/> (same header required).</summary>
    public ExportText Then(ExportText other)
    {
        if (other._lines[0] != _lines[0])
        {
            throw new InvalidOperationException("the two files have different headers");
        }

        return new ExportText([.. _lines, .. other._lines.Skip(1)], _newline);
    }

    /// <summary>File lines (1-based) of the rows of one batch.</summary>
    public IReadOnlyList<int> LinesOf(string batchId)
    {
        var column = Index("batch");
        return Enumerable.Range(2, _lines.Length - 1).Where(n => _lines[n - 1].Split(',')[column] == batchId).ToList();
    }

    public void WriteTo(string path) => File.WriteAllBytes(path, Bytes);

    private int Index(string column)
    {
        var index = Array.FindIndex(_lines[0].Split(','), h => string.Equals(h.Trim(), column, StringComparison.OrdinalIgnoreCase));
        return index >= 0 ? index : throw new ArgumentException($"no column '{column}' in the header", nameof(column));
    }

    private static string SetField(string line, int index, string raw)
    {
        if (line.Contains('"', StringComparison.Ordinal))
        {
            throw new InvalidOperationException($"line has quoted fields, which this helper does not split: {line}");
        }

        var fields = line.Split(',');
        fields[index] = raw;
        return string.Join(',', fields);
    }
}
