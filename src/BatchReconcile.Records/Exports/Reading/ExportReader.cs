using BatchReconcile.Records.Definitions;
using CsvHelper;

namespace BatchReconcile.Records.Exports.Reading;

/// <summary>Reads a batch-record export (CSV) and checks it against the contract and the process
/// definitions. A file is accepted whole or rejected with every problem found, never only the first.</summary>
/// <remarks>
/// Choices where the contract leaves room (the users' documentation of the format should say them):
/// <list type="bullet">
/// <item>Numbers: optional sign, digits, '.'; no exponent notation (1.5e3 is refused, so is 1e999), no
/// NaN/Infinity; any comma is refused as a decimal comma or thousands separator without guessing which.
/// "-0" reads as 0. Values are trimmed of surrounding whitespace before they are read.</item>
/// <item>Units kg, g, mg, t, lb, case-insensitive (no two of them differ only in case).</item>
/// <item>analysis rows: quantity and unit must be empty (refused, not ignored); material, stream and
/// assay_pct are required; the stream must be named by a non-analysis row of the same batch and step
/// (trimmed, case-insensitive), before or after the analysis.</item>
/// <item>assay_pct is left null when not given (<see cref="RecordRow.AssayPct"/>); the defaults (100 % for
/// charge and product) are applied by the consumer, e.g. <see cref="RecordRow.MaterialKg"/>. An assay_pct
/// without a material is refused (it would say nothing).</item>
/// <item>recorded_at: yyyy-MM-ddTHH:mm[:ss[.fffffff]] followed by Z or ±hh:mm; no offset is refused.</item>
/// <item>Codes (recipe, step, material) match without case and come back spelled as the definitions
/// spell them; batch ids are trimmed and compared exactly (case-sensitive).</item>
/// <item>Rows of separators only (",,,,") and empty lines are skipped; an unnamed header column is a warning.</item>
/// <item>Encoding and size (<see cref="ExportInputGuard"/>, <see cref="ExportLimits"/>): bytes that are not UTF-8 are
/// an error naming line and column (a correctly encoded U+FFFD is accepted); a UTF-16 byte-order mark, CR-only line
/// ends, NUL bytes, a file that is not text and a line or row past 1 MiB stop the reading with one error.</item>
/// <item>Batches need not be contiguous. A file (or seekable stream) is read twice: first only to find
/// where each batch ends, so that memory holds the open batches only (one, when batches are contiguous),
/// plus one small entry per batch id.</item>
/// <item>recipe_version: a row that gives it names the batch's version (every row that gives one must give the
/// same). A batch whose rows give none gets the version in effect on the local calendar date, in
/// <c>siteZone</c>, of its earliest recorded_at (<see cref="Definitions.ProcessCatalog.RecipeInEffect"/>), else the
/// newest, stated as <see cref="RecipeVersionSource.Newest"/> (the reconciler flags it). Steps of rows without a
/// version are checked against the chosen version when the batch is complete.</item>
/// </list>
/// </remarks>
public static class ExportReader
{
    /// <summary>At most this many errors are listed per file; the rest are counted in a last entry.</summary>
    public const int MaxErrors = 1000;

    /// <summary>Reads the file at <paramref name="path"/>; <paramref name="fileName"/> is what errors name.</summary>
    public static ExportReadResult Read(string path, string fileName, ProcessCatalog catalog, TimeZoneInfo siteZone)
    {
        var batches = new List<BatchRecord>();
        var scan = Scan(path, fileName, catalog, siteZone, batches.Add);
        return Collect(scan, batches);
    }

    /// <summary>Reads an export from a stream (left open). A seekable stream is read twice, from its
    /// current position, so that batches are complete as soon as their last row is read.</summary>
    public static ExportReadResult Read(Stream stream, string fileName, ProcessCatalog catalog, TimeZoneInfo siteZone)
    {
        var batches = new List<BatchRecord>();
        var scan = Scan(stream, fileName, catalog, siteZone, batches.Add);
        return Collect(scan, batches);
    }

    /// <summary>
    /// Streaming read: hands each batch to <paramref name="onBatch"/> as soon as its last row has been
    /// read, holding in memory only the batches whose rows are still to come (one, when each batch's
    /// rows are contiguous). Batches are handed on only while the file has no error, but an error can
    /// still be found after some were: the file is valid only when the result has no errors, and the
    /// caller must then discard what it got (store inside a transaction and roll it back).
    /// </summary>
    public static ExportScanResult Scan(string path, string fileName, ProcessCatalog catalog, TimeZoneInfo siteZone, Action<BatchRecord> onBatch)
    {
        ArgumentNullException.ThrowIfNull(siteZone);
        ArgumentNullException.ThrowIfNull(onBatch);
        var errors = new ExportErrorList(fileName, MaxErrors);

        // The first pass finds where each batch ends, so batches need not be contiguous to be streamed.
        Dictionary<string, long>? lastRows;
        using (var file = OpenFile(path))
        using (var firstGuard = new ExportInputGuard(file))
        using (var first = CsvReader.Create(firstGuard, ExportScanner.Options(static _ => { })))
        {
            lastRows = ExportScanner.FindLastRows(first);
        }

        using var second = OpenFile(path);
        return ScanOnce(second, fileName, catalog, siteZone, onBatch, errors, lastRows);
    }

    /// <summary>
    /// Streaming read of an export already in memory (a small file read whole): one pass only. Every batch is
    /// held to the end of the file, which costs no more than the bytes already held, and the batches are then
    /// handed on in the order of their first row, as <see cref="Scan(string, string, ProcessCatalog, TimeZoneInfo, Action{BatchRecord})"/>
    /// lists them; the errors are the same.
    /// </summary>
    public static ExportScanResult Scan(byte[] content, string fileName, ProcessCatalog catalog, TimeZoneInfo siteZone, Action<BatchRecord> onBatch)
    {
        ArgumentNullException.ThrowIfNull(content);
        ArgumentNullException.ThrowIfNull(siteZone);
        ArgumentNullException.ThrowIfNull(onBatch);
        using var stream = new MemoryStream(content, writable: false);
        return ScanOnce(stream, fileName, catalog, siteZone, onBatch, new ExportErrorList(fileName, MaxErrors), null);
    }

    /// <summary>Streaming read of a stream (left open); see <see cref="Scan(string, string, ProcessCatalog, TimeZoneInfo, Action{BatchRecord})"/>.
    /// A stream that cannot seek is read once, and then every batch is held until the end of the file.</summary>
    public static ExportScanResult Scan(Stream stream, string fileName, ProcessCatalog catalog, TimeZoneInfo siteZone, Action<BatchRecord> onBatch)
    {
        ArgumentNullException.ThrowIfNull(stream);
        ArgumentNullException.ThrowIfNull(siteZone);
        ArgumentNullException.ThrowIfNull(onBatch);
        var errors = new ExportErrorList(fileName, MaxErrors);

        Dictionary<string, long>? lastRows = null;
        if (stream.CanSeek)
        {
            var start = stream.Position;
            using (var firstGuard = new ExportInputGuard(stream))
            using (var first = CsvReader.Create(firstGuard, ExportScanner.Options(static _ => { })))
            {
                lastRows = ExportScanner.FindLastRows(first);
            }

            stream.Position = start;
        }

        return ScanOnce(stream, fileName, catalog, siteZone, onBatch, errors, lastRows);
    }

    /// <summary>The reading pass: batches are handed on at their last row when <paramref name="lastRows"/> says where
    /// it is, else all at the end of the file.</summary>
    private static ExportScanResult ScanOnce(
        Stream stream, string fileName, ProcessCatalog catalog, TimeZoneInfo siteZone, Action<BatchRecord> onBatch, ExportErrorList errors, Dictionary<string, long>? lastRows)
    {
        using var guard = new ExportInputGuard(stream);
        var scanner = new ExportScanner(fileName, catalog, siteZone, onBatch, errors, lastRows, guard);
        using var reader = CsvReader.Create(guard, ExportScanner.Options(scanner.OnMalformed));
        return scanner.Run(reader);
    }

    // Shared with other readers, as CsvReader.FromFile opens it; read front to back.
    private static FileStream OpenFile(string path) =>
        new(path, FileMode.Open, FileAccess.Read, FileShare.Read, bufferSize: 1, FileOptions.SequentialScan);

    private static ExportReadResult Collect(ExportScanResult scan, List<BatchRecord> batches) =>
        scan.IsValid
            ? ExportReadResult.Accepted(scan.FileName, batches.OrderBy(b => b.Rows[0].Line).ToList())
            : ExportReadResult.Rejected(scan.FileName, scan.Errors);
}
