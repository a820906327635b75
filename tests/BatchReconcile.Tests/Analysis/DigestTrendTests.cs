using System.Globalization;
using System.Text.Json;
using BatchReconcile.Storage;
using BatchReconcile.Tests.Support;

namespace BatchReconcile.Tests.Analysis;

/// <summary>
/// The digest's trend context and run-rule information (docs/analysis.md, "In the daily digest"), through ingest and
/// <c>digest</c> in process: 29 ordinary batches of the lidocaine route, then one whose acylation yield is inside the
/// master-record limits but far above its trend, and whose amination yield is low (flagged).
/// </summary>
public abstract class DigestTrendTests : IDisposable
{
    // Kilograms of CDMA isolated at S1 in the 29 ordinary batches (a repeating pattern), then 93.5 kg in batch 30.
    private static readonly double[] Pattern = [0.0, 0.6, 1.2, 0.9, 1.8, 1.5, 0.3, 0.4, 2.1, 1.0];
    private static readonly DateOnly First = new(2026, 10, 27);
    private readonly AnalysisSandbox _plant;

    protected DigestTrendTests(StoreProvider provider)
    {
        _plant = new(provider);
        var exports = new List<string>();
        for (var n = 1; n <= 30; n++)
        {
            var cdma = n < 30 ? 86.0 + Pattern[(n - 1) % Pattern.Length] : 93.5;
            var lid = n < 30 ? Math.Round(90.0 * cdma / 88.0, 1) : 70.0;
            exports.Add(LidocaineRoute.Export(AnalysisSandbox.BatchId(n), 1, First.AddDays(n - 1), cdma, lid, Math.Round(95.0 * lid / 90.0, 1)));
        }

        _plant.Ingest(exports);
    }

    private (string Html, string Markdown) Digest(DateOnly day)
    {
        var (exit, o, e) = _plant.Run("digest", "--day", day.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture), "--json");
        Assert.True(exit == 0, e);
        using var doc = JsonDocument.Parse(o);
        var files = doc.RootElement.GetProperty("files").EnumerateArray().Select(f => f.GetString()!).ToList();
        return (File.ReadAllText(files.Single(f => f.EndsWith(".html", StringComparison.Ordinal))), File.ReadAllText(files.Single(f => f.EndsWith(".md", StringComparison.Ordinal))));
    }

    [Fact]
    public void A_yield_inside_the_limits_that_breaks_rule_1_is_marked_as_information_and_not_flagged()
    {
        // S1: m_theo = n_DMA · M_CDMA = 60.0 / 121.183 · 197.662 = 97.866 kg (abridged atomic weights, IUPAC, as in PeriodicTable.cs);
        // 93.5 kg is 95.54 %, inside 80 to 98 %. The baseline is the first 20 of the last 30 batches: yields from 86.0 ... 88.1 kg.
        var theoretical = 60.0 / 121.183 * 197.662;
        var baseline = Enumerable.Range(1, 20).Select(n => 100 * (86.0 + Pattern[(n - 1) % Pattern.Length]) / theoretical).ToList();
        var mrBar = Enumerable.Range(1, 19).Average(i => Math.Abs(baseline[i] - baseline[i - 1]));
        var ucl = baseline.Average() + (3 * mrBar / 1.128); // NIST/SEMATECH e-Handbook 6.3.2: d2 = 1.128 for n = 2
        Assert.True(100 * 93.5 / theoretical > ucl, "the test batch is meant to lie above the UCL");

        var (html, md) = Digest(First.AddDays(29));

        var yields = System.Net.WebUtility.HtmlDecode(html);
        yields = yields[yields.IndexOf("<section id=\"yields\">", StringComparison.Ordinal)..];
        Assert.Contains("KB3-LD-030: Information, not a flag: this yield is within the master-record limits but breaks a run rule of its recent trend: rule-1 (One point more than 3 sigma from the centre line)", yields, StringComparison.Ordinal);
        Assert.Contains("data-signal-label=\"R1", yields, StringComparison.Ordinal); // labelled on the yield chart
        Assert.Contains("KB3-LD-030 95.5 (run rules, information only: rule-1", md, StringComparison.Ordinal);
        // No flag for S1: the day's only flag is the amination's low yield.
        using var flags = JsonDocument.Parse(_plant.Run("flags", "list", "--json").Out);
        Assert.Equal(["S2 yield-low"], flags.RootElement.EnumerateArray().Select(f => f.GetProperty("step").GetString() + " " + f.GetProperty("code").GetString()));
    }

    [Fact]
    public void A_flagged_step_has_a_trend_line_and_says_that_its_yield_also_breaks_a_run_rule()
    {
        // S2 of batch 30: 70.0 kg of lidocaine from 93.5 kg CDMA, m_theo = 93.5 / 197.662 · 234.343 = 110.853 kg: 63.1 %, below 75 %.
        var (html, md) = Digest(First.AddDays(29));
        var text = System.Net.WebUtility.HtmlDecode(html);
        var article = text[text.IndexOf("<h3>Batch KB3-LD-030 rev 1, recipe LID-300", StringComparison.Ordinal)..];
        article = article[..article.IndexOf("</article>", StringComparison.Ordinal)];

        Assert.Contains("step S2</h3>", article, StringComparison.Ordinal);
        Assert.Matches(@"<p class=""lead trend-context"">Yield trend: .* below the centre line \(centre \d+\.\d %, from the first 20 of the last 30 batches\)\.</p>", article);
        Assert.Contains("Information: this yield also breaks a run rule of its recent trend: rule-1 (One point more than 3 sigma from the centre line)", article, StringComparison.Ordinal);
        Assert.Matches(@"Yield trend: .* below the centre line \(centre \d+\.\d %, from the first 20 of the last 30 batches\)\.", md);
        Assert.Contains("> Information: this yield also breaks a run rule of its recent trend: rule-1 (One point more than 3 sigma from the centre line)", md, StringComparison.Ordinal);
    }

    [Fact]
    public void An_ordinary_day_has_no_run_rule_information_for_its_batch()
    {
        // Batch 21 (KB3-LD-021, pattern 0.0: 86.0 kg) lies inside the limits the first 20 set; no flag, no rule-1.
        var (html, _) = Digest(First.AddDays(20));
        Assert.DoesNotContain("rule-1", html, StringComparison.Ordinal);
        Assert.Contains("No step was flagged on this day.", html, StringComparison.Ordinal);
    }

    public void Dispose()
    {
        _plant.Dispose();
        GC.SuppressFinalize(this);
    }
}

/// <summary>The tests above on the embedded store.</summary>
public sealed class DigestTrendTestsOnSqlite() : DigestTrendTests(StoreProvider.Sqlite);

/// <summary>The tests above on PostgreSQL (a site of its own on the tests' server).</summary>
public sealed class DigestTrendTestsOnPostgresql() : DigestTrendTests(StoreProvider.Postgresql);
