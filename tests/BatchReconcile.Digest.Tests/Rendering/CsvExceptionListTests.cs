using System.Globalization;
using BatchReconcile.Digest.Model;
using BatchReconcile.Digest.Rendering;
using BatchReconcile.Digest.Tests.Support;
using BatchReconcile.Records.Definitions;
using CsvHelper;

namespace BatchReconcile.Digest.Tests.Rendering;

public class CsvExceptionListTests
{
    [Fact]
    public void Reading_the_csv_back_gives_every_flag_in_order_with_the_numbers_as_the_page_shows_them()
    {
        var data = SeededDigest.Create();
        var csv = CsvExceptionList.Render(data);
        var expected = ExceptionOrder.Sort(data.Exceptions);

        using var reader = CsvReader.Create(new StringReader(csv), CsvReaderOptions.Default with { Separator = ',' });
        Assert.Equal(CsvExceptionList.Columns, reader.Headers);
        var i = 0;
        while (reader.Read())
        {
            var e = expected[i++];
            Assert.Equal(e.FlagId, reader.Parse<long>("flag_id"));
            Assert.Equal(e.Severity.ToText(), reader.GetString("severity"));
            Assert.Equal(e.BatchId, reader.GetString("batch"));
            Assert.Equal(e.Revision, reader.Parse<int>("revision"));
            Assert.Equal(e.Recipe, reader.GetString("recipe"));
            Assert.Equal(e.Step, reader.GetString("step"));
            Assert.Equal(e.Code.ToText(), reader.GetString("code"));
            Assert.Equal(e.Subject ?? string.Empty, reader.GetString("subject"));
            Assert.Equal(DigestText.Rounded(e.Measured, e.Unit), reader.Parse<double>("measured"));
            Assert.Equal(DigestText.Rounded(e.Limit, e.Unit), reader.Parse<double>("limit"));
            Assert.Equal(e.Unit, reader.GetString("unit"));
            Assert.Equal(e.Message, reader.GetString("message"));
            Assert.Equal(e.Review.ToText(), reader.GetString("review_state"));
            Assert.Equal(e.Review.DeviationRef ?? string.Empty, reader.GetString("deviation_ref"));
            Assert.Equal(e.Review.By ?? string.Empty, reader.GetString("reviewed_by"));
        }

        Assert.Equal(expected.Count, i);
    }

    [Fact]
    public void Negative_numbers_stay_numbers_and_text_starting_with_a_minus_is_neutralised()
    {
        var data = SeededDigest.Create();
        var row = CsvExceptionList.Render(data).Split("\r\n").Single(l => l.StartsWith("107,", StringComparison.Ordinal));
        Assert.Contains(",-6.3,4,kg,", row, StringComparison.Ordinal);

        var dashed = new DigestData(data.SiteName, data.Day, data.GeneratedAt, 1, 1, 0, [],
            [new DigestException(1, FlagSeverity.Major, "-B7", 1, "PX-204", "S1", FlagCode.BalanceGap, -0.5, 1, "kg", "-1 kg", ReviewStatus.Open)], [], []);
        var line = CsvExceptionList.Render(dashed).Split("\r\n")[1];
        Assert.Equal("1,major,\"'-B7\",1,PX-204,S1,balance-gap,,-0.5,1,kg,\"'-1 kg\",open,,", line);
    }

    [Fact]
    public void Numbers_use_the_invariant_culture_whatever_the_thread_culture()
    {
        var data = SeededDigest.Create();
        var before = CultureInfo.CurrentCulture;
        try
        {
            // InvariantGlobalization is on for the build, so only the invariant culture exists; a culture with a
            // decimal comma is made by hand to see that it is not used.
            var comma = (CultureInfo)CultureInfo.InvariantCulture.Clone();
            comma.NumberFormat.NumberDecimalSeparator = ",";
            CultureInfo.CurrentCulture = comma;
            Assert.Contains(",81.4,88,%,", CsvExceptionList.Render(data), StringComparison.Ordinal);
            Assert.Contains("81.4 % against 88.0 %", HtmlDigestRenderer.Render(data), StringComparison.Ordinal);
        }
        finally
        {
            CultureInfo.CurrentCulture = before;
        }
    }
}
