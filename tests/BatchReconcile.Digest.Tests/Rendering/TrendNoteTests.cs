using BatchReconcile.Digest.Model;
using BatchReconcile.Digest.Rendering;
using BatchReconcile.Digest.Tests.Support;

namespace BatchReconcile.Digest.Tests.Rendering;

/// <summary>The trend line and the run-rule information of the digest (docs/analysis.md, "In the daily digest").</summary>
public class TrendNoteTests
{
    private static readonly RuleSignal Rule2 = new("rule-2", "Nine points in a row on the same side of the centre line.");

    private static DigestData WithTrend(TrendNote note, double? yieldPct)
    {
        var data = SeededDigest.Create();
        var step = data.FlaggedSteps[0];
        var changed = step with { Outcome = step.Outcome with { YieldPct = yieldPct }, Trend = note };
        return data with { FlaggedSteps = [changed, .. data.FlaggedSteps.Skip(1)] };
    }

    [Fact]
    public void A_flagged_step_shows_its_trend_line_in_html_and_markdown()
    {
        var data = WithTrend(new TrendNote("3rd of the last 5 batches below the centre line", [], 91.25, 30, 20), 88.0);
        const string Line = "Yield trend: 3rd of the last 5 batches below the centre line (centre 91.3 %, from the first 20 of the last 30 batches).";

        Assert.Contains($"<p class=\"lead trend-context\">{Line}</p>", HtmlDigestRenderer.Render(data), StringComparison.Ordinal);
        Assert.Contains(Line, MarkdownDigestRenderer.Render(data), StringComparison.Ordinal);
        Assert.DoesNotContain("data-information", HtmlDigestRenderer.Render(data), StringComparison.Ordinal);
    }

    [Theory]
    // The seeded step's limits (SeededDigest): a yield inside them gets "not a flag", one outside "also".
    [InlineData(true, "Information, not a flag: this yield is within the master-record limits but breaks a run rule of its recent trend: rule-2 (Nine points in a row on the same side of the centre line).")]
    [InlineData(false, "Information: this yield also breaks a run rule of its recent trend: rule-2 (Nine points in a row on the same side of the centre line).")]
    public void A_yield_that_breaks_a_run_rule_is_information_worded_by_the_limits(bool inside, string sentence)
    {
        var limits = SeededDigest.Create().FlaggedSteps[0].Outcome.Limits;
        var yieldPct = inside ? (limits.YieldMinPct!.Value + limits.YieldMaxPct!.Value) / 2 : limits.YieldMinPct!.Value - 5;
        var data = WithTrend(new TrendNote(null, [Rule2], 90, 25, 20), yieldPct);

        var html = HtmlDigestRenderer.Render(data);
        Assert.Contains($"<p class=\"notice information\" data-information=\"run-rule\">{sentence}</p>", html, StringComparison.Ordinal);
        Assert.DoesNotContain("trend-context", html, StringComparison.Ordinal); // no context line without one
        Assert.Contains("> " + sentence, MarkdownDigestRenderer.Render(data), StringComparison.Ordinal);
        // Information is never counted as a flag.
        Assert.Equal(SeededDigest.Create().FlagCounts, data.FlagCounts);
    }

    [Fact]
    public void A_days_yield_that_breaks_a_run_rule_is_labelled_on_the_yield_chart_and_named_in_the_caption()
    {
        var data = SeededDigest.Create();
        var yields = data.Yields[0];
        var i = yields.History.ToList().FindIndex(p => p.OnDigestDay && p.YieldPct is not null);
        var point = yields.History[i] with { Signals = [Rule2] };
        var changed = new RecipeStepYields(yields.Recipe, yields.Step, yields.StepName, yields.MinYieldPct, yields.MaxYieldPct, [.. yields.History.Take(i), point, .. yields.History.Skip(i + 1)]);
        data = data with { Yields = [changed, .. data.Yields.Skip(1)] };

        var html = HtmlDigestRenderer.Render(data);
        var md = MarkdownDigestRenderer.Render(data);

        Assert.Matches("data-signal-label=\"R2\"[^>]*>R2</text>", html);
        Assert.Contains($"<span class=\"information\" data-information=\"run-rule\">{point.BatchId}: Information", html, StringComparison.Ordinal);
        Assert.Contains("(run rules, information only: rule-2)", md, StringComparison.Ordinal);
    }
}
