using static System.FormattableString;

namespace BatchReconcile.Records.Exports.Reading;

/// <summary>The errors of one file, capped so a file of garbage cannot exhaust memory; the ones
/// past the cap are counted and summarised in one last entry.</summary>
internal sealed class ExportErrorList(string fileName, int cap)
{
    private readonly List<ExportError> _errors = [];
    private int _notListed;

    public string FileName { get; } = fileName;

    /// <summary>Every error found, listed or not.</summary>
    public int Count => _errors.Count + _notListed;

    public void Add(long line, string column, string value, string reason)
    {
        if (_errors.Count >= cap)
        {
            _notListed++;
            return;
        }

        var lineNumber = (int)Math.Clamp(line, 0, int.MaxValue);
        // A value is quoted by its first characters only: a huge field must not be copied into the
        // report, the database and the log. The reason is the program's own text (it quotes at most a
        // capped field), cut as well in case a value reached it.
        _errors.Add(new ExportError(FileName, lineNumber, column,
            SafeText.Prefix(value, ExportLimits.QuotedValueChars), SafeText.Prefix(reason, 4 * ExportLimits.MaxFieldChars)));
    }

    /// <summary>In file order (a batch's closing checks find errors after later lines were read).</summary>
    public IReadOnlyList<ExportError> ToList()
    {
        var list = _errors.OrderBy(e => e.Line).ToList();
        if (_notListed > 0)
        {
            list.Add(new ExportError(FileName, 0, "", "", Invariant($"... and {_notListed} more problems not listed (only the first {cap} are)")));
        }

        return list;
    }
}
