using System.Text;
using BatchReconcile.Records.Exports;
using BatchReconcile.Records.Exports.Reading;

namespace BatchReconcile.Records.Tests.Exports;

/// <summary>Files the contract allows are read, with every value where the contract puts it.</summary>
public class ExportReaderAcceptanceTests
{
    [Fact]
    public void A_clean_batch_is_read_row_by_row()
    {
        var result = ExportCsv.Read(ExportCsv.File(ExportCsv.GoodBatch("AP-2611-014")));

        Assert.True(result.IsValid, string.Join("\n", result.Errors));
        var batch = Assert.Single(result.Batches);
        Assert.Equal(("AP-2611-014", "EST-7", 1), (batch.BatchId, batch.RecipeCode, batch.RecipeVersion));
        Assert.Equal([2, 3, 4, 5, 6], batch.Rows.Select(r => r.Line));
        Assert.Equal(
            [EntryKind.Charge, EntryKind.Charge, EntryKind.Product, EntryKind.Waste, EntryKind.Analysis],
            batch.Rows.Select(r => r.Entry));
        Assert.Empty(batch.Warnings);

        var charge = batch.Rows[0];
        Assert.Equal(("NBA", 100.0, 100.0, 99.5, "L-1"), (charge.Material, charge.Quantity, charge.QuantityKg, charge.AssayPct, charge.Lot));
        Assert.Equal(new DateTimeOffset(2026, 11, 24, 8, 0, 0, TimeSpan.FromHours(1)), charge.RecordedAt);
        Assert.Equal(99.5, charge.MaterialKg, 12);

        var waste = batch.Rows[3];
        Assert.Equal(("mother liquor", (string?)null, (double?)null), (waste.Stream, waste.Material, waste.AssayPct));

        var analysis = batch.Rows[4];
        Assert.Equal(("ENB", "mother liquor", (double?)null, (MassUnit?)null, 2.5),
            (analysis.Material, analysis.Stream, analysis.QuantityKg, analysis.Unit, analysis.AssayPct));
    }

    [Fact]
    public void A_UTF_8_BOM_and_CRLF_line_ends_are_read()
    {
        var text = "\uFEFF" + string.Join("\r\n", [ExportCsv.Header, .. ExportCsv.GoodBatch("B1")]) + "\r\n";
        var bytes = Encoding.UTF8.GetBytes(text);
        Assert.Equal(0xEF, bytes[0]);

        var batch = Assert.Single(ExportCsv.Read(bytes).Batches);

        Assert.Equal("B1", batch.BatchId);
        Assert.Equal([2, 3, 4, 5, 6], batch.Rows.Select(r => r.Line));
        Assert.Equal("batch", batch.Rows[0].Raw[0].Key);
        Assert.All(batch.Rows, r => Assert.DoesNotContain(r.Raw, kv => kv.Value.Contains('\r', StringComparison.Ordinal)));
        Assert.Equal(new DateTimeOffset(2026, 11, 24, 8, 0, 0, TimeSpan.FromHours(1)), batch.Rows[0].RecordedAt);
    }

    [Fact]
    public void Quoted_fields_may_hold_commas_quotes_and_line_breaks()
    {
        // Line breaks only in a column of free text (here an unknown one): identifiers may not hold them.
        var text = string.Join("\n",
            ExportCsv.Header + ",remark",
            "B1,EST-7,1,S1,charge,NBA,,100,kg,,\"L-7, drum 2\",,\"drum 2\nof 3\"",       // lines 2-3
            "B1,EST-7,1,S1,waste,,\"mother liquor, \"\"first\"\" crop\",380,kg,,,,", // line 4
            "B1,EST-7,1,S1,analysis,ENB,\" Mother Liquor, \"\"First\"\" Crop \",,,2.5,,,") + "\n"; // line 5

        var result = ExportCsv.Read(text);

        Assert.True(result.IsValid, string.Join("\n", result.Errors));
        var rows = Assert.Single(result.Batches).Rows;
        Assert.Equal([2, 4, 5], rows.Select(r => r.Line));
        Assert.Equal("L-7, drum 2", rows[0].Lot);
        Assert.Equal("drum 2\nof 3", rows[0].Raw[^1].Value);
        Assert.Equal("mother liquor, \"first\" crop", rows[1].Stream);
    }

    [Fact]
    public void Column_order_case_and_surrounding_whitespace_are_free()
    {
        var text = " Quantity ,UNIT,Entry,\tmaterial ,Step,Recipe,BATCH\n" +
                   "12.5,KG,CHARGE,nba,s1,est-7,B1\n" +
                   "13.1,kg,Product,Enb,S1,EST-7,B1\n";

        var result = ExportCsv.Read(text);

        Assert.True(result.IsValid, string.Join("\n", result.Errors));
        var batch = Assert.Single(result.Batches);
        Assert.Equal(("EST-7", 2), (batch.RecipeCode, batch.RecipeVersion));
        // Codes come back as the process definitions spell them; the raw row keeps the text as read.
        Assert.Equal(("NBA", "S1", "EST-7", 12.5), (batch.Rows[0].Material, batch.Rows[0].Step, batch.Rows[0].Recipe, batch.Rows[0].QuantityKg));
        Assert.Equal([("Quantity", "12.5"), ("UNIT", "KG"), ("Entry", "CHARGE"), ("material", "nba"), ("Step", "s1"), ("Recipe", "est-7"), ("BATCH", "B1")],
            batch.Rows[0].Raw.Select(kv => (kv.Key, kv.Value)));
    }

    // Exact factors: gram, milligram and tonne by the SI (BIPM SI Brochure, 9th ed. 2019, tonne in Table 8);
    // the avoirdupois pound is 0.45359237 kg exactly (international yard and pound agreement, 1959).
    [Theory]
    [InlineData("kg", "250", 250.0)]
    [InlineData("g", "1500", 1.5)]
    [InlineData("mg", "250000", 0.25)]
    [InlineData("t", "1.2", 1200.0)]
    [InlineData("lb", "10", 4.5359237)]
    [InlineData("lb", "1", 0.45359237)]
    [InlineData("LB", "100", 45.359237)]
    [InlineData(" Mg ", "2", 0.000002)]
    public void Units_are_converted_to_kilograms(string unit, string quantity, double expectedKg)
    {
        var result = ExportCsv.Read(ExportCsv.File($"B1,EST-7,1,S1,charge,NBA,,{quantity},{unit},,,"));

        var row = Assert.Single(Assert.Single(result.Batches).Rows);
        Assert.Equal(expectedKg, row.QuantityKg!.Value, expectedKg * 1e-15);
        Assert.Equal(double.Parse(quantity, System.Globalization.CultureInfo.InvariantCulture), row.Quantity);
        Assert.Equal(unit.Trim(), row.Unit!.Symbol, ignoreCase: true);
    }

    [Theory]
    [InlineData("", 2, null, RecipeVersionSource.Newest)]
    [InlineData("2", 2, 2, RecipeVersionSource.Export)]
    [InlineData("1", 1, 1, RecipeVersionSource.Export)]
    public void Without_a_recipe_version_and_without_effective_dates_the_newest_is_used_and_said(string version, int expected, int? given, RecipeVersionSource source)
    {
        var result = ExportCsv.Read(ExportCsv.File(
            $"B1,EST-7,{version},S2,charge,ENB,,100,kg,,,",
            $"B1,EST-7,{version},S2,product,BZC,,70,kg,,,"));

        var batch = Assert.Single(result.Batches);
        Assert.Equal(expected, batch.RecipeVersion);
        Assert.Equal(source, batch.RecipeVersionSource);
        Assert.All(batch.Rows, r => Assert.Equal(given, r.RecipeVersion));
    }

    [Fact]
    public void A_step_of_the_newest_version_is_found_without_a_version()
    {
        var result = ExportCsv.Read(ExportCsv.File("B1,EST-7,,S3,charge,BZC,,100,kg,,,"));

        Assert.Equal(2, Assert.Single(result.Batches).RecipeVersion);
    }

    [Fact]
    public void Unknown_columns_are_kept_and_give_a_warning_on_every_batch()
    {
        var text = "batch,recipe,step,entry,material,operator,quantity,unit,shift\n" +
                   "B1,DEP-3,D1,charge,BOCBA,J. Smith,50,kg,night\n" +
                   "B2,DEP-3,D1,charge,BOCBA,A. Jones,40,kg,day\n";

        var result = ExportCsv.Read(text);

        Assert.Equal(2, result.Batches.Count);
        Assert.All(result.Batches, b => Assert.Equal(["unknown column 'operator' ignored", "unknown column 'shift' ignored"], b.Warnings));
        Assert.Contains(new KeyValuePair<string, string>("operator", "A. Jones"), result.Batches[1].Rows[0].Raw);
    }

    [Fact]
    public void Several_batches_come_back_in_order_of_first_appearance_even_when_interleaved()
    {
        var text = ExportCsv.File(
            "B2,DEP-3,1,D1,charge,BOCBA,,50,kg,,,",      // line 2
            "B1,EST-7,1,S1,charge,NBA,,100,kg,,,",       // line 3
            "B2,DEP-3,1,D1,charge,DCM,,300,kg,,,",       // line 4
            "B3,EST-7,1,S2,charge,ENB,,80,kg,,,",        // line 5
            "B1,EST-7,1,S1,product,ENB,,108,kg,,,",      // line 6
            "B2,DEP-3,1,D1,product,BNA,,20.1,kg,,,");    // line 7

        var result = ExportCsv.Read(text);

        Assert.Equal(["B2", "B1", "B3"], result.Batches.Select(b => b.BatchId));
        Assert.Equal([[2, 4, 7], [3, 6], [5]], result.Batches.Select(b => b.Rows.Select(r => r.Line).ToArray()));
        Assert.Equal(["DEP-3", "EST-7", "EST-7"], result.Batches.Select(b => b.RecipeCode));
    }

    [Fact]
    public void An_analysis_may_come_before_the_row_of_its_stream()
    {
        var result = ExportCsv.Read(ExportCsv.File(
            "B1,EST-7,1,S1,analysis,ENB,Mother Liquor ,,,2.5,,",
            "B1,EST-7,1,S1,waste,,mother liquor,380,kg,,,"));

        Assert.True(result.IsValid, string.Join("\n", result.Errors));
    }

    [Fact]
    public void An_analysis_of_a_stream_of_another_step_is_rejected()
    {
        var result = ExportCsv.Read(ExportCsv.File(
            "B1,EST-7,1,S1,waste,,mother liquor,380,kg,,,",
            "B1,EST-7,1,S2,analysis,BZC,mother liquor,,,1.5,,"));

        var error = Assert.Single(result.Errors);
        Assert.Equal((3, "stream"), (error.Line, error.Column));
    }

    [Theory]
    [InlineData("2026-11-24T14:05:00+01:00", "2026-11-24T13:05:00Z")]
    [InlineData("2026-11-24T14:05+01:00", "2026-11-24T13:05:00Z")]
    [InlineData("2026-11-24T13:05:00Z", "2026-11-24T13:05:00Z")]
    [InlineData("2026-11-24T13:05:00.250-05:00", "2026-11-24T18:05:00.25Z")]
    public void Times_with_a_UTC_offset_are_read(string text, string utc)
    {
        var result = ExportCsv.Read(ExportCsv.File($"B1,EST-7,1,S1,charge,NBA,,100,kg,,,{text}"));

        var row = Assert.Single(Assert.Single(result.Batches).Rows);
        Assert.Equal(DateTimeOffset.Parse(utc, System.Globalization.CultureInfo.InvariantCulture), row.RecordedAt);
    }

    [Theory]
    [InlineData("0", 0.0)]
    [InlineData("-0", 0.0)]
    [InlineData("+12.5", 12.5)]
    [InlineData(".5", 0.5)]
    [InlineData("7.", 7.0)]
    [InlineData(" 12.25 ", 12.25)]
    public void Plain_decimal_numbers_are_read(string text, double expected)
    {
        var result = ExportCsv.Read(ExportCsv.File($"B1,EST-7,1,S1,sample,,,{text},kg,,,"));

        Assert.Equal(expected, Assert.Single(Assert.Single(result.Batches).Rows).QuantityKg);
    }

    [Fact]
    public void A_file_is_read_from_a_path()
    {
        var path = Path.Combine(Path.GetTempPath(), $"export-{Guid.NewGuid():N}.csv");
        try
        {
            File.WriteAllText(path, ExportCsv.File([.. ExportCsv.GoodBatch("B1"), .. ExportCsv.GoodBatch("B2")]), new UTF8Encoding(true));

            var result = ExportReader.Read(path, "B.csv", TestCatalog.Instance, TimeZoneInfo.Utc);

            Assert.Equal(["B1", "B2"], result.Batches.Select(b => b.BatchId));
            Assert.Equal("B.csv", result.FileName);
        }
        finally
        {
            File.Delete(path);
        }
    }
}
