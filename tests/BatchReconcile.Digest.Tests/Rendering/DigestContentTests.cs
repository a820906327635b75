using System.Globalization;
using BatchReconcile.Digest.Model;
using BatchReconcile.Digest.Rendering;
using BatchReconcile.Digest.Tests.Support;

namespace BatchReconcile.Digest.Tests.Rendering;

public class DigestContentTests
{
    private static readonly DigestData Seeded = SeededDigest.Create();
    private static readonly string HtmlText = HtmlDigestRenderer.Render(Seeded);
    private static readonly string MarkdownText = MarkdownDigestRenderer.Render(Seeded);

    [Fact]
    public void Flag_counts_by_severity_come_from_the_exception_list()
    {
        Assert.Equal(new SeverityCounts(Critical: 2, Major: 3, Minor: 2), Seeded.FlagCounts);
        Assert.Contains("critical 2</span>", HtmlText, StringComparison.Ordinal);
        Assert.Contains("major 3</span>", HtmlText, StringComparison.Ordinal);
        Assert.Contains("minor 2</span>", HtmlText, StringComparison.Ordinal);
        Assert.Contains("- Flags raised: 7 (critical 2, major 3, minor 2)", MarkdownText, StringComparison.Ordinal);
    }

    [Fact]
    public void Header_shows_batches_steps_site_and_day()
    {
        Assert.Contains("<dt>Batches completed</dt><dd>4</dd>", HtmlText, StringComparison.Ordinal);
        Assert.Contains("<dt>Steps reconciled</dt><dd>9</dd>", HtmlText, StringComparison.Ordinal);
        Assert.Contains("<strong>2026-11-25</strong> at <strong>North Plant</strong>", HtmlText, StringComparison.Ordinal);
        Assert.Contains("- Batches completed: 4", MarkdownText, StringComparison.Ordinal);
        Assert.Contains("- Steps reconciled: 9", MarkdownText, StringComparison.Ordinal);
        Assert.StartsWith("# Daily exception digest: 2026-11-25, North Plant", MarkdownText, StringComparison.Ordinal);
    }

    [Fact]
    public void Exceptions_are_ordered_by_severity_then_batch_step_and_code_in_every_output()
    {
        Assert.Equal(SeededDigest.ExpectedOrder, Html.FlagIdsInOrder(HtmlText));

        var csvIds = CsvExceptionList.Render(Seeded).Split("\r\n", StringSplitOptions.RemoveEmptyEntries).Skip(1)
            .Select(line => long.Parse(line[..line.IndexOf(',', StringComparison.Ordinal)], CultureInfo.InvariantCulture));
        Assert.Equal(SeededDigest.ExpectedOrder, csvIds);

        var byId = Seeded.Exceptions.ToDictionary(e => e.FlagId);
        var mdPositions = SeededDigest.ExpectedOrder
            .Select(id => MarkdownText.IndexOf(MarkdownDigestRenderer.E(byId[id].Message), StringComparison.Ordinal)).ToList();
        Assert.All(mdPositions, p => Assert.True(p > 0));
        Assert.Equal(mdPositions.Order(), mdPositions);
    }

    [Fact]
    public void Every_flag_of_the_day_is_present_with_its_sentence_value_and_review_state()
    {
        foreach (var e in Seeded.Exceptions)
        {
            Assert.Contains($"data-flag-id=\"{e.FlagId}\"", HtmlText, StringComparison.Ordinal);
            Assert.Contains(System.Net.WebUtility.HtmlEncode(e.Message), HtmlText, StringComparison.Ordinal);
            Assert.Contains(MarkdownDigestRenderer.E(e.Message), MarkdownText, StringComparison.Ordinal);
        }

        Assert.Contains("81.4 % against 88.0 %", HtmlText, StringComparison.Ordinal);
        Assert.Contains("-6.30 kg against 4.00 kg", HtmlText, StringComparison.Ordinal);
        Assert.Contains("1.32 equiv against 1.20 equiv", HtmlText, StringComparison.Ordinal);
        Assert.Contains("equivalents-out-of-range (HATU)", HtmlText, StringComparison.Ordinal);
        Assert.Contains("closed: explained", HtmlText, StringComparison.Ordinal);
        Assert.Contains("in-review", MarkdownText, StringComparison.Ordinal);
    }

    [Fact]
    public void Open_items_from_earlier_days_show_count_and_age_oldest_first()
    {
        Assert.Contains("4, the oldest 12 days old", HtmlText, StringComparison.Ordinal);
        Assert.Contains("- Still open from earlier days: 4, the oldest 12 days old", MarkdownText, StringComparison.Ordinal);
        Assert.Contains("The 3 oldest of 4 are listed", HtmlText, StringComparison.Ordinal);

        var ages = new[] { "12 days", "5 days", "1 day" }.Select(a => HtmlText.IndexOf($"<td class=\"num\">{a}</td>", StringComparison.Ordinal)).ToList();
        Assert.All(ages, p => Assert.True(p > 0));
        Assert.Equal(ages.Order(), ages);
    }

    [Fact]
    public void Sections_come_in_the_required_order()
    {
        string[] ids = ["summary", "exceptions", "flagged-steps", "yields", "cautions"];
        var positions = ids.Select(id => HtmlText.IndexOf($"id=\"{id}\"", StringComparison.Ordinal)).ToList();
        Assert.All(positions, p => Assert.True(p > 0));
        Assert.Equal(positions.Order(), positions);

        string[] headings = ["# Daily exception digest", "## Exceptions of the day", "## Flagged steps", "## Yields against limits", "## Cautions"];
        var mdPositions = headings.Select(h => MarkdownText.IndexOf(h, StringComparison.Ordinal)).ToList();
        Assert.All(mdPositions, p => Assert.True(p >= 0));
        Assert.Equal(mdPositions.Order(), mdPositions);
    }

    [Fact]
    public void Cautions_are_in_both_versions()
    {
        foreach (var caution in DigestText.Cautions)
        {
            Assert.Contains(System.Net.WebUtility.HtmlEncode(caution), HtmlText, StringComparison.Ordinal);
            Assert.Contains(MarkdownDigestRenderer.E(caution), MarkdownText, StringComparison.Ordinal);
        }

        Assert.Contains("do not replace", HtmlText, StringComparison.Ordinal);
        Assert.Contains("vented gases and solvents", HtmlText, StringComparison.Ordinal);
    }

    [Fact]
    public void Each_flagged_step_has_a_ladder_and_a_closure_chart_and_each_recipe_step_a_yield_chart()
    {
        var charts = Html.SvgFragments(HtmlText);
        // Each seeded step's solvents and recovered streams are more than half its charge, so each also has the ladder without them.
        Assert.Equal((3 * Seeded.FlaggedSteps.Count) + Seeded.Yields.Count, charts.Count);
        Assert.Equal(Seeded.FlaggedSteps.Count, charts.Count(c => c.Contains(" data-panel=\"all\">", StringComparison.Ordinal) && c.Contains("<title>Loss ladder of batch", StringComparison.Ordinal)));
        Assert.Equal(Seeded.FlaggedSteps.Count, charts.Count(c => c.Contains(" data-panel=\"reaction\">", StringComparison.Ordinal) && c.Contains("without solvents", StringComparison.Ordinal)));
        Assert.Equal(Seeded.FlaggedSteps.Count, charts.Count(c => c.Contains("<title>Mass-balance closure of batch", StringComparison.Ordinal)));
        Assert.Equal(Seeded.Yields.Count, charts.Count(c => c.Contains("<title>Yields of recipe", StringComparison.Ordinal)));
    }

    [Fact]
    public void The_flagged_steps_show_the_balance_figures_rounded_for_their_size()
    {
        // B-26-10 S2 charged 1250 kg: kg to 0.1. Closure 100 * (1201.2 + 36.7) / 1250 = 99.032 %, k·u = 2 * 1.9 / 1250 = 0.304 %.
        Assert.Contains("<dt>Charged</dt><dd>1250.0 kg</dd>", HtmlText, StringComparison.Ordinal);
        Assert.Contains("99.0 % ± 0.3 % (k = 2.0)", HtmlText, StringComparison.Ordinal);
        // B-26-9 S2 charged 48.25 kg: kg to 0.01.
        Assert.Contains("<dt>Charged</dt><dd>48.25 kg</dd>", HtmlText, StringComparison.Ordinal);
        Assert.Contains("Balance: out 1201.2 kg, vented 36.7 kg (up to 37.5 kg), gap 12.1 kg; closure 99.0 % ± 0.3 % (k = 2.0), tolerance ± 2.0 %.", MarkdownText, StringComparison.Ordinal);
    }

    [Fact]
    public void Yields_of_the_day_are_set_against_the_limits()
    {
        // Seeded S2 history: 28 earlier batches within 88-98 % (one without a yield) and the day's 81.4 % and 103.2 %.
        Assert.Contains("| PX-204 | S2 Boc removal and isolation | 88.0 to 98.0 | B-26-9 81.4 (below); B-26-10 103.2 (above) | 30 batches, 2 outside the limits, lowest 81.4 %, highest 103.2 % |",
            MarkdownText, StringComparison.Ordinal);
        Assert.Contains("This day: B-26-9 81.4 % (below); B-26-10 103.2 % (above).", HtmlText, StringComparison.Ordinal);
    }

    public static TheoryData<string, DateTimeOffset, DateTimeOffset, string> ClockChangeDays => new()
    {
        // EU summer time starts on the last Sunday of March and ends on the last Sunday of October at 01:00 UTC
        // (Directive 2000/84/EC); in 2026 those are 29 March and 25 October. Plant day starting 06:00 local time.
        { "2026-03-29", new DateTimeOffset(2026, 3, 29, 6, 0, 0, TimeSpan.FromHours(1)), new DateTimeOffset(2026, 3, 30, 6, 0, 0, TimeSpan.FromHours(2)),
            "2026-03-29 06:00 UTC+01:00 to 2026-03-30 06:00 UTC+02:00 (23 h, Europe/Berlin)" },
        { "2026-10-25", new DateTimeOffset(2026, 10, 25, 6, 0, 0, TimeSpan.FromHours(2)), new DateTimeOffset(2026, 10, 26, 6, 0, 0, TimeSpan.FromHours(1)),
            "2026-10-25 06:00 UTC+02:00 to 2026-10-26 06:00 UTC+01:00 (25 h, Europe/Berlin)" },
        { "2026-11-25", new DateTimeOffset(2026, 11, 25, 6, 0, 0, TimeSpan.FromHours(1)), new DateTimeOffset(2026, 11, 26, 6, 0, 0, TimeSpan.FromHours(1)),
            "2026-11-25 06:00 UTC+01:00 to 2026-11-26 06:00 UTC+01:00 (24 h, Europe/Berlin)" },
    };

    [Theory]
    [MemberData(nameof(ClockChangeDays))]
    public void The_day_bounds_show_the_real_length_of_the_day(string day, DateTimeOffset start, DateTimeOffset end, string expected)
    {
        var data = SeededDigest.Create();
        var onDay = new DigestData(data.SiteName, SeededDigest.DayOf(DateOnly.ParseExact(day, "yyyy-MM-dd", CultureInfo.InvariantCulture), start, end),
            data.GeneratedAt, data.BatchesCompleted, data.StepsReconciled, data.OpenEarlierCount, data.OpenEarlier, data.Exceptions, data.FlaggedSteps, data.Yields);

        Assert.Contains(System.Net.WebUtility.HtmlEncode(expected), HtmlDigestRenderer.Render(onDay), StringComparison.Ordinal);
        Assert.Contains("- Day runs: " + expected, MarkdownDigestRenderer.Render(onDay), StringComparison.Ordinal);
    }

    [Fact]
    public void An_empty_day_still_has_every_section_and_no_chart()
    {
        var day = SeededDigest.Create().Day;
        var empty = new DigestData("North Plant", day, day.End, 0, 0, 0, [], [], [], []);
        var html = HtmlDigestRenderer.Render(empty);

        Assert.Contains("No flags were raised on this day.", html, StringComparison.Ordinal);
        Assert.Contains("<dt>Still open from earlier days</dt><dd>none</dd>", html, StringComparison.Ordinal);
        Assert.Empty(Html.SvgFragments(html));
        Assert.Contains("id=\"cautions\"", html, StringComparison.Ordinal);
        Assert.Equal("flag_id,severity,batch,revision,recipe,step,code,subject,measured,limit,unit,message,review_state,deviation_ref,reviewed_by\r\n", CsvExceptionList.Render(empty));
    }

    [Fact]
    public void Rendering_twice_gives_the_same_text()
    {
        Assert.Equal(HtmlText, HtmlDigestRenderer.Render(SeededDigest.Create()));
        Assert.Equal(MarkdownText, MarkdownDigestRenderer.Render(SeededDigest.Create()));
    }
}
