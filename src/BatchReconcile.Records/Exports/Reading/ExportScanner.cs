using BatchReconcile.Records.Definitions;
using CsvHelper;
using static System.FormattableString;

namespace BatchReconcile.Records.Exports.Reading;

/// <summary>One streaming read of one export: checks every row against the contract and the process
/// catalogue, groups rows by batch, and hands each batch on as soon as its last row has been read.</summary>
/// <remarks>
/// Memory: with a first pass (<paramref name="lastRowOfBatch"/>) a batch is handed on at its last row,
/// so what is held is the batches open at the same time: one batch when each batch's rows are
/// contiguous. Without it (a stream that cannot be read twice) every batch stays open to the end.
/// Once the file has an error no rows are kept at all, only what the checks of a whole batch need.
/// </remarks>
internal sealed class ExportScanner(
    string fileName,
    ProcessCatalog catalog,
    TimeZoneInfo siteZone,
    Action<BatchRecord> onBatch,
    ExportErrorList errors,
    Dictionary<string, long>? lastRowOfBatch,
    ExportInputGuard? guard = null)
{
    private const long Closed = -1;

    /// <summary>The columns that carry identifiers, refused with control or bidirectional-control characters (<see cref="SafeText"/>).</summary>
    private static readonly string[] IdentifierColumns =
    [
        ExportColumns.Batch, ExportColumns.Recipe, ExportColumns.RecipeVersion, ExportColumns.Step,
        ExportColumns.Entry, ExportColumns.Material, ExportColumns.Stream, ExportColumns.Lot,
    ];

    private static readonly (string Text, EntryKind Kind)[] Entries =
    [
        ("charge", EntryKind.Charge),
        ("product", EntryKind.Product),
        ("waste", EntryKind.Waste),
        ("recovered", EntryKind.Recovered),
        ("sample", EntryKind.Sample),
        ("analysis", EntryKind.Analysis),
    ];

    private readonly Dictionary<string, OpenBatch> _open = new(StringComparer.Ordinal);
    private readonly HashSet<long> _malformedLines = [];
    private ExportHeader? _header;
    private (long Line, string Raw, string Reason)? _headerMalformed;
    private bool _rowsDropped;
    private int _rowsHeld;
    private int _peakRowsHeld;
    private int _peakBatchesHeld;
    private int _delivered;
    private long _dataRows;
    private bool _faultReported;

    /// <summary>Options of both passes: the contract's dialect, nothing detected or guessed.</summary>
    public static CsvReaderOptions Options(Action<CsvMalformedRecord>? onMalformed) => CsvReaderOptions.Default with
    {
        Separator = ',',
        HasHeader = true,
        Mode = CsvMode.Rfc4180,
        AllowLineBreaksInQuotes = true,
        SkipEmptyLines = true,
        TrimWhitespace = false,
        TrackLineNumbers = true,
        DetectSeparatorHint = false,
        MalformedData = CsvMalformedDataHandling.Recover,
        FieldCountMismatch = CsvFieldCountHandling.Allow,
        OnMalformedRecord = onMalformed,

        // A row with quoted line breaks can span many lines of at most 1 MiB each: bound the row as well.
        MaxRecordSize = ExportLimits.MaxLineBytes,
    };

    /// <summary>First pass: the row number of each batch's last row, or null when the header has no batch column.</summary>
    public static Dictionary<string, long>? FindLastRows(CsvReader reader)
    {
        var batchIndex = -1;
        for (var i = 0; i < reader.Headers.Count; i++)
        {
            if (string.Equals(reader.Headers[i].Trim(), ExportColumns.Batch, StringComparison.OrdinalIgnoreCase))
            {
                batchIndex = i;
                break;
            }
        }

        if (batchIndex < 0)
        {
            return null;
        }

        var last = new Dictionary<string, long>(StringComparer.Ordinal);
        try
        {
            while (reader.Read())
            {
                var key = BatchKey(reader, batchIndex);
                if (key.Length > 0 && key.Length <= ExportLimits.MaxFieldChars)
                {
                    last[key] = reader.RowNumber;
                }
            }
        }
        catch (CsvFormatException)
        {
            // A row past the size limit: the second pass stops at the same place and reports it.
        }

        return last;
    }

    /// <summary>Called by the reader for each record with broken quoting (possibly ahead of <see cref="CsvReader.Read"/>).</summary>
    public void OnMalformed(CsvMalformedRecord record)
    {
        var reason = record.Reason switch
        {
            CsvMalformedReason.StrayQuote =>
                "a quote (\") inside an unquoted field; a field that contains quotes must be enclosed in quotes, each inner quote doubled (\"\")",
            CsvMalformedReason.TextAfterClosingQuote =>
                "text after the closing quote of a quoted field; the whole field must be inside the quotes, each inner quote doubled (\"\")",
            CsvMalformedReason.UnterminatedQuote =>
                "a quoted field is never closed, so the rest of the file was read into it; close the quote",
            _ => Invariant($"the row is not valid CSV ({record.Reason})"),
        };
        if (record.RecordNumber == 1)
        {
            // Reported once the header is checked: a semicolon header gets its one clear error instead.
            _headerMalformed = (record.LineNumber, ExportHeader.Shorten(record.RawRecord), reason);
            return;
        }

        _malformedLines.Add(record.LineNumber);
        errors.Add(record.LineNumber, "", ExportHeader.Shorten(record.RawRecord), reason);
    }

    public ExportScanResult Run(CsvReader reader)
    {
        IReadOnlyList<string> headers;
        try
        {
            headers = reader.Headers;
        }
        catch (CsvFormatException e)
        {
            AddFault();
            errors.Add(Math.Max(1, e.LineNumber), "", "", TooLong);
            return Result();
        }

        if (guard?.Fault is { } fault && guard.LinesPassed == 0)
        {
            // Nothing reached the CSV reader: the one thing to say is why.
            errors.Add(fault.Line, "", fault.Value, fault.Reason);
            return Result();
        }

        _header = ExportHeader.Analyze(headers, errors, out var semicolon);
        if (_headerMalformed is { } bad && !semicolon)
        {
            errors.Add(bad.Line, "", bad.Raw, "header: " + bad.Reason);
        }

        if (guard is not null && guard.IsNotUtf8(1, 1))
        {
            foreach (var name in headers.Where(h => h.Contains('\uFFFD', StringComparison.Ordinal)))
            {
                errors.Add(1, ExportHeader.ContractName(name.Trim()), name, "the header has bytes that are not valid UTF-8; export the file as UTF-8");
            }
        }

        if (_header is null)
        {
            AddFault();
            return Result();
        }

        var batchIndex = _header.IndexOf(ExportColumns.Batch);
        while (TryRead(reader))
        {
            var fields = new string[reader.FieldCount];
            for (var i = 0; i < fields.Length; i++)
            {
                fields[i] = reader.GetString(i) ?? "";
            }

            if (fields.All(string.IsNullOrWhiteSpace))
            {
                // A line of separators only (",,,,"), as spreadsheets leave at the end: nothing to read.
                continue;
            }

            _dataRows++;
            var line = (int)Math.Clamp(reader.LineNumber, 1, int.MaxValue);
            ReadRow(fields, line);

            // The batch field as already read into the row, not decoded from the reader a second time.
            var key = batchIndex >= 0 && batchIndex < fields.Length ? fields[batchIndex].Trim() : "";
            if (lastRowOfBatch is not null && key.Length > 0
                && lastRowOfBatch.TryGetValue(key, out var lastRow) && lastRow == reader.RowNumber)
            {
                Close(key);
            }

            DropRowsOnceRejected();
        }

        foreach (var batch in _open.Values.OrderBy(b => b.FirstLine).ToList())
        {
            Close(batch.Id);
        }

        AddFault();
        if (_dataRows == 0 && errors.Count == 0)
        {
            errors.Add(1, "", "", "the file has a header but no data rows");
        }

        return Result();
    }

    private const string TooLong =
        "this row is longer than 1 MiB (1,048,576 bytes), the longest row the export format allows (a quoted value that is never closed makes one); reading stopped here";

    private bool TryRead(CsvReader reader)
    {
        try
        {
            return reader.Read();
        }
        catch (CsvFormatException e)
        {
            errors.Add(Math.Max(1, e.LineNumber), "", "", TooLong);
            return false;
        }
    }

    /// <summary>Reports what stopped the guard, once the rows before it are checked.</summary>
    private void AddFault()
    {
        if (guard?.Fault is { } fault && !_faultReported)
        {
            _faultReported = true;
            errors.Add(fault.Line, "", fault.Value, fault.Reason);
        }
    }

    private ExportScanResult Result() =>
        new(fileName, errors.ToList(), _delivered, _dataRows, _peakRowsHeld, _peakBatchesHeld);

    private void ReadRow(string[] fields, int line)
    {
        var header = _header!;
        if (_malformedLines.Contains(line))
        {
            // Already reported; values read out of broken quoting would only add confusing errors.
            return;
        }

        if (fields.Length != header.FieldCount)
        {
            errors.Add(line, "", ExportHeader.Shorten(string.Join(",", fields)),
                Invariant($"this row has {fields.Length} fields but the header has {header.FieldCount}; a value that contains a comma must be in double quotes"));
            return;
        }

        string Field(string column)
        {
            var i = header.IndexOf(column);
            return i < 0 ? "" : fields[i].Trim();
        }

        void Error(string column, string value, string reason) => errors.Add(line, column, value, reason);

        // Lines this row spans (quoted values may hold line breaks).
        var lastLine = line + fields.Sum(f => (long)f.AsSpan().Count('\n'));
        if (guard is not null && guard.IsNotUtf8(line, lastLine))
        {
            var named = false;
            for (var i = 0; i < fields.Length; i++)
            {
                if (fields[i].Contains('\uFFFD', StringComparison.Ordinal))
                {
                    named = true;
                    Error(ExportHeader.ContractName(header.Names[i]), fields[i], "contains bytes that are not valid UTF-8; export the file as UTF-8");
                }
            }

            if (!named)
            {
                Error("", "", "the row has bytes that are not valid UTF-8; export the file as UTF-8");
            }
        }

        // Sizes and characters first: a value past them is not read any further (nor quoted whole).
        var refused = false;
        for (var i = 0; i < fields.Length; i++)
        {
            if (fields[i].Length > ExportLimits.MaxFieldChars)
            {
                refused = true;
                Error(ExportHeader.ContractName(header.Names[i]), fields[i],
                    Invariant($"the value is {fields[i].Length:N0} characters long; a field may have at most {ExportLimits.MaxFieldChars:N0}"));
            }
        }

        foreach (var column in IdentifierColumns)
        {
            var value = Field(column);
            var at = SafeText.IndexOfRefused(value);
            if (at >= 0 && value.Length <= ExportLimits.MaxFieldChars)
            {
                refused = true;
                Error(column, value,
                    Invariant($"{column} contains the control character {SafeText.Name(value[at])} at character {at + 1}; identifiers and labels must not contain control or bidirectional-control characters"));
            }
        }

        if (refused)
        {
            return;
        }

        // batch
        var batchId = Field(ExportColumns.Batch);
        if (batchId.Length == 0)
        {
            Error(ExportColumns.Batch, "", "batch is required on every row");
        }

        // recipe and recipe_version
        var recipeText = Field(ExportColumns.Recipe);
        var versionText = Field(ExportColumns.RecipeVersion);
        int? versionGiven = null;
        var versionOk = true;
        if (versionText.Length > 0)
        {
            if (ExportValues.TryParseVersion(versionText, out var v))
            {
                versionGiven = v;
            }
            else
            {
                versionOk = false;
                Error(ExportColumns.RecipeVersion, versionText, "recipe_version must be a whole number such as 2 (or empty: then the version in effect on the batch's date is used)");
            }
        }

        // recipe: the version named on the row; recipeCode: the code as the definitions spell it, also
        // for a row without a version, whose recipe is chosen when the batch is complete (Close).
        Recipe? recipe = null;
        string? recipeCode = null;
        if (recipeText.Length == 0)
        {
            Error(ExportColumns.Recipe, "", "recipe is required on every row");
        }
        else if (!catalog.HasRecipe(recipeText))
        {
            Error(ExportColumns.Recipe, recipeText, $"unknown recipe '{recipeText}'; it is not in the process definitions{Known(catalog.Recipes.Select(r => r.Code).Distinct(StringComparer.OrdinalIgnoreCase))}");
        }
        else if (versionGiven is null)
        {
            recipeCode = versionOk ? catalog.NewestRecipe(recipeText)!.Code : null;
        }
        else
        {
            recipe = catalog.FindRecipe(recipeText, versionGiven.Value);
            recipeCode = recipe?.Code;
            if (recipe is null)
            {
                var versions = catalog.Recipes
                    .Where(r => string.Equals(r.Code, recipeText, StringComparison.OrdinalIgnoreCase))
                    .Select(r => r.Version.ToString(System.Globalization.CultureInfo.InvariantCulture));
                Error(ExportColumns.RecipeVersion, versionText, $"recipe {recipeText} has no version {versionText} (versions: {string.Join(", ", versions)})");
            }
        }

        // step
        var stepText = Field(ExportColumns.Step);
        RecipeStep? step = null;
        var checkStepLater = false;
        if (stepText.Length == 0)
        {
            Error(ExportColumns.Step, "", "step is required on every row");
        }
        else if (recipe is not null)
        {
            step = recipe.FindStep(stepText);
            if (step is null)
            {
                Error(ExportColumns.Step, stepText, Invariant($"recipe {recipe.Code} version {recipe.Version} has no step '{stepText}' (steps: {string.Join(", ", recipe.Steps.Select(s => s.Code))})"));
            }
        }
        else if (recipeCode is not null)
        {
            // Checked against the batch's version once it is chosen; a step of no version at all is wrong already.
            var versions = catalog.Recipes.Where(r => string.Equals(r.Code, recipeCode, StringComparison.Ordinal)).ToList();
            if (!versions.Any(r => r.FindStep(stepText) is not null))
            {
                Error(ExportColumns.Step, stepText, Invariant($"recipe {recipeCode} has no step '{stepText}' in any version (steps: {string.Join(", ", versions.SelectMany(r => r.Steps).Select(s => s.Code).Distinct(StringComparer.Ordinal))})"));
            }
            else
            {
                checkStepLater = true;
            }
        }

        // entry
        var entryText = Field(ExportColumns.Entry);
        EntryKind? entry = null;
        foreach (var (text, kind) in Entries)
        {
            if (string.Equals(text, entryText, StringComparison.OrdinalIgnoreCase))
            {
                entry = kind;
            }
        }

        if (entry is null)
        {
            Error(ExportColumns.Entry, entryText, entryText.Length == 0
                ? "entry is required on every row: charge, product, waste, recovered, sample or analysis"
                : "entry must be charge, product, waste, recovered, sample or analysis");
        }

        var entryName = entryText.ToLowerInvariant();
        var isAnalysis = entry == EntryKind.Analysis;

        // material
        var materialText = Field(ExportColumns.Material);
        Material? material = null;
        var materialRequired = entry is EntryKind.Charge or EntryKind.Product or EntryKind.Recovered or EntryKind.Analysis;
        if (materialText.Length > 0)
        {
            material = catalog.FindMaterial(materialText);
            if (material is null)
            {
                Error(ExportColumns.Material, materialText, $"unknown material '{materialText}'; it is not in the process definitions");
            }
        }
        else if (materialRequired)
        {
            Error(ExportColumns.Material, "", $"material is required on {Article(entryName)} {entryName} row");
        }

        // stream
        var streamText = Field(ExportColumns.Stream);
        if (isAnalysis && streamText.Length == 0)
        {
            Error(ExportColumns.Stream, "", "an analysis row must name the stream it describes (column stream)");
        }

        // quantity and unit
        var quantityText = Field(ExportColumns.Quantity);
        var unitText = Field(ExportColumns.Unit);
        double? quantity = null;
        MassUnit? unit = null;
        if (isAnalysis)
        {
            if (quantityText.Length > 0)
            {
                Error(ExportColumns.Quantity, quantityText, "an analysis row has no quantity: it only says what part of its stream is which material");
            }

            if (unitText.Length > 0)
            {
                Error(ExportColumns.Unit, unitText, "an analysis row has no quantity, so no unit either");
            }
        }
        else
        {
            if (quantityText.Length == 0)
            {
                if (entry is not null)
                {
                    Error(ExportColumns.Quantity, "", $"quantity is required on {Article(entryName)} {entryName} row");
                }
            }
            else if (ExportValues.TryParseNumber(quantityText, out var q) is { } why)
            {
                Error(ExportColumns.Quantity, quantityText, why);
            }
            else if (q < 0)
            {
                Error(ExportColumns.Quantity, quantityText, "must not be negative: a quantity is a gross mass of 0 or more");
            }
            else
            {
                quantity = q;
            }

            if (unitText.Length == 0)
            {
                if (quantityText.Length > 0)
                {
                    Error(ExportColumns.Unit, "", "unit is required with a quantity: kg, g, mg, t or lb");
                }
            }
            else if (!MassUnit.TryParse(unitText, out unit))
            {
                Error(ExportColumns.Unit, unitText, $"unknown unit '{unitText}'; use kg, g, mg, t or lb");
            }
            else if (quantity is { } given && unit.ToKilograms(given) is var kg && !(kg <= ExportLimits.MaxRowKilograms))
            {
                Error(ExportColumns.Quantity, quantityText, double.IsFinite(kg)
                    ? Invariant($"{given:G6} {unit.Symbol} is {kg:G6} kg, more than the {ExportLimits.MaxRowKilograms:N0} kg (1,000 t) one row may record; check the value and its unit")
                    : Invariant($"{given:G6} {unit.Symbol} is too large to convert to kg; one row may record at most {ExportLimits.MaxRowKilograms:N0} kg (1,000 t)"));
                quantity = null;
            }
        }

        // assay_pct
        var assayText = Field(ExportColumns.AssayPct);
        double? assay = null;
        if (assayText.Length == 0)
        {
            if (isAnalysis)
            {
                Error(ExportColumns.AssayPct, "", "assay_pct is required on an analysis row: the mass % of the material in the stream");
            }
        }
        else if (ExportValues.TryParseNumber(assayText, out var a) is { } why)
        {
            Error(ExportColumns.AssayPct, assayText, why);
        }
        else if (!(a > 0 && a <= 100))
        {
            Error(ExportColumns.AssayPct, assayText, "assay_pct must be more than 0 and at most 100 (mass %)");
        }
        else if (materialText.Length == 0)
        {
            // Where the material is required its absence is already reported.
            if (!materialRequired)
            {
                Error(ExportColumns.AssayPct, assayText, "assay_pct needs a material: it is the mass % of that material");
            }
        }
        else
        {
            assay = a;
        }

        // recorded_at
        var timeText = Field(ExportColumns.RecordedAt);
        DateTimeOffset? recordedAt = null;
        if (timeText.Length > 0)
        {
            if (ExportValues.TryParseTime(timeText, out var t) is { } why)
            {
                Error(ExportColumns.RecordedAt, timeText, why);
            }
            else
            {
                recordedAt = t;
            }
        }

        if (batchId.Length == 0)
        {
            return;
        }

        var batch = Open(batchId, line);
        if (batch is null)
        {
            return;
        }

        if (recordedAt is { } recorded)
        {
            batch.Recorded(recorded);
        }

        if (recipeCode is not null)
        {
            if (batch.RecipeCode is null)
            {
                batch.SetRecipeCode(recipeCode, line);
            }
            else if (!string.Equals(batch.RecipeCode, recipeCode, StringComparison.Ordinal) && (recipe is null || batch.Recipe is null))
            {
                Error(ExportColumns.Recipe, recipeText,
                    Invariant($"batch {batchId} is recorded with recipe {batch.RecipeCode} on line {batch.RecipeCodeLine}; this row says {recipeCode}, and a batch has one recipe"));
            }

            if (checkStepLater)
            {
                batch.UnversionedSteps.Add((line, stepText));
            }
        }

        if (recipe is not null)
        {
            if (batch.Recipe is null)
            {
                batch.SetRecipe(recipe, line);
            }
            else if (!string.Equals(batch.Recipe.Code, recipe.Code, StringComparison.OrdinalIgnoreCase) || batch.Recipe.Version != recipe.Version)
            {
                var sameCode = string.Equals(batch.Recipe.Code, recipe.Code, StringComparison.OrdinalIgnoreCase);
                Error(sameCode ? ExportColumns.RecipeVersion : ExportColumns.Recipe, sameCode ? versionText : recipeText,
                    Invariant($"batch {batchId} is recorded with recipe {batch.Recipe.Code} version {batch.Recipe.Version} on line {batch.RecipeLine}; this row says {recipe.Code} version {recipe.Version}, and a batch has one recipe"));
            }
        }

        if (stepText.Length > 0 && streamText.Length > 0)
        {
            if (isAnalysis)
            {
                batch.AddAnalysis(line, stepText, streamText);
            }
            else
            {
                batch.AddStream(stepText, streamText);
            }
        }

        if (errors.Count == 0 && batch.Rows is not null)
        {
            var raw = new KeyValuePair<string, string>[fields.Length];
            for (var i = 0; i < fields.Length; i++)
            {
                raw[i] = new(header.Names[i], fields[i]);
            }

            batch.Rows.Add(new RecordRow(
                line,
                batchId,
                recipeCode!,
                versionGiven,
                step?.Code ?? stepText,
                entry!.Value,
                material?.Code,
                streamText.Length > 0 ? streamText : null,
                quantity is { } qty ? unit!.ToKilograms(qty) : null,
                quantity,
                unit,
                assay,
                Field(ExportColumns.Lot) is { Length: > 0 } lot ? lot : null,
                recordedAt,
                raw));
            _rowsHeld++;
            _peakRowsHeld = Math.Max(_peakRowsHeld, _rowsHeld);
        }
    }

    private OpenBatch? Open(string id, int line)
    {
        if (_open.TryGetValue(id, out var batch))
        {
            return batch;
        }

        if (lastRowOfBatch is not null && lastRowOfBatch.TryGetValue(id, out var last) && last == Closed)
        {
            errors.Add(line, ExportColumns.Batch, id, "the file changed while it was read (this batch had ended); read the file again once it is complete");
            return null;
        }

        batch = new OpenBatch(id, line);
        if (_rowsDropped)
        {
            batch.DropRows();
        }

        _open.Add(id, batch);
        _peakBatchesHeld = Math.Max(_peakBatchesHeld, _open.Count);
        return batch;
    }

    private void Close(string id)
    {
        if (!_open.Remove(id, out var batch))
        {
            return;
        }

        if (lastRowOfBatch is not null)
        {
            lastRowOfBatch[id] = Closed;
        }

        // Checked only now: an analysis may come before the row of the stream it describes.
        foreach (var (line, step, stream) in batch.UnmatchedAnalyses())
        {
            errors.Add(line, ExportColumns.Stream, stream,
                $"no row of step {step} in batch {batch.Id} has the stream '{stream}'; an analysis describes a stream (waste, product ...) of its own step");
        }

        var chosen = ChooseRecipe(batch);
        if (chosen is { } c)
        {
            foreach (var (line, step) in batch.UnversionedSteps)
            {
                if (c.Recipe.FindStep(step) is null)
                {
                    errors.Add(line, ExportColumns.Step, step, Invariant(
                        $"recipe {c.Recipe.Code} version {c.Recipe.Version} ({Chosen(c.Source, c.Date)}) has no step '{step}' (steps: {string.Join(", ", c.Recipe.Steps.Select(s => s.Code))}); give the batch's recipe_version"));
                }
            }
        }

        if (batch.Rows is { } rows)
        {
            _rowsHeld -= rows.Count;
            if (errors.Count == 0)
            {
                var (recipe, source, date) = chosen ?? throw new InvalidOperationException($"Batch {batch.Id} has rows and no errors but no recipe.");

                // Rows without a version carry the step as written until now; spell it as the chosen version does.
                var spelled = rows.Select(r => r.RecipeVersion is null ? r with { Step = recipe.FindStep(r.Step)!.Code } : r).ToList();
                onBatch(new BatchRecord(batch.Id, recipe.Code, recipe.Version, source, date, spelled, _header!.Warnings));
                _delivered++;
            }
        }
    }

    /// <summary>
    /// The batch's recipe version and how it was chosen: the one its rows name; else the one in effect on
    /// the local calendar date (site time zone) of its earliest recorded_at; else, stated, the newest.
    /// Null when no row named a known recipe (already an error).
    /// </summary>
    private (Recipe Recipe, RecipeVersionSource Source, DateOnly? Date)? ChooseRecipe(OpenBatch batch)
    {
        DateOnly? date = batch.FirstRecordedAt is { } first ? DateOnly.FromDateTime(TimeZoneInfo.ConvertTime(first, siteZone).DateTime) : null;
        if (batch.Recipe is { } named)
        {
            return (named, RecipeVersionSource.Export, date);
        }

        if (batch.RecipeCode is not { } code)
        {
            return null;
        }

        return catalog.RecipeInEffect(code, date) is { } inEffect
            ? (inEffect, RecipeVersionSource.EffectiveDate, date)
            : (catalog.NewestRecipe(code)!, RecipeVersionSource.Newest, date);
    }

    private static string Chosen(RecipeVersionSource source, DateOnly? date) => source switch
    {
        RecipeVersionSource.Export => "named by the export",
        RecipeVersionSource.EffectiveDate => Invariant($"in effect on {date:yyyy-MM-dd}, the local date of the batch's first recorded time"),
        _ => "the newest, as no effectiveFrom date decides the version",
    };

    private void DropRowsOnceRejected()
    {
        if (_rowsDropped || errors.Count == 0)
        {
            return;
        }

        // The file will be quarantined whole: keep checking every line, but stop holding rows.
        _rowsDropped = true;
        foreach (var batch in _open.Values)
        {
            _rowsHeld -= batch.Rows?.Count ?? 0;
            batch.DropRows();
        }
    }

    private static string BatchKey(CsvReader reader, int batchIndex) =>
        batchIndex >= 0 && batchIndex < reader.FieldCount ? (reader.GetString(batchIndex) ?? "").Trim() : "";

    private static string Article(string word) => word.Length > 0 && "aeiou".Contains(word[0], StringComparison.Ordinal) ? "an" : "a";

    private static string Known(IEnumerable<string> codes)
    {
        var list = codes.Order(StringComparer.Ordinal).Take(11).ToList();
        return list.Count == 0 ? "" : $" (known: {string.Join(", ", list.Take(10))}{(list.Count > 10 ? ", ..." : "")})";
    }
}
