using System.Globalization;
using System.Xml.Linq;
using BatchReconcile.Digest.Model.Report;
using BatchReconcile.Digest.Rendering;
using BatchReconcile.Digest.Rendering.Report;
using BatchReconcile.Digest.Tests.Support;

namespace BatchReconcile.Digest.Tests.Report;

public class HtmlReportRendererTests
{
    private static readonly XNamespace SvgNs = "http://www.w3.org/2000/svg";

    private static XElement Chart(string html, string kind, string? step = null) =>
        Html.SvgFragments(html).Select(XElement.Parse)
            .Single(s => (string?)s.Attribute("data-chart") == kind && (step is null || (string?)s.Attribute("data-step") == step));

    [Fact]
    public void Every_chart_is_well_formed_svg_with_a_size_a_title_and_a_description()
    {
        var html = HtmlReportRenderer.Render(ReportSample.Create());
        var charts = Html.SvgFragments(html).Select(XElement.Parse).ToList();

        // Two control charts (S3 has too few points) and the Pareto.
        Assert.Equal(3, charts.Count);
        Assert.All(charts, c =>
        {
            Assert.True(double.Parse((string)c.Attribute("width")!, CultureInfo.InvariantCulture) > 0);
            Assert.True(double.Parse((string)c.Attribute("height")!, CultureInfo.InvariantCulture) > 0);
            Assert.NotNull(c.Attribute("viewBox"));
            Assert.Equal(["title", "desc"], c.Elements().Take(2).Select(e => e.Name.LocalName));
        });
    }

    [Fact]
    public void The_control_chart_draws_centre_line_and_limits_where_the_limits_say()
    {
        var data = ReportSample.Create();
        var s1 = data.Trends[0];
        var chart = Chart(HtmlReportRenderer.Render(data), "control", "S1");
        double Y(string role) => double.Parse((string)chart.Descendants(SvgNs + "line").Single(l => (string?)l.Attribute("data-line") == role).Attribute("y1")!, CultureInfo.InvariantCulture);

        // Screen y grows downwards: UCL above the centre above LCL, and the centre in the middle (limits are symmetric).
        Assert.True(Y("ucl") < Y("centre") && Y("centre") < Y("lcl"));
        Assert.Equal(Y("centre") - Y("ucl"), Y("lcl") - Y("centre"), 0.15);
        var texts = chart.Descendants(SvgNs + "text").Select(t => t.Value).ToList();
        // Labelled to 0.01 as the page rounds (half away from zero: the centre 91.975 reads 91.98).
        Assert.Contains("UCL " + DigestText.Number(s1.Limits!.Ucl, 2), texts);
        Assert.Contains("LCL " + DigestText.Number(s1.Limits.Lcl, 2), texts);
        Assert.Contains("CL 91.98", texts);
        Assert.Contains("baseline (20 batches)", texts);
        // The version change after the 20th batch is marked.
        Assert.Single(chart.Descendants(SvgNs + "line"), l => (string?)l.Attribute("data-line") == "version");
    }

    [Fact]
    public void Points_that_break_a_rule_are_squares_labelled_with_the_rule_and_the_others_circles()
    {
        var data = ReportSample.Create();
        var html = HtmlReportRenderer.Render(data);
        var chart = Chart(html, "control", "S2");

        var marked = chart.Descendants(SvgNs + "rect").Where(r => r.Attribute("data-signals") is not null).ToList();
        var expected = data.Trends[1].Points.Where(p => p.Signals.Count > 0).ToList();
        Assert.Equal(expected.Select(p => (p.BatchId, string.Join(' ', p.Signals))), marked.Select(r => ((string)r.Attribute("data-batch")!, (string)r.Attribute("data-signals")!)));
        Assert.Equal(["R2", "R2,5"], chart.Descendants(SvgNs + "text").Where(t => t.Attribute("data-signal-label") is not null).Select(t => t.Value));
        Assert.Equal(data.Trends[1].Points.Count - expected.Count, chart.Descendants(SvgNs + "circle").Count(c => c.Attribute("data-batch") is not null));

        // The legend names the rules that fired, with their sentences, and the table lists the batches.
        var article = html[html.IndexOf("id=\"trend-S2\"", StringComparison.Ordinal)..];
        article = article[..article.IndexOf("</article>", StringComparison.Ordinal)];
        Assert.Contains("<code>rule-2</code>: nine points in a row on the same side of the centre line (2 point(s))", article, StringComparison.Ordinal);
        Assert.Contains("<code>rule-5</code>: two of three points", article, StringComparison.Ordinal);
        Assert.DoesNotContain("rule-1", article, StringComparison.Ordinal);
        Assert.Contains("<td class=\"code\">rule-2, rule-5</td>", article, StringComparison.Ordinal);
    }

    [Fact]
    public void A_step_without_enough_points_says_so_and_draws_no_chart()
    {
        var html = HtmlReportRenderer.Render(ReportSample.Create());
        var article = html[html.IndexOf("id=\"trend-S3\"", StringComparison.Ordinal)..];
        article = article[..article.IndexOf("</article>", StringComparison.Ordinal)];

        Assert.Contains("step S3: not enough points for a control chart", article, StringComparison.Ordinal);
        Assert.DoesNotContain("<svg", article, StringComparison.Ordinal);
    }

    [Fact]
    public void The_pareto_bars_fall_and_the_cumulative_line_rises_to_100_percent()
    {
        var data = ReportSample.Create();
        var chart = Chart(HtmlReportRenderer.Render(data), "pareto");
        var bars = chart.Descendants(SvgNs + "rect").Where(r => r.Attribute("data-rank") is not null).ToList();
        var heights = bars.Select(b => double.Parse((string)b.Attribute("height")!, CultureInfo.InvariantCulture)).ToList();
        var line = ((string)chart.Descendants(SvgNs + "polyline").Single().Attribute("points")!).Split(' ')
            .Select(p => double.Parse(p.Split(',')[1], CultureInfo.InvariantCulture)).ToList();

        // The negative row is not a bar.
        Assert.Equal(data.Losses.Rows.Count(r => r.Kg > 0), bars.Count);
        Assert.Equal(heights.OrderByDescending(h => h), heights);
        Assert.Equal(line.OrderByDescending(y => y), line); // screen y falls as the share rises
        Assert.Equal(100, data.Losses.Rows.Where(r => r.Kg > 0).Last().CumulativeSharePct, 9);
        Assert.Equal(16.0, line[^1], 1); // the 100 % mark is the top of the plot
    }

    [Fact]
    public void The_loss_table_lists_parts_under_their_rung_and_the_negative_row_without_a_share()
    {
        var html = HtmlReportRenderer.Render(ReportSample.Create());
        var table = html[html.IndexOf("<table class=\"pareto\">", StringComparison.Ordinal)..];
        table = table[..table.IndexOf("</table>", StringComparison.Ordinal)];

        var etoh = table.IndexOf("data-material=\"ETOH\"", StringComparison.Ordinal);
        var tol = table.IndexOf("data-material=\"TOL\"", StringComparison.Ordinal);
        var firstRung = table.IndexOf("<tr data-rung=\"auxiliaries-not-recovered\"", StringComparison.Ordinal);
        Assert.True(firstRung >= 0 && firstRung < etoh && etoh < tol, "the parts follow their rung, largest first");
        Assert.Contains("71.4 % of the rung", table, StringComparison.Ordinal); // 15,000 of 21,000 kg
        Assert.Contains("yield loss: not accounted for (negative, not counted in the shares)", table, StringComparison.Ordinal);
    }

    [Fact]
    public void The_comparison_says_plainly_when_a_group_is_too_small()
    {
        var html = HtmlReportRenderer.Render(ReportSample.Create());
        var route = html[html.IndexOf("data-scope=\"route\"", StringComparison.Ordinal)..];
        route = route[..route.IndexOf("</table>", StringComparison.Ordinal)];

        Assert.Contains(System.Net.WebUtility.HtmlEncode(HtmlReportRenderer.TooFew), route, StringComparison.Ordinal);
        Assert.Contains("71.00 % (n &lt; 2, no interval)", route, StringComparison.Ordinal);
        var s1 = html[html.IndexOf("data-scope=\"S1\"", StringComparison.Ordinal)..];
        Assert.Contains("-0.68 % (-2.13 to 0.77), p = 0.32", s1, StringComparison.Ordinal);
        Assert.Contains("<td class=\"num\">unknown</td>", s1, StringComparison.Ordinal); // solvent share of v2 not stored
    }

    [Fact]
    public void Text_from_data_is_encoded_and_the_page_loads_nothing()
    {
        var data = ReportSample.Create("<script>alert(1)</script> & Co");
        var trend = data.Trends[0];
        var hostile = trend with { StepName = "<img src=x onerror=alert(2)>", Points = [.. trend.Points.Select((p, i) => i == 3 ? p with { BatchId = "\"><script>x()</script>" } : p)] };
        var html = HtmlReportRenderer.Render(data with { Trends = [hostile, .. data.Trends.Skip(1)] });

        Assert.DoesNotContain("<script", html, StringComparison.OrdinalIgnoreCase);
        Assert.DoesNotContain("<img", html, StringComparison.OrdinalIgnoreCase);
        Assert.DoesNotContain("@import", html, StringComparison.Ordinal);
        Assert.DoesNotContain("url(", html, StringComparison.Ordinal);
        Assert.DoesNotContain("<link", html, StringComparison.Ordinal);
        Assert.All(Html.SvgFragments(html), f => XElement.Parse(f));
        Assert.Contains("&lt;script&gt;alert(1)&lt;/script&gt; &amp; Co", html, StringComparison.Ordinal);
    }

    [Fact]
    public void The_cautions_say_that_control_limits_are_not_the_specification()
    {
        var html = HtmlReportRenderer.Render(ReportSample.Create());
        var cautions = html[html.IndexOf("<section id=\"cautions\">", StringComparison.Ordinal)..];

        Assert.Contains("Control limits describe the process as it ran in the baseline batches, not the specification", cautions, StringComparison.Ordinal);
        Assert.Contains("do not replace", cautions, StringComparison.Ordinal);
        Assert.Contains("Master-record limits 85.00 to 98.00 %", html, StringComparison.Ordinal);
    }

    [Fact]
    public void A_report_without_versions_to_compare_or_losses_says_so()
    {
        var data = ReportSample.Create() with { Comparison = null, Losses = new LossSummary(0, 0, []) };
        var html = HtmlReportRenderer.Render(data);

        Assert.Contains("one recipe version only: nothing to compare", html, StringComparison.Ordinal);
        Assert.Contains("No losses", html, StringComparison.Ordinal);
        Assert.DoesNotContain("data-chart=\"pareto\"", html, StringComparison.Ordinal);
    }
}
