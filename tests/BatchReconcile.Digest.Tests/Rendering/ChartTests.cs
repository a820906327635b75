using System.Xml.Linq;
using BatchReconcile.Digest.Model;
using BatchReconcile.Digest.Rendering;
using BatchReconcile.Digest.Tests.Support;

namespace BatchReconcile.Digest.Tests.Rendering;

public class ChartTests
{
    [Fact]
    public void A_yield_above_theory_draws_a_negative_unexplained_rung_not_a_clipped_one()
    {
        // m_theo 100, m_act 104: the unexplained yield loss is 100 - 104 - 1 - 0 = -5 kg (docs/computation.md, loss ladder).
        var outcome = Steps.Outcome("S3", massIn: 400, reactant: 150, recovered: 120, stoich: 130, theory: 100, actual: 104,
            inWaste: 1, inSamples: 0, massOut: 390, vented: 2, ventedMax: 3, u: 0.8);
        var data = SeededDigest.Create();
        var one = new DigestData(data.SiteName, data.Day, data.GeneratedAt, 1, 1, 0, [], [], [new FlaggedStep("B-7", 1, "PX-204", Steps.Judged(outcome, 2, 1))], []);

        var html = HtmlDigestRenderer.Render(one);
        var ladder = XElement.Parse(Html.SvgFragments(html)[0]);
        var texts = ladder.Descendants().Where(e => e.Name.LocalName == "text").Select(e => e.Value).ToList();

        Assert.Contains("-5.0 kg (-1.3 %) negative", texts);
        Assert.Single(ladder.Descendants(), e => e.Name.LocalName == "rect" && (string?)e.Attribute("stroke-dasharray") is not null);
        Assert.Contains("| yield loss: not accounted for (negative) | -5.0 | -1.3 |", MarkdownDigestRenderer.Render(one), StringComparison.Ordinal);
    }

    [Fact]
    public void The_ladder_rungs_and_the_product_add_up_to_the_charged_mass()
    {
        foreach (var step in SeededDigest.Create().FlaggedSteps)
        {
            var o = step.Outcome;
            Assert.Equal(o.MassInKg, o.Ladder.Sum(r => r.Kg) + o.ActualKg, 9);
        }
    }

    [Fact]
    public void The_days_batches_are_marked_apart_from_the_history()
    {
        var data = SeededDigest.Create();
        var html = HtmlDigestRenderer.Render(data);
        var yieldChart = Html.SvgFragments(html).Select(XElement.Parse)
            .Single(s => s.Elements().First().Value.StartsWith("Yields of recipe PX-204, step S2", StringComparison.Ordinal));
        var shapes = yieldChart.Descendants().Where(e => e.Name.LocalName is "rect" or "circle")
            .Where(e => e.Elements().Any(c => c.Name.LocalName == "title")).ToList();

        var history = data.Yields.Single(y => y.Step == "S2").History;
        Assert.Equal(history.Count(p => p.OnDigestDay && p.YieldPct is not null), shapes.Count(s => s.Name.LocalName == "rect"));
        Assert.Equal(history.Count(p => !p.OnDigestDay && p.YieldPct is not null), shapes.Count(s => s.Name.LocalName == "circle"));
        // One batch has no yield, so the line is drawn in two pieces.
        Assert.Equal(2, yieldChart.Descendants().Count(e => e.Name.LocalName == "polyline"));
    }

    [Fact]
    public void A_step_with_nothing_charged_has_no_closure_chart()
    {
        var data = SeededDigest.Create();
        var outcome = data.FlaggedSteps[0].Outcome with { ClosurePct = null };
        var one = new DigestData(data.SiteName, data.Day, data.GeneratedAt, 1, 1, 0, [], [], [new FlaggedStep("B-7", 1, "PX-204", Steps.Judged(outcome, 2, 1))], []);

        var html = HtmlDigestRenderer.Render(one);
        // The ladder and (solvent above half the charge) the ladder without solvents; no closure chart.
        var titles = Html.SvgFragments(html).Select(f => Html.ParseSvg(f).Elements().First().Value).ToList();
        Assert.Equal(2, titles.Count);
        Assert.All(titles, t => Assert.StartsWith("Loss ladder", t, StringComparison.Ordinal));
        Assert.Contains("No closure", html, StringComparison.Ordinal);
    }

    [Fact]
    public void Limits_not_stored_with_a_step_are_shown_as_unknown_never_as_zero()
    {
        var data = SeededDigest.Create();
        var outcome = data.FlaggedSteps[0].Outcome with { Limits = BatchReconcile.Reconciliation.Outcomes.StepLimits.Unknown };
        var yields = new RecipeStepYields("PX-204", "S2", "Boc removal", null, null, data.Yields[0].History);
        var one = new DigestData(data.SiteName, data.Day, data.GeneratedAt, 1, 1, 0, [], [], [new FlaggedStep("B-7", 1, "PX-204", outcome)], [yields]);

        var html = HtmlDigestRenderer.Render(one);
        var md = MarkdownDigestRenderer.Render(one);

        Assert.Contains("<dt>Tolerance</dt><dd>unknown (not stored with this step)</dd>", html, StringComparison.Ordinal);
        Assert.Contains("± unknown (k = unknown)", html, StringComparison.Ordinal);
        Assert.Contains("Limits unknown, as stored", html, StringComparison.Ordinal);
        Assert.DoesNotContain("± 0.0 %", html, StringComparison.Ordinal);
        Assert.Contains("tolerance unknown.", md, StringComparison.Ordinal);
        Assert.DoesNotContain("± 0.0 %", md, StringComparison.Ordinal);
    }
}
