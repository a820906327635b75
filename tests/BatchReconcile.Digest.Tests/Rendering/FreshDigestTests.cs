using System.Globalization;
using System.Xml.Linq;
using BatchReconcile.Digest.Files;
using BatchReconcile.Digest.Model;
using BatchReconcile.Digest.Rendering;
using BatchReconcile.Digest.Tests.Support;
using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Records.Definitions;
using CsvHelper;

namespace BatchReconcile.Digest.Tests.Rendering;

/// <summary>Issue 9: a rewrite says what it replaces; provisional digests say so; the review column and CSV numbers are what QA reads.</summary>
public class FreshDigestTests
{
    private static readonly DateTimeOffset FirstIssue = new(2026, 11, 26, 7, 30, 0, TimeSpan.FromHours(1));

    [Fact]
    public void A_rewrite_says_at_its_top_which_issue_it_replaces_when_that_was_written_why_and_where_it_is_kept()
    {
        var data = SeededDigest.Create() with { Reissue = new DigestIssue(2, FirstIssue, "2 batches arrived since that issue") };
        const string Expected = "Issue 2: replaces issue 1 written 2026-11-26 07:30 UTC+01:00 (kept as digest-2026-11-25-north-plant.1.{0}). "
            + "Why: 2 batches arrived since that issue.";

        var html = HtmlDigestRenderer.Render(data);
        var md = MarkdownDigestRenderer.Render(data);

        var notice = html.IndexOf("<p class=\"notice\" id=\"reissue\">" + string.Format(CultureInfo.InvariantCulture, Expected, "html") + "</p>", StringComparison.Ordinal);
        Assert.True(notice > 0 && notice < html.IndexOf("id=\"exceptions\"", StringComparison.Ordinal), "the notice stands at the top, before the exceptions");
        var lines = md.Split('\n');
        Assert.Equal("> " + MarkdownDigestRenderer.E(string.Format(CultureInfo.InvariantCulture, Expected, "md")), lines[2]);

        // A first issue says nothing of the kind.
        Assert.DoesNotContain("id=\"reissue\"", HtmlDigestRenderer.Render(SeededDigest.Create()), StringComparison.Ordinal);
        Assert.DoesNotContain("replaces issue", MarkdownDigestRenderer.Render(SeededDigest.Create()), StringComparison.Ordinal);
    }

    [Fact]
    public void A_provisional_digest_says_so_in_its_title_and_under_it_and_has_names_of_its_own()
    {
        var data = SeededDigest.Create() with { Provisional = true };

        var html = HtmlDigestRenderer.Render(data);
        var md = MarkdownDigestRenderer.Render(data);

        Assert.Contains("<title>Provisional daily exception digest 2026-11-25, North Plant</title>", html, StringComparison.Ordinal);
        Assert.Contains("<h1>Provisional daily exception digest</h1>", html, StringComparison.Ordinal);
        Assert.Contains("id=\"provisional\">Provisional: written 2026-11-26 07:30 UTC+01:00, before the production day ended (2026-11-26 06:00 UTC+01:00).", html, StringComparison.Ordinal);
        Assert.StartsWith("# Provisional daily exception digest: 2026-11-25, North Plant\n", md, StringComparison.Ordinal);

        var names = DigestFileNames.ProvisionalFor(SeededDigest.Day, "North Plant");
        Assert.Equal(["digest-2026-11-25-north-plant.provisional.html", "digest-2026-11-25-north-plant.provisional.md", "digest-2026-11-25-north-plant.provisional.csv"], names.All);
        Assert.Empty(names.All.Intersect(DigestFileNames.For(SeededDigest.Day, "North Plant").All));
        Assert.Equal(["digest-2026-11-25-north-plant.3.html", "digest-2026-11-25-north-plant.3.md", "digest-2026-11-25-north-plant.3.csv"],
            DigestFileNames.For(SeededDigest.Day, "North Plant").Numbered(3).All);
    }

    [Fact]
    public void The_review_column_shows_the_deviation_reference_and_who_decided_in_html_markdown_and_csv()
    {
        var seeded = SeededDigest.Create();
        var decided = seeded.Exceptions.Select(e => e.FlagId switch
        {
            101 => e with { Review = new ReviewStatus(ReviewState.Closed, CloseOutcome.Deviation, "DEV-2026-0142", "A. Chen") },
            102 => e with { Review = new ReviewStatus(ReviewState.InReview, By: "B. Okafor") },
            _ => e,
        }).ToList();
        var data = seeded with { Exceptions = decided };

        var html = HtmlDigestRenderer.Render(data);
        Assert.Contains("<td class=\"review\">closed: deviation DEV-2026-0142, by A. Chen</td>", html, StringComparison.Ordinal);
        Assert.Contains("<td class=\"review\">in-review, by B. Okafor</td>", html, StringComparison.Ordinal);
        Assert.Contains("<td class=\"review\">open</td>", html, StringComparison.Ordinal);
        var md = MarkdownDigestRenderer.Render(data);
        Assert.Contains("| closed: deviation DEV-2026-0142, by A. Chen |", md, StringComparison.Ordinal);

        using var reader = CsvReader.Create(new StringReader(CsvExceptionList.Render(data)), CsvReaderOptions.Default with { Separator = ',' });
        var rows = new Dictionary<long, (string State, string Ref, string By)>();
        while (reader.Read())
        {
            rows[reader.Parse<long>("flag_id")] = (reader.GetString("review_state"), reader.GetString("deviation_ref"), reader.GetString("reviewed_by"));
        }

        Assert.Equal(("closed: deviation", "DEV-2026-0142", "A. Chen"), rows[101]);
        Assert.Equal(("in-review", string.Empty, "B. Okafor"), rows[102]);
        Assert.Equal(("open", string.Empty, string.Empty), rows[103]);
    }

    // Values a float sum leaves just below the half (76.55 computed as 76.54999999999995) and plain ones; the CSV
    // holds what the page prints, as a number. Rounding rule: docs/digest.md (half away from zero, % to 0.1,
    // kg to 0.01 below 100 kg and 0.1 from 100 kg, equivalents to 0.01).
    [Theory]
    [InlineData(76.54999999999995, "%", "76.5", "76.5 %")]
    [InlineData(88.0, "%", "88", "88.0 %")]
    [InlineData(167.54999999999998, "kg", "167.5", "167.5 kg")]
    [InlineData(12.3456, "kg", "12.35", "12.35 kg")]
    [InlineData(-0.004, "kg", "0", "0.00 kg")]
    [InlineData(1.3249999999999997, "equiv", "1.32", "1.32 equiv")]
    public void The_csv_writes_numbers_rounded_as_the_page_shows_them(double measured, string unit, string csv, string page)
    {
        var seeded = SeededDigest.Create();
        var one = seeded with
        {
            Exceptions = [new DigestException(1, FlagSeverity.Major, "B-1", 1, "PX-204", "S1", FlagCode.BalanceGap, measured, null, unit, "x", ReviewStatus.Open)],
        };

        var line = CsvExceptionList.Render(one).Split("\r\n")[1];
        Assert.Equal($"1,major,B-1,1,PX-204,S1,balance-gap,,{csv},,{unit},x,open,,", line);
        Assert.Contains(">" + page + "<", HtmlDigestRenderer.Render(one), StringComparison.Ordinal);
    }

    [Fact]
    public void A_flagged_rung_stays_visible_when_the_solvent_dominates_the_charge()
    {
        // 2000 kg charged of which 1700 kg solvent not recovered; product-in-waste 1.6 kg: on the full scale it
        // would be 1.6/2000 of 260 px, about 0.2 px. Made-up figures that add up as docs/computation.md defines.
        var outcome = Steps.Outcome("S2", massIn: 2000, reactant: 300, recovered: 0, stoich: 280, theory: 200, actual: 180,
            inWaste: 1.6, inSamples: 0.2, massOut: 1990, vented: 4, ventedMax: 5, u: 2);
        var seeded = SeededDigest.Create();
        var flag = new DigestException(1, FlagSeverity.Minor, "B-7", 1, "PX-204", "S2", FlagCode.ProductInWaste, 0.8, 0.5, "%", "product in the mother liquor", ReviewStatus.Open);
        var data = seeded with { Exceptions = [flag], FlaggedSteps = [new FlaggedStep("B-7", 1, "PX-204", Steps.Judged(outcome, 2, 1))], Yields = [] };

        var charts = Html.SvgFragments(HtmlDigestRenderer.Render(data)).Select(Html.ParseSvg).ToList();
        var full = charts.Single(c => (string?)c.Attribute("data-panel") == "all");
        var reaction = charts.Single(c => (string?)c.Attribute("data-panel") == "reaction");

        var inFull = Rung(full, "yield-loss-product-in-waste");
        var inReaction = Rung(reaction, "yield-loss-product-in-waste");
        Assert.True(Width(inFull) < 6, "on the full scale the rung is a sliver, which is why the second panel is drawn");
        Assert.Equal("true", (string?)inReaction.Attribute("data-flagged"));
        // In the second panel 1.6 kg of a 300 kg axis over 260 px is about 1.4 px, drawn at the 4 px minimum; the value is printed beside it.
        Assert.True(Width(inReaction) >= 4, $"flagged rung drawn {Width(inReaction)} px wide");
        Assert.Contains(reaction.Descendants(), e => e.Name.LocalName == "text" && e.Value == "flag: yield loss: product found in waste streams");
        Assert.Contains(reaction.Descendants(), e => e.Name.LocalName == "text" && e.Value == "1.6 kg (0.1 %)");
        Assert.DoesNotContain(reaction.Descendants(), e => (string?)e.Attribute("data-rung") == "auxiliaries-not-recovered");
        Assert.Equal("false", (string?)Rung(reaction, "co-products").Attribute("data-flagged"));
    }

    [Fact]
    public void A_step_whose_rungs_read_well_on_the_full_scale_gets_no_second_panel()
    {
        // Solvent 100 of 400 kg, the flagged yield-loss rungs 20 and 10 kg: every rung wider than 6 px.
        var outcome = Steps.Outcome("S1", massIn: 400, reactant: 300, recovered: 0, stoich: 280, theory: 200, actual: 170,
            inWaste: 20, inSamples: 0, massOut: 396, vented: 0, ventedMax: 0, u: 1);
        var seeded = SeededDigest.Create();
        var flag = new DigestException(1, FlagSeverity.Major, "B-8", 1, "PX-204", "S1", FlagCode.YieldLow, 85, 88, "%", "low", ReviewStatus.Open);
        var data = seeded with { Exceptions = [flag], FlaggedSteps = [new FlaggedStep("B-8", 1, "PX-204", Steps.Judged(outcome, 2, 1))], Yields = [] };

        var charts = Html.SvgFragments(HtmlDigestRenderer.Render(data)).Select(Html.ParseSvg).ToList();
        Assert.DoesNotContain(charts, c => (string?)c.Attribute("data-panel") == "reaction");
        var full = charts.Single(c => (string?)c.Attribute("data-panel") == "all");
        Assert.Equal("true", (string?)Rung(full, "yield-loss-product-in-waste").Attribute("data-flagged"));
        Assert.Equal("true", (string?)Rung(full, "yield-loss-unexplained").Attribute("data-flagged"));
        // No product went to samples: that rung holds nothing and is not marked.
        Assert.Equal("false", (string?)Rung(full, "yield-loss-product-in-samples").Attribute("data-flagged"));
    }

    private static XElement Rung(XElement svg, string key) =>
        svg.Descendants().Single(e => e.Name.LocalName == "rect" && (string?)e.Attribute("data-rung") == key);

    private static double Width(XElement rect) => double.Parse((string)rect.Attribute("width")!, CultureInfo.InvariantCulture);
}
