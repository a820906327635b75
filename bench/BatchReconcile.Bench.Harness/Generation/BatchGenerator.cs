using System.Globalization;
using System.Text;

namespace BatchReconcile.Bench.Harness.Generation;

/// <summary>
/// Writes synthetic, chemically valid batch exports for the three sample recipes (BZC-410 two steps,
/// PPZ-220 with vented gases, NBB-150 with solvent recovery), derived from the demo plant's clean batches.
/// </summary>
/// <remarks>
/// Each batch is its template scaled by one factor (0.85-1.15), so the equivalents, yield and balance
/// closure of a clean batch are those of the template; the faults change masses the way a real mishap
/// would (product lost to the liquor, an unweighed spill) or break the export format. Times keep the
/// template's wall-clock times, moved by whole days, with the plant's UTC offset of that date, so the
/// production day of batch i is FirstDay + i / BatchesPerDay.
/// </remarks>
internal sealed class BatchGenerator
{
    private static readonly DateOnly TemplateDay = new(2026, 11, 23);
    private static readonly TimeZoneInfo Plant = TimeZoneInfo.FindSystemTimeZoneById("Europe/Berlin");
    private static readonly UTF8Encoding Utf8 = new(encoderShouldEmitUTF8Identifier: false);

    private readonly GeneratorOptions _options;
    private readonly BatchTemplate[] _templates;

    public BatchGenerator(GeneratorOptions options, string sampleInbox)
    {
        _options = options;
        _templates =
        [
            BatchTemplate.Read(Path.Combine(sampleInbox, "2026-11-23T2135_KB3-BZ-0411.csv"), "BZ"),
            BatchTemplate.Read(Path.Combine(sampleInbox, "2026-11-23T1012_KB3-PZ-0227.csv"), "PZ"),
            BatchTemplate.Read(Path.Combine(sampleInbox, "2026-11-23T1705_KB3-NB-0158.csv"), "NB"),
        ];
    }

    public GeneratedSet Write()
    {
        Directory.CreateDirectory(_options.OutputFolder);
        var counter = new Counter();
        var names = new List<string>();
        if (_options.OneFileBytes > 0)
        {
            var name = $"{_options.BatchPrefix}-one-file.csv";
            names.Add(name);
            using var writer = Open(name);
            var i = _options.FirstIndex;
            while (writer.BaseStream.Position < _options.OneFileBytes)
            {
                WriteBatch(writer, i++, allowMalformed: false, counter);
                writer.Flush();
            }

            counter.Files = 1;
        }
        else
        {
            var perFile = Math.Max(1, _options.BatchesPerFile);
            for (var start = 0; start < _options.Batches; start += perFile)
            {
                var first = _options.FirstIndex + start;
                var count = Math.Min(perFile, _options.Batches - start);
                var name = count == 1
                    ? $"{first:D7}_{BatchId(first)}.csv"
                    : $"{first:D7}_{_options.BatchPrefix}-{count}-batches.csv";
                names.Add(name);
                using (var writer = Open(name))
                {
                    for (var i = first; i < first + count; i++)
                    {
                        WriteBatch(writer, i, allowMalformed: count == 1, counter);
                    }
                }

                counter.Files++;
            }
        }

        var bytes = names.Sum(n => new FileInfo(Path.Combine(_options.OutputFolder, n)).Length);
        return new GeneratedSet(_options.OutputFolder, counter.Files, counter.Batches, counter.Rows, bytes, counter.LowYield, counter.Gap, counter.Malformed, names);
    }

    private StreamWriter Open(string name)
    {
        var writer = new StreamWriter(Path.Combine(_options.OutputFolder, name), false, Utf8, 1 << 16) { NewLine = "\n" };
        writer.WriteLine(ExportRow.Header);
        return writer;
    }

    private string BatchId(int index) => $"{_options.BatchPrefix}-{_templates[index % 3].Kind}-{index:D6}";

    private void WriteBatch(StreamWriter writer, int index, bool allowMalformed, Counter counter)
    {
        var template = _templates[index % 3];
        var random = new SplitMix(_options.Seed, index);
        var factor = 0.85 + (0.30 * random.NextDouble());
        var fault = FaultKind.None;
        if (random.NextDouble() < _options.FaultShare)
        {
            var kinds = allowMalformed ? 3 : 2;
            fault = (FaultKind)(1 + (int)(random.NextDouble() * kinds));
        }

        var shiftDays = _options.FirstDay.DayNumber - TemplateDay.DayNumber + (index / Math.Max(1, _options.BatchesPerDay));
        var number = index.ToString("D6", CultureInfo.InvariantCulture);
        var rows = template.Rows
            // QC samples are drawn in a fixed amount whatever the batch size, so they are not scaled.
            .Select(r => new MutableRow(r, r.Entry == "sample" ? r.Quantity : Scale(r.Quantity, factor), r.Lot.Replace(template.Number, number, StringComparison.Ordinal)))
            .ToList();
        var lastStep = rows[^1].Source.Step;
        switch (fault)
        {
            case FaultKind.LowYield:
                MoveProductToLiquor(rows, lastStep, 0.22);
                counter.LowYield++;
                break;
            case FaultKind.Gap:
                ShortenWaste(rows, lastStep, 0.08);
                counter.Gap++;
                break;
            case FaultKind.Malformed:
                counter.Malformed++;
                break;
        }

        rows = SplitToMinimum(Compact(rows));
        var batch = BatchId(index);
        var version = _options.AlternateVersions && index % 2 == 0 && int.TryParse(template.RecipeVersion, NumberStyles.None, CultureInfo.InvariantCulture, out var v) && v > 1
            ? (v - 1).ToString(CultureInfo.InvariantCulture)
            : template.RecipeVersion;
        var line = new StringBuilder(160);
        foreach (var row in rows)
        {
            var r = row.Source;
            var local = r.RecordedAt.DateTime.AddDays(shiftDays);
            var at = new DateTimeOffset(local, Plant.GetUtcOffset(local));
            var quantity = fault == FaultKind.Malformed && row.Quantity.Contains('.', StringComparison.Ordinal)
                ? "\"" + row.Quantity.Replace('.', ',') + "\""
                : row.Quantity;
            line.Clear()
                .Append(batch).Append(',').Append(template.Recipe).Append(',').Append(version).Append(',')
                .Append(r.Step).Append(',').Append(r.Entry).Append(',').Append(r.Material).Append(',')
                .Append(CsvLine.Quote(r.Stream)).Append(',').Append(quantity).Append(',').Append(r.Unit).Append(',')
                .Append(r.Assay).Append(',').Append(row.Lot).Append(',')
                .Append(at.ToString("yyyy-MM-dd'T'HH:mm:sszzz", CultureInfo.InvariantCulture));
            writer.WriteLine(line);
            counter.Rows++;
        }

        counter.Batches++;
    }

    private static void MoveProductToLiquor(List<MutableRow> rows, string step, double share)
    {
        var moved = 0.0;
        foreach (var row in rows.Where(r => r.Source.Step == step && r.Source.Entry == "product"))
        {
            var q = Parse(row.Quantity);
            var kept = Math.Round(q * (1 - share), Decimals(row.Quantity));
            moved += q - kept;
            row.Quantity = Format(kept, Decimals(row.Quantity));
        }

        var liquor = rows.First(r => r.Source.Step == step && r.Source.Entry == "waste");
        liquor.Quantity = Format(Parse(liquor.Quantity) + moved, Decimals(liquor.Quantity));
    }

    private static void ShortenWaste(List<MutableRow> rows, string step, double shareOfCharged)
    {
        var charged = rows.Where(r => r.Source.Step == step && r.Source.Entry == "charge" && r.Source.Unit == "kg").Sum(r => Parse(r.Quantity));
        var waste = rows.Where(r => r.Source.Step == step && r.Source.Entry == "waste").MaxBy(r => Parse(r.Quantity))!;
        waste.Quantity = Format(Parse(waste.Quantity) - (shareOfCharged * charged), Decimals(waste.Quantity));
    }

    /// <summary>Splits product rows into more drums until every step has the minimum number of rows; masses are unchanged.</summary>
    private List<MutableRow> SplitToMinimum(List<MutableRow> rows)
    {
        if (_options.RowsPerStep <= 0)
        {
            return rows;
        }

        var result = new List<MutableRow>(rows.Count);
        foreach (var step in rows.GroupBy(r => r.Source.Step))
        {
            var list = step.ToList();
            var products = list.Where(r => r.Source.Entry == "product").ToList();
            var extra = _options.RowsPerStep - list.Count;
            foreach (var row in list)
            {
                var index = products.IndexOf(row);
                if (extra <= 0 || index < 0)
                {
                    result.Add(row);
                    continue;
                }

                var parts = 1 + (extra / products.Count) + (index < extra % products.Count ? 1 : 0);
                var total = Parse(row.Quantity);
                var each = Math.Round(total / parts, 3);
                for (var k = 0; k < parts; k++)
                {
                    var q = k < parts - 1 ? each : Math.Round(total - (each * (parts - 1)), 3);
                    result.Add(new MutableRow(row.Source, Format(q, 3), $"{row.Lot}-{k + 1}"));
                }
            }
        }

        return result;
    }

    /// <summary>
    /// Compacts each step with more than <see cref="GeneratorOptions.MaxRowsPerStep"/> rows, one rung at a time,
    /// stopping as soon as the step fits: (1) rows of the same entry, material, stream, unit and assay become one
    /// (product drums, recovered receivers, repeated charges of one material), keeping the first row's place and lot;
    /// (2) analysis rows are left out; (3) the waste streams become one; (4) samples join that waste stream. The
    /// charged and isolated masses, the limiting reactant, the yield and the gross balance do not change; what a
    /// compacted batch loses is detail (product found in a named stream, the sample share of the yield loss).
    /// </summary>
    private List<MutableRow> Compact(List<MutableRow> rows)
    {
        var max = _options.MaxRowsPerStep;
        if (max <= 0)
        {
            return rows;
        }

        var result = new List<MutableRow>(rows.Count);
        foreach (var group in rows.GroupBy(r => r.Source.Step))
        {
            var step = group.ToList();
            if (step.Count > max)
            {
                step = Merge(step, r => r.Source.Entry is "analysis" ? null : string.Join('|', r.Source.Entry, r.Source.Material, r.Source.Stream, r.Source.Unit, r.Source.Assay));
            }

            if (step.Count > max)
            {
                step = step.Where(r => r.Source.Entry != "analysis").ToList();
            }

            if (step.Count > max)
            {
                step = Merge(step, r => r.Source.Entry == "waste" ? "waste" : null, "waste streams, combined");
            }

            if (step.Count > max && step.Any(r => r.Source.Entry == "waste"))
            {
                step = Merge(step, r => r.Source.Entry is "waste" or "sample" ? "waste" : null, "waste streams, combined");
            }

            result.AddRange(step);
        }

        return result;
    }

    /// <summary>Rows with the same key (null: never merged) become one at the first one's place: quantities summed, the first lot kept.</summary>
    private static List<MutableRow> Merge(List<MutableRow> rows, Func<MutableRow, string?> key, string? stream = null)
    {
        var merged = new List<MutableRow>(rows.Count);
        var first = new Dictionary<string, int>(StringComparer.Ordinal);
        var parts = new List<List<MutableRow>>();
        foreach (var row in rows)
        {
            var k = key(row);
            if (k is not null && first.TryGetValue(k, out var at))
            {
                parts[at].Add(row);
                continue;
            }

            if (k is not null)
            {
                first[k] = parts.Count;
            }

            parts.Add([row]);
        }

        foreach (var part in parts)
        {
            if (part.Count == 1)
            {
                merged.Add(part[0]);
                continue;
            }

            var head = part[0];
            // Only rows of one unit share a key, except samples joining the waste stream (rung 4): those are summed in kg.
            var oneUnit = part.All(r => r.Source.Unit == head.Source.Unit);
            var decimals = Math.Max(part.Max(r => Decimals(r.Quantity)), oneUnit ? 0 : 3);
            var total = part.Sum(r => oneUnit ? Parse(r.Quantity) : Kg(r));
            var source = stream is null ? head.Source : head.Source with { Entry = "waste", Material = string.Empty, Stream = stream, Unit = oneUnit ? head.Source.Unit : "kg", Assay = string.Empty };
            merged.Add(new MutableRow(source, Format(total, decimals), stream is null ? head.Lot : string.Empty));
        }

        return merged;
    }

    private static double Kg(MutableRow row) => Parse(row.Quantity) * row.Source.Unit switch
    {
        "kg" => 1.0,
        "g" => 1e-3,
        "mg" => 1e-6,
        "t" => 1e3,
        _ => throw new InvalidOperationException($"template unit '{row.Source.Unit}' is not handled by the compaction"),
    };

    private static string Scale(string quantity, double factor) =>
        quantity.Length == 0 ? quantity : Format(Parse(quantity) * factor, Decimals(quantity));

    private static double Parse(string text) => double.Parse(text, NumberStyles.Float, CultureInfo.InvariantCulture);

    private static int Decimals(string text) => text.IndexOf('.', StringComparison.Ordinal) is var dot and >= 0 ? text.Length - dot - 1 : 0;

    private static string Format(double value, int decimals) =>
        value.ToString("F" + decimals.ToString(CultureInfo.InvariantCulture), CultureInfo.InvariantCulture);

    private sealed class MutableRow(ExportRow source, string quantity, string lot)
    {
        public ExportRow Source { get; } = source;
        public string Quantity { get; set; } = quantity;
        public string Lot { get; } = lot;
    }

    private sealed class Counter
    {
        public int Files;
        public int Batches;
        public long Rows;
        public int LowYield;
        public int Gap;
        public int Malformed;
    }
}
