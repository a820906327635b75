namespace BatchReconcile.Records.Exports.Reading;

/// <summary>The size limits of an export (docs/export-format.md, "Limits"). A file past one is refused
/// with the line where it was found; no message quotes more than <see cref="QuotedValueChars"/> characters
/// of a value.</summary>
public static class ExportLimits
{
    /// <summary>Characters (UTF-16 code units) per field, header names included.</summary>
    public const int MaxFieldChars = 1000;

    /// <summary>Bytes per line, and per row (a row with quoted line breaks spans several lines).</summary>
    public const int MaxLineBytes = 1 << 20;

    /// <summary>
    /// The largest mass one row may record, in kg after unit conversion: 1,000 t. A row is one charge,
    /// one weighing or one transfer of one batch; batch vessels in fine and speciality chemical
    /// manufacture hold at most some tens of cubic metres (common practice), so a row of more than
    /// 1,000 t is a keying or export error, and the bound keeps every sum the reconciliation forms far
    /// from overflow.
    /// </summary>
    public const double MaxRowKilograms = 1e6;

    /// <summary>Characters of a value that an error message quotes before it is cut ("...").</summary>
    public const int QuotedValueChars = 80;
}
