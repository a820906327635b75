using System.Text;
using BatchReconcile.Records.Exports.Reading;

namespace BatchReconcile.Records.Tests.Exports;

/// <summary>Each kind of bad input the contract names: the file is rejected, and the error names the line and the column.</summary>
public class ExportReaderRejectionTests
{
    // One bad row on line 3, after a good row on line 2: the waste stream "mother liquor" of batch B1, step S1.
    // Columns: batch,recipe,recipe_version,step,entry,material,stream,quantity,unit,assay_pct,lot,recorded_at
    public static TheoryData<string, string, string, string> BadRows => new()
    {
        { "decimal comma", "B2,EST-7,1,S1,charge,NBA,,\"100,5\",kg,,,", "quantity", "use '.' as the decimal separator and no thousands separator" },
        { "thousands separator", "B2,EST-7,1,S1,charge,NBA,,\"1,234.5\",kg,,,", "quantity", "use '.' as the decimal separator and no thousands separator" },
        { "decimal comma in assay", "B2,EST-7,1,S1,charge,NBA,,100,kg,\"99,5\",,", "assay_pct", "decimal comma or thousands separator" },
        { "not a number", "B2,EST-7,1,S1,charge,NBA,,about 5,kg,,,", "quantity", "not a number" },
        { "unknown material", "B2,EST-7,1,S1,charge,NBX,,100,kg,,,", "material", "unknown material 'NBX'" },
        { "unknown recipe", "B2,EST-9,1,S1,charge,NBA,,100,kg,,,", "recipe", "unknown recipe 'EST-9'" },
        { "unknown step", "B2,EST-7,1,S9,charge,NBA,,100,kg,,,", "step", "has no step 'S9'" },
        { "step of another version", "B2,EST-7,1,S3,charge,BZC,,100,kg,,,", "step", "version 1 has no step 'S3'" },
        { "unknown recipe version", "B2,EST-7,7,S1,charge,NBA,,100,kg,,,", "recipe_version", "has no version 7" },
        { "recipe version not an integer", "B2,EST-7,1.0,S1,charge,NBA,,100,kg,,,", "recipe_version", "whole number" },
        { "bad unit", "B2,EST-7,1,S1,charge,NBA,,100,lbs,,,", "unit", "unknown unit 'lbs'" },
        { "unit missing", "B2,EST-7,1,S1,charge,NBA,,100,,,,", "unit", "unit is required" },
        { "negative quantity", "B2,EST-7,1,S1,charge,NBA,,-5,kg,,,", "quantity", "must not be negative" },
        { "NaN", "B2,EST-7,1,S1,charge,NBA,,NaN,kg,,,", "quantity", "not a finite number" },
        { "Infinity", "B2,EST-7,1,S1,charge,NBA,,Infinity,kg,,,", "quantity", "not a finite number" },
        { "-Infinity", "B2,EST-7,1,S1,charge,NBA,,-Infinity,kg,,,", "quantity", "not a finite number" },
        { "1e999", "B2,EST-7,1,S1,charge,NBA,,1e999,kg,,,", "quantity", "not a finite number" },
        { "exponent notation", "B2,EST-7,1,S1,charge,NBA,,1.5e3,kg,,,", "quantity", "exponent notation is not allowed" },
        { "quantity missing", "B2,EST-7,1,S1,charge,NBA,,,kg,,,", "quantity", "quantity is required on a charge row" },
        { "assay 0", "B2,EST-7,1,S1,charge,NBA,,100,kg,0,,", "assay_pct", "more than 0 and at most 100" },
        { "assay 101", "B2,EST-7,1,S1,charge,NBA,,100,kg,101,,", "assay_pct", "more than 0 and at most 100" },
        { "assay -5", "B2,EST-7,1,S1,charge,NBA,,100,kg,-5,,", "assay_pct", "more than 0 and at most 100" },
        { "assay NaN", "B2,EST-7,1,S1,charge,NBA,,100,kg,NaN,,", "assay_pct", "not a finite number" },
        { "assay without material", "B2,EST-7,1,S1,waste,,filtrate,100,kg,5,,", "assay_pct", "needs a material" },
        { "analysis naming no stream", "B1,EST-7,1,S1,analysis,ENB,,,,2.5,,", "stream", "must name the stream" },
        { "analysis naming a stream that does not exist", "B1,EST-7,1,S1,analysis,ENB,wash water,,,2.5,,", "stream", "has the stream 'wash water'" },
        { "analysis without assay", "B1,EST-7,1,S1,analysis,ENB,mother liquor,,,,,", "assay_pct", "assay_pct is required on an analysis row" },
        { "analysis with a quantity", "B1,EST-7,1,S1,analysis,ENB,mother liquor,5,,2.5,,", "quantity", "an analysis row has no quantity" },
        { "analysis without material", "B1,EST-7,1,S1,analysis,,mother liquor,,,2.5,,", "material", "material is required on an analysis row" },
        { "charge without material", "B2,EST-7,1,S1,charge,,,100,kg,,,", "material", "material is required on a charge row" },
        { "unknown entry", "B2,EST-7,1,S1,feed,NBA,,100,kg,,,", "entry", "charge, product, waste, recovered, sample or analysis" },
        { "batch missing", ",EST-7,1,S1,charge,NBA,,100,kg,,,", "batch", "batch is required" },
        { "time without offset", "B2,EST-7,1,S1,charge,NBA,,100,kg,,,2026-11-24T14:05:00", "recorded_at", "needs a UTC offset, e.g. +01:00" },
        { "time not ISO 8601", "B2,EST-7,1,S1,charge,NBA,,100,kg,,,24/11/2026 14:05", "recorded_at", "not an ISO 8601 date and time" },
        { "row with a field too many", "B2,EST-7,1,S1,charge,NBA,,100,5,kg,,,", "", "has 13 fields but the header has 12" },
        { "stray quote", "B2,EST-7,1,S1,charge,NBA,,100,kg,,L\"7,", "", "a quote (\") inside an unquoted field" },
    };

    [Theory]
    [MemberData(nameof(BadRows))]
    public void A_bad_row_rejects_the_file_naming_line_and_column(string kind, string badRow, string column, string reason)
    {
        var text = ExportCsv.File(ExportCsv.GoodBatch("B1")[3], badRow);

        var result = ExportCsv.Read(text);

        Assert.False(result.IsValid, kind);
        Assert.Empty(result.Batches);
        var error = Assert.Single(result.Errors);
        Assert.Equal(ExportCsv.FileName, error.File);
        Assert.Equal(3, error.Line);
        Assert.Equal(column, error.Column);
        Assert.Contains(reason, error.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void The_error_carries_the_value_as_found()
    {
        var result = ExportCsv.Read(ExportCsv.File("B2,EST-7,1,S1,charge,NBA,,\"1,234.5\",kg,,,"));

        var error = Assert.Single(result.Errors);
        Assert.Equal("1,234.5", error.Value);
        Assert.Equal("export.csv:2, column quantity ('1,234.5'): " + error.Reason, error.ToString());
    }

    [Fact]
    public void An_unquoted_decimal_comma_shifts_the_fields_and_is_reported_on_its_line()
    {
        // 100,5 without quotes is two fields: the row no longer fits the header.
        var result = ExportCsv.Read(ExportCsv.File("B2,EST-7,1,S1,charge,NBA,,100,5,kg,,,"));

        var error = Assert.Single(result.Errors);
        Assert.Equal(2, error.Line);
        Assert.Contains("must be in double quotes", error.Reason, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("batch;recipe;step;entry;material;quantity;unit\nB1;EST-7;S1;charge;NBA;100,5;kg\n")]
    [InlineData("batch;recipe;step;entry;material;quantity;unit\r\nB1;EST-7;S1;charge;NBA;100;kg\r\nB1;EST-7;S1;product;ENB;98,2;kg\r\n")]
    // A semicolon file whose quoted header names contain commas still does not have the required columns.
    [InlineData("\"batch,id\";recipe;step;entry\nB1;EST-7;S1;charge\n")]
    public void A_semicolon_delimited_file_gets_one_error_on_line_1(string text)
    {
        var result = ExportCsv.Read(text);

        var error = Assert.Single(result.Errors);
        Assert.Equal(1, error.Line);
        Assert.Contains("delimiter is a semicolon", error.Reason, StringComparison.Ordinal);
        Assert.Contains("re-export the file with ','", error.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Broken_quoting_in_a_comma_header_is_reported_on_line_1()
    {
        var result = ExportCsv.Read("batch,recipe,step,entry,quantity,unit,mate\"rial\nB1,EST-7,S1,sample,1,kg,\n");

        var error = Assert.Single(result.Errors);
        Assert.Equal((1, ""), (error.Line, error.Column));
        Assert.Contains("header: a quote", error.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Missing_required_columns_are_each_named()
    {
        var result = ExportCsv.Read("batch,recipe,material,quantity,unit\nB1,EST-7,NBA,100,kg\n");

        Assert.Equal(["step", "entry"], result.Errors.Select(e => e.Column));
        Assert.All(result.Errors, e => Assert.Equal(1, e.Line));
        Assert.All(result.Errors, e => Assert.Contains("is missing from the header", e.Reason, StringComparison.Ordinal));
    }

    [Fact]
    public void A_duplicate_column_is_an_error_even_in_another_case()
    {
        var result = ExportCsv.Read("batch,recipe,step,entry,material,quantity,unit,Quantity\nB1,EST-7,S1,charge,NBA,100,kg,100\n");

        var error = Assert.Single(result.Errors);
        Assert.Equal((1, "quantity"), (error.Line, error.Column));
        Assert.Contains("appears twice (columns 6 and 8)", error.Reason, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("")]
    [InlineData("\uFEFF")]
    public void An_empty_file_is_rejected(string text)
    {
        var error = Assert.Single(ExportCsv.Read(text).Errors);
        Assert.Contains("no data rows", error.Reason, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData(ExportCsv.Header)]
    [InlineData(ExportCsv.Header + "\r\n")]
    [InlineData(ExportCsv.Header + "\n\n,,,,,,,,,,,\n")]
    public void A_header_without_rows_is_rejected(string text)
    {
        var error = Assert.Single(ExportCsv.Read(text).Errors);
        Assert.Equal(1, error.Line);
        Assert.Contains("no data rows", error.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void A_batch_with_two_recipes_is_rejected_on_the_row_that_changes_it()
    {
        var text = ExportCsv.File(
            "B1,EST-7,1,S1,charge,NBA,,100,kg,,,",
            "B1,EST-7,1,S1,product,ENB,,108,kg,,,",
            "B1,DEP-3,1,D1,charge,BOCBA,,50,kg,,,");

        var error = Assert.Single(ExportCsv.Read(text).Errors);
        Assert.Equal((4, "recipe"), (error.Line, error.Column));
        Assert.Contains("recorded with recipe EST-7 version 1 on line 2", error.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void A_batch_with_two_versions_of_its_recipe_is_rejected()
    {
        // A row without a version takes the one its batch states (line 3); two stated versions disagree (line 4).
        var text = ExportCsv.File(
            "B1,EST-7,1,S1,charge,NBA,,100,kg,,,",
            "B1,EST-7,,S1,charge,ETOH,,400,kg,,,",
            "B1,EST-7,2,S1,product,ENB,,108,kg,,,");

        var error = Assert.Single(ExportCsv.Read(text).Errors);
        Assert.Equal((4, "recipe_version"), (error.Line, error.Column));
        Assert.Contains("this row says EST-7 version 2", error.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void One_bad_batch_among_good_ones_rejects_the_whole_file_and_only_it_is_named()
    {
        var rows = new List<string>();
        rows.AddRange(ExportCsv.GoodBatch("B1"));                          // lines 2-6
        rows.Add("B2,EST-7,1,S1,charge,NBA,,\"100,5\",kg,,,");              // line 7
        rows.Add("B2,EST-7,1,S1,charge,ETOH,,400,kg,,,");                  // line 8
        rows.Add("B2,EST-7,1,S1,product,EBN,,108,kg,,,");                  // line 9
        rows.AddRange(ExportCsv.GoodBatch("B3"));                          // lines 10-14

        var result = ExportCsv.Read(ExportCsv.File(rows));

        Assert.Empty(result.Batches);
        Assert.Equal([(7, "quantity"), (9, "material")], result.Errors.Select(e => (e.Line, e.Column)));
    }

    [Fact]
    public void Every_problem_in_a_file_is_reported_not_only_the_first()
    {
        var rows = new List<string>();
        for (var i = 0; i < 40; i++)
        {
            rows.Add($"B{i % 4},EST-7,1,S1,charge,NBA,,{i}.5.1,kg,,,");      // line i + 2: bad quantity
        }

        rows.Add("B9,EST-7,1,S1,charge,NBA,,100,kg,150,,2026-11-24 08:00"); // line 42: assay and time
        rows.Add("B9,EST-9,1,S1,charge,XX,,100,oz,,,");                     // line 43: recipe, material, unit

        var result = ExportCsv.Read(ExportCsv.File(rows));

        var expected = Enumerable.Range(2, 40).Select(l => (l, "quantity"))
            .Concat([(42, "assay_pct"), (42, "recorded_at"), (43, "recipe"), (43, "material"), (43, "unit")]);
        Assert.Equal(expected, result.Errors.Select(e => (e.Line, e.Column)));
    }

    [Fact]
    public void The_error_list_is_capped_with_a_count_of_the_rest()
    {
        var rows = Enumerable.Range(0, ExportReader.MaxErrors + 234).Select(i => "B1,EST-7,1,S1,charge,NBA,,x,kg,,,");

        var result = ExportCsv.Read(ExportCsv.File(rows));

        Assert.Equal(ExportReader.MaxErrors + 1, result.Errors.Count);
        Assert.Equal(ExportReader.MaxErrors + 1, result.Errors[^2].Line);
        Assert.Equal((0, "", "... and 234 more problems not listed (only the first 1000 are)"),
            (result.Errors[^1].Line, result.Errors[^1].Column, result.Errors[^1].Reason));
    }

    [Fact]
    public void Lines_count_the_line_breaks_inside_quoted_fields()
    {
        var text = string.Join("\n",
            ExportCsv.Header + ",remark",
            "B1,EST-7,1,S1,waste,,mother liquor,380,kg,,,,\"first\r\nand washes\"", // lines 2-3
            "B1,EST-7,1,S1,charge,NBA,,\"a\nb\nc\",kg,,,,",                          // lines 4-6
            "B1,EST-7,1,S1,charge,NBA,,-1,kg,,,,") + "\n";                        // line 7

        var result = ExportCsv.Read(text);

        Assert.Equal([(4, "quantity"), (7, "quantity")], result.Errors.Select(e => (e.Line, e.Column)));
    }

    [Fact]
    public void Bytes_that_are_not_UTF_8_are_an_error()
    {
        // "Lot µ7" written in Latin-1 (0xB5 is not valid UTF-8 on its own).
        var bytes = Encoding.UTF8.GetBytes(ExportCsv.File("B1,EST-7,1,S1,charge,NBA,,100,kg,,L\u00B57,"));
        var at = Array.IndexOf(bytes, (byte)0xC2);
        var latin1 = bytes.Take(at).Concat(bytes.Skip(at + 1)).ToArray();

        var error = Assert.Single(ExportCsv.Read(latin1).Errors);
        Assert.Equal((2, "lot"), (error.Line, error.Column));
        Assert.Contains("not valid UTF-8", error.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void An_unterminated_quote_is_reported_where_it_starts()
    {
        var text = ExportCsv.File(
            "B1,EST-7,1,S1,charge,NBA,,100,kg,,,",
            "B1,EST-7,1,S1,charge,ETOH,,400,kg,,\"L-9,",
            "B1,EST-7,1,S1,product,ENB,,108,kg,,,");

        var error = Assert.Single(ExportCsv.Read(text).Errors);
        Assert.Equal(3, error.Line);
        Assert.Contains("never closed", error.Reason, StringComparison.Ordinal);
    }
}
