using System.Globalization;
using System.Text.Json;
using BatchReconcile.Storage;
using BatchReconcile.Tests.Support;

namespace BatchReconcile.Tests.Analysis;

/// <summary>
/// <c>trend</c>, <c>losses</c>, <c>compare</c> and <c>report</c> in process, on a real store built by ingesting 30 generated
/// batches of the three-step lidocaine route (LidocaineRoute): 23 of version 1 from 2026-11-02, one a day, the 20th of them with
/// an acylation yield far above the rest; then 7 of version 2, whose amination runs in 220 instead of 300 kg toluene and isolates
/// more lidocaine. Expected figures are worked from the charges here, not read back from the program.
/// </summary>
public abstract class AnalysisCliTests
{
    public const int Count = 30, LastOfVersion1 = 23, Outlier = 20;

    private static readonly double[] Pattern = [0.0, 0.6, 1.2, 0.9, 1.8, 1.5, 0.3, 0.4, 2.1, 1.0];

    // Abridged standard atomic weights as in PeriodicTable.cs (IUPAC/CIAAW, from memory): C 12.011, H 1.008, N 14.007, O 15.999, Cl 35.45.
    // M(DMA, C8H11N) = 121.183, M(CDMA, C10H12ClNO) = 197.662, M(LID, C14H22N2O) = 234.343, M(LIDHCL, C14H23ClN2O) = 270.801 g/mol.
    private const double MDma = 121.183, MCdma = 197.662, MLid = 234.343, MSalt = 270.801;

    private readonly Plant _plant;

    protected AnalysisCliTests(Plant plant) => _plant = plant;

    public static DateOnly Day(int n) => new DateOnly(2026, 11, 1).AddDays(n);

    public static int Version(int n) => n <= LastOfVersion1 ? 1 : 2;

    public static double Cdma(int n) => n == Outlier ? 93.5 : 86.0 + Pattern[(n - 1) % Pattern.Length];

    public static double Lid(int n) => Math.Round((Version(n) == 1 ? 90.0 : 92.0) * Cdma(n) / 88.0, 1);

    public static double Salt(int n) => Math.Round(95.0 * Lid(n) / 90.0, 1);

    /// <summary>m_in of each step of batch n (kg), from the charges of LidocaineRoute.</summary>
    public static (double S1, double S2, double S3) MassIn(int n) =>
        (577.0, Cdma(n) + 80.0 + LidocaineRoute.TolueneS2Kg(Version(n)), Lid(n) + 45.0 + 250.0);

    /// <summary>S1 yield: theoretical n_DMA · M_CDMA = 60.0 / 121.183 · 197.662 = 97.866 kg.</summary>
    public static double S1Yield(int n) => 100 * Cdma(n) / (60.0 / MDma * MCdma);

    /// <summary>S2 yield: theoretical CDMA / M_CDMA · M_LID (CDMA limiting: 80 kg DEA is 1.094 kmol, over 2 × the CDMA).</summary>
    public static double S2Yield(int n) => 100 * Lid(n) / (Cdma(n) / MCdma * MLid);

    /// <summary>Route yield (docs/computation.md): salt / (n_DMA · 1 · 1 · M_LIDHCL); 60 kg DMA gives at most 134.079 kg.</summary>
    public static double RouteYield(int n) => 100 * Salt(n) / (60.0 / MDma * MSalt);

    /// <summary>Cumulative PMI: (Σ m_in − intermediates charged) / salt; each step charges the whole previous product.</summary>
    public static double RoutePmi(int n)
    {
        var (a, b, c) = MassIn(n);
        return (a + b + c - Cdma(n) - Lid(n)) / Salt(n);
    }

    private static IEnumerable<int> Batches(int version) => Enumerable.Range(1, Count).Where(n => Version(n) == version);

    /// <summary>Within <paramref name="tolerance"/>: the JSON rounds to 0.0001 (% and PMI) or 0.001 (kg).</summary>
    private static void Near(double expected, double actual, double tolerance) =>
        Assert.True(Math.Abs(expected - actual) <= tolerance, $"expected {expected:R}, got {actual:R} (tolerance {tolerance:R})");

    private static JsonElement Json((int Exit, string Out, string Err) run)
    {
        Assert.True(run.Exit == 0, run.Err + run.Out);
        return JsonDocument.Parse(run.Out).RootElement.Clone();
    }

    [Fact]
    public void Trend_json_has_the_agreed_shape_and_limits_from_the_first_20_batches()
    {
        var json = Json(_plant.Sandbox.Run("trend", "--recipe", LidocaineRoute.Recipe, "--step", "S1", "--json"));

        // docs/interfaces: {"recipe","step","measure","baseline":{"from","to","n"},"mean","sigma","ucl","lcl","points":[...]}
        Assert.Equal(["recipe", "step", "measure", "baseline", "mean", "sigma", "ucl", "lcl", "points"], json.EnumerateObject().Select(p => p.Name));
        Assert.Equal(["batch", "day", "value", "movingRange", "signals"], json.GetProperty("points")[0].EnumerateObject().Select(p => p.Name));
        Assert.Equal(("LID-300", "S1", "yield"), (json.GetProperty("recipe").GetString(), json.GetProperty("step").GetString(), json.GetProperty("measure").GetString()));
        var baseline = json.GetProperty("baseline");
        Assert.Equal(("2026-11-02", "2026-11-21", 20), (baseline.GetProperty("from").GetString(), baseline.GetProperty("to").GetString(), baseline.GetProperty("n").GetInt32()));

        // Hand: x̄ and MR̄ over the first 20 yields, σ = MR̄ / 1.128, limits x̄ ± 3σ (NIST/SEMATECH e-Handbook 6.3.2).
        var yields = Enumerable.Range(1, Count).Select(S1Yield).ToList();
        var mean = yields.Take(20).Average();
        var sigma = Enumerable.Range(1, 19).Average(i => Math.Abs(yields[i] - yields[i - 1])) / 1.128;
        Near(mean, json.GetProperty("mean").GetDouble(), 1e-3);
        Near(sigma, json.GetProperty("sigma").GetDouble(), 1e-3);
        Near(mean + (3 * sigma), json.GetProperty("ucl").GetDouble(), 1e-3);
        Near(mean - (3 * sigma), json.GetProperty("lcl").GetDouble(), 1e-3);

        var points = json.GetProperty("points").EnumerateArray().ToList();
        Assert.Equal(Enumerable.Range(1, Count).Select(AnalysisSandbox.BatchId), points.Select(p => p.GetProperty("batch").GetString()));
        Assert.All(points.Zip(yields), x => Near(x.Second, x.First.GetProperty("value").GetDouble(), 1e-3));
        Assert.Equal(JsonValueKind.Null, points[0].GetProperty("movingRange").ValueKind);
        // Rule 1 marks exactly the points more than 3 σ from the centre line: the 20th batch, and no other.
        foreach (var (p, y) in points.Zip(yields))
        {
            var rule1 = p.GetProperty("signals").EnumerateArray().Any(s => s.GetString() == "rule-1");
            Assert.Equal(Math.Abs(y - mean) > 3 * sigma, rule1);
        }

        Assert.Contains("rule-1", points[Outlier - 1].GetProperty("signals").EnumerateArray().Select(s => s.GetString()));
    }

    [Fact]
    public void Trend_text_has_a_marker_column_and_a_legend_of_the_rules_that_fired()
    {
        var (exit, o, e) = _plant.Sandbox.Run("trend", "--recipe", LidocaineRoute.Recipe, "--step", "S1");

        Assert.True(exit == 0, e);
        Assert.Contains("trend of recipe LID-300, step S1: yield (%), 30 batches (all stored batches)", o, StringComparison.Ordinal);
        Assert.Contains("  baseline: 20 batches, 2026-11-02 to 2026-11-21", o, StringComparison.Ordinal);
        var outlier = o.Split('\n').Single(l => l.Contains("KB3-LD-020", StringComparison.Ordinal));
        Assert.Matches(@"^\s+20 b\*\s+2026-11-21\s+KB3-LD-020\s+1\s+95\.54\s", outlier);
        Assert.Contains("rule-1", outlier, StringComparison.Ordinal);
        Assert.Contains("    rule-1: One point more than 3 sigma from the centre line (1 point(s))", o, StringComparison.Ordinal);
        Assert.Contains("marks: b = baseline batch, * = breaks a run rule", o, StringComparison.Ordinal);
        Assert.Contains("Control limits describe the process, not the specification", o, StringComparison.Ordinal);
    }

    [Fact]
    public void Trend_with_a_stated_baseline_and_one_version_uses_those_batches()
    {
        var json = Json(_plant.Sandbox.Run(
            "trend", "--recipe", LidocaineRoute.Recipe, "--step", "S2", "--version", "2", "--baseline-from", "2026-11-24", "--baseline-to", "2026-11-27", "--json"));
        var v2 = Batches(2).ToList();
        var yields = v2.Select(S2Yield).ToList();

        Assert.Equal(v2.Select(AnalysisSandbox.BatchId), json.GetProperty("points").EnumerateArray().Select(p => p.GetProperty("batch").GetString()));
        // Version 2 starts with batch 24 on 2026-11-25: the baseline days 2026-11-24 to 2026-11-27 hold its batches 24, 25 and 26.
        Assert.Equal(3, json.GetProperty("baseline").GetProperty("n").GetInt32());
        Near(yields.Take(3).Average(), json.GetProperty("mean").GetDouble(), 1e-3);
    }

    [Fact]
    public void A_step_with_too_few_points_says_so()
    {
        var run = _plant.Sandbox.Run("trend", "--recipe", LidocaineRoute.Recipe, "--step", "S3", "--from", "2026-11-05", "--to", "2026-11-05");
        var json = Json(_plant.Sandbox.Run("trend", "--recipe", LidocaineRoute.Recipe, "--step", "S3", "--from", "2026-11-05", "--to", "2026-11-05", "--json"));

        Assert.Equal(0, run.Exit);
        Assert.Contains("step S3: not enough points for a control chart (1 batch(es) with a value; the baseline needs at least 2)", run.Out, StringComparison.Ordinal);
        Assert.Equal(JsonValueKind.Null, json.GetProperty("mean").ValueKind);
        Assert.Equal(JsonValueKind.Null, json.GetProperty("baseline").ValueKind);
        Assert.Single(json.GetProperty("points").EnumerateArray());
    }

    [Theory]
    [InlineData("--from '2026-13-01' is not a date as YYYY-MM-DD", "trend", "--step", "S1", "--from", "2026-13-01")]
    [InlineData("--to '1.12.2026' is not a date as YYYY-MM-DD", "losses", "--to", "1.12.2026")]
    [InlineData("--from 2026-12-01 is after --to 2026-11-01", "compare", "--versions", "1,2", "--from", "2026-12-01", "--to", "2026-11-01")]
    [InlineData("--measure 'speed' is not a figure", "trend", "--step", "S1", "--measure", "speed")]
    [InlineData("--step 'S9': recipe LID-300 has no such step (its steps: S1, S2, S3)", "trend", "--step", "S9")]
    [InlineData("--baseline '1' is not a number of batches", "trend", "--step", "S1", "--baseline", "1")]
    [InlineData("--baseline 40: step S1 has only 30 batches with a value", "trend", "--step", "S1", "--baseline", "40")]
    [InlineData("--baseline-from: give --baseline-to as well", "trend", "--step", "S1", "--baseline-from", "2026-11-02")]
    [InlineData("--version 'two' is not a recipe version", "trend", "--step", "S1", "--version", "two")]
    [InlineData("--versions '1' is not two recipe versions: write them as 1,2", "compare", "--versions", "1")]
    [InlineData("--versions '2,2': give two different versions", "compare", "--versions", "2,2")]
    public void Bad_input_exits_2_with_one_line_naming_the_option_and_value(string message, params string[] args)
    {
        var before = new DataRootCounts(_plant.Sandbox);
        var (exit, o, e) = _plant.Sandbox.Run([args[0], "--recipe", LidocaineRoute.Recipe, .. args[1..]]);

        Assert.Equal(2, exit);
        Assert.Empty(o);
        var line = Assert.Single(e.TrimEnd('\n').Split('\n'));
        Assert.Contains(message, line, StringComparison.Ordinal);
        Assert.Equal(before, new DataRootCounts(_plant.Sandbox));
    }

    [Fact]
    public void An_unknown_recipe_is_bad_input()
    {
        var (exit, _, e) = _plant.Sandbox.Run("losses", "--recipe", "XYZ-1");
        Assert.Equal(2, exit);
        Assert.Equal("batchreconcile: --recipe 'XYZ-1': no batch of that recipe is stored", e.Trim());
    }

    [Fact]
    public void Losses_are_the_ladders_summed_and_sorted_with_parts_per_material()
    {
        var json = Json(_plant.Sandbox.Run("losses", "--recipe", LidocaineRoute.Recipe, "--json"));
        var rows = json.GetProperty("rows").EnumerateArray().ToList();
        double Kg(string step, string rung) => rows.Single(r => r.GetProperty("step").GetString() == step && r.GetProperty("rung").GetString() == rung).GetProperty("kg").GetDouble();
        var total = Enumerable.Range(1, Count).Sum(n => MassIn(n).S1 + MassIn(n).S2 + MassIn(n).S3);

        Assert.Equal(Count, json.GetProperty("batches").GetInt32());
        Near(total, json.GetProperty("chargedKg").GetDouble(), 1e-2);
        // Auxiliaries not recovered (docs/computation.md, m_aux − m_rec): S1 the toluene, 400 kg a batch; S2 toluene 300 kg (v1) or
        // 220 kg (v2); S3 acetone 250 kg and the water of the acid, 45.0 · 64 / 100 = 28.8 kg.
        Near(Count * 400.0, Kg("S1", "auxiliaries-not-recovered"), 1e-2);
        Near((LastOfVersion1 * 300.0) + ((Count - LastOfVersion1) * 220.0), Kg("S2", "auxiliaries-not-recovered"), 1e-2);
        Near(Count * 278.8, Kg("S3", "auxiliaries-not-recovered"), 1e-2);
        var s3Parts = rows.Single(r => r.GetProperty("step").GetString() == "S3" && r.GetProperty("rung").GetString() == "auxiliaries-not-recovered").GetProperty("parts")
            .EnumerateArray().Select(p => (p.GetProperty("material").GetString(), p.GetProperty("kg").GetDouble())).ToList();
        Assert.Equal([("ACE", Count * 250.0), ("WATER", Count * 28.8)], s3Parts.Select(p => (p.Item1, Math.Round(p.Item2, 2))));

        // A Pareto: largest first, shares of the positive rows add up to 100, the cumulative share ends there.
        var kgs = rows.Select(r => r.GetProperty("kg").GetDouble()).ToList();
        Assert.Equal(kgs.OrderByDescending(k => k), kgs);
        Assert.Equal(100, rows.Where(r => r.GetProperty("kg").GetDouble() > 0).Sum(r => r.GetProperty("sharePct").GetDouble()), 1);
        Near(100, rows.Last(r => r.GetProperty("kg").GetDouble() > 0).GetProperty("cumulativeSharePct").GetDouble(), 1e-2);
        Near(100 * kgs[0] / total, rows[0].GetProperty("pctOfCharged").GetDouble(), 1e-2);
        Assert.DoesNotContain(rows, r => r.GetProperty("rung").GetString() == "recovered");
    }

    [Fact]
    public void Losses_text_lists_the_rows_with_their_shares()
    {
        var (exit, o, e) = _plant.Sandbox.Run("losses", "--recipe", LidocaineRoute.Recipe);

        Assert.True(exit == 0, e);
        Assert.Contains("losses of recipe LID-300, all stored batches: 30 batches,", o, StringComparison.Ordinal);
        Assert.Matches(@"\n\s+1 S1\s+solvents, catalysts and work-up not recovered\s+12000\.0", o);
        Assert.Contains("of which TOL", o, StringComparison.Ordinal);
    }

    [Fact]
    public void Compare_gives_each_version_with_student_t_intervals_welch_and_the_route_hand_worked()
    {
        var json = Json(_plant.Sandbox.Run("compare", "--recipe", LidocaineRoute.Recipe, "--versions", "1,2", "--json"));
        var scopes = json.GetProperty("scopes").EnumerateArray().ToList();
        Assert.Equal(["S1", "S2", "S3", "route"], scopes.Select(s => s.GetProperty("scope").GetString()));

        var route = scopes[3];
        var g1 = route.GetProperty("groups")[0];
        var g2 = route.GetProperty("groups")[1];
        Assert.Equal((1, LastOfVersion1, 2, Count - LastOfVersion1), (g1.GetProperty("version").GetInt32(), g1.GetProperty("batches").GetInt32(), g2.GetProperty("version").GetInt32(), g2.GetProperty("batches").GetInt32()));

        // Route yield and cumulative PMI batch by batch (see RouteYield and RoutePmi above), averaged over each version.
        Near(Batches(1).Average(RouteYield), g1.GetProperty("meanYieldPct").GetDouble(), 1e-3);
        Near(Batches(2).Average(RouteYield), g2.GetProperty("meanYieldPct").GetDouble(), 1e-3);
        Near(Batches(1).Average(RoutePmi), g1.GetProperty("pmi").GetDouble(), 1e-3);
        Near(Batches(2).Average(RoutePmi), g2.GetProperty("pmi").GetDouble(), 1e-3);
        // Solvent share of the route's mass in: toluene 400 + 300 (v1) or 220 (v2) and acetone 250 kg a batch.
        var solvent1 = Batches(1).Sum(n => 400.0 + 300.0 + 250.0) / Batches(1).Sum(n => MassIn(n).S1 + MassIn(n).S2 + MassIn(n).S3);
        Near(100 * solvent1, g1.GetProperty("solventSharePct").GetDouble(), 1e-3);

        // S2 yield of version 1: x̄ ± t(0.975, 22) · s / √23 with t = 2.074 (NIST/SEMATECH e-Handbook 1.3.6.7.2, t table, from memory).
        var y1 = Batches(1).Select(S2Yield).ToList();
        var m = y1.Average();
        var s = Math.Sqrt(y1.Sum(y => (y - m) * (y - m)) / (y1.Count - 1));
        var s2 = scopes[1].GetProperty("groups")[0];
        Near(m, s2.GetProperty("meanYieldPct").GetDouble(), 1e-3);
        Near(m - (2.074 * s / Math.Sqrt(23)), s2.GetProperty("yieldLowPct").GetDouble(), 1e-2);
        Near(m + (2.074 * s / Math.Sqrt(23)), s2.GetProperty("yieldHighPct").GetDouble(), 1e-2);

        // Welch: difference v2 − v1 of the S2 mean yields; version 2 isolates 92/90 as much lidocaine, a difference the test sees.
        var y2 = Batches(2).Select(S2Yield).ToList();
        var difference = scopes[1].GetProperty("difference");
        Near(y2.Average() - m, difference.GetProperty("difference").GetDouble(), 1e-3);
        Assert.True(difference.GetProperty("pValue").GetDouble() < 0.05);
        Assert.False(scopes[1].GetProperty("tooFew").GetBoolean());
        Assert.StartsWith("the mean yield of v2 differs from v1 at the 5 % level", scopes[1].GetProperty("conclusion").GetString(), StringComparison.Ordinal);
    }

    [Fact]
    public void Compare_says_plainly_when_a_version_has_too_few_batches()
    {
        // Up to 2026-11-26: version 2 has its first two batches only (24 and 25).
        var json = Json(_plant.Sandbox.Run("compare", "--recipe", LidocaineRoute.Recipe, "--versions", "1,2", "--to", "2026-11-26", "--json"));
        var text = _plant.Sandbox.Run("compare", "--recipe", LidocaineRoute.Recipe, "--versions", "1,2", "--to", "2026-11-26");

        foreach (var scope in json.GetProperty("scopes").EnumerateArray())
        {
            Assert.True(scope.GetProperty("tooFew").GetBoolean());
            Assert.StartsWith("too few batches to conclude (n < 3)", scope.GetProperty("conclusion").GetString(), StringComparison.Ordinal);
            Assert.Equal(2, scope.GetProperty("groups")[1].GetProperty("batches").GetInt32());
        }

        Assert.Contains("too few batches to conclude (n < 3): v1 has 23, v2 has 2 batch(es) with a yield", text.Out, StringComparison.Ordinal);
    }

    [Fact]
    public void Report_writes_one_self_contained_page_and_prints_its_path()
    {
        var out1 = Path.Combine(_plant.Sandbox.Root, "report-lid.html");
        var (exit, o, e) = _plant.Sandbox.Run("report", "--recipe", LidocaineRoute.Recipe, "--out", out1);

        Assert.True(exit == 0, e);
        Assert.Equal(out1, o.Trim());
        var html = File.ReadAllText(out1);
        foreach (var step in new[] { "S1", "S2", "S3" })
        {
            Assert.Contains($"<article class=\"trend\" id=\"trend-{step}\">", html, StringComparison.Ordinal);
            Assert.Contains($"data-chart=\"control\" data-step=\"{step}\"", html, StringComparison.Ordinal);
        }

        Assert.Contains("data-signals=\"rule-1", html, StringComparison.Ordinal);
        Assert.Contains("data-chart=\"pareto\"", html, StringComparison.Ordinal);
        Assert.Contains("data-scope=\"route\"", html, StringComparison.Ordinal);
        Assert.Contains("Step S1: acylation, yield", html, StringComparison.Ordinal); // names from the definitions
        Assert.DoesNotContain("<script", html, StringComparison.Ordinal);
        Assert.DoesNotContain("http://", html.Replace("http://www.w3.org/2000/svg", "", StringComparison.Ordinal), StringComparison.Ordinal);
        Assert.DoesNotContain("https://", html, StringComparison.Ordinal);
    }

    [Fact]
    public void Report_to_a_folder_that_does_not_exist_is_bad_input()
    {
        var target = Path.Combine(_plant.Sandbox.Root, "no-such-folder", "r.html");
        var (exit, o, e) = _plant.Sandbox.Run("report", "--recipe", LidocaineRoute.Recipe, "--out", target);

        Assert.Equal(2, exit);
        Assert.Empty(o);
        Assert.Contains($"--out '{target}': the folder", e, StringComparison.Ordinal);
        Assert.False(File.Exists(target));
    }

    /// <summary>What the store holds (rows of revisions, flags and the audit trail), to show that a refused command changed nothing.</summary>
    private sealed record DataRootCounts(long Rows)
    {
        public DataRootCounts(AnalysisSandbox s)
            : this(Count(s))
        {
        }

        private static long Count(AnalysisSandbox s) =>
            s.Scalar("SELECT (SELECT count(*) FROM batch_revision) + (SELECT count(*) FROM flag) + (SELECT count(*) FROM audit_event) + (SELECT count(*) FROM step_result)");
    }

    /// <summary>The 30 batches, ingested once for the class, on one store.</summary>
    public abstract class Plant : IDisposable
    {
        protected Plant(StoreProvider provider)
        {
            Sandbox = new(provider);
            Sandbox.Ingest(Enumerable.Range(1, Count).Select(n =>
                LidocaineRoute.Export(AnalysisSandbox.BatchId(n), Version(n), Day(n), Cdma(n), Lid(n), Salt(n))));
        }

        public AnalysisSandbox Sandbox { get; }

        public void Dispose()
        {
            Sandbox.Dispose();
            GC.SuppressFinalize(this);
        }
    }

    public sealed class SqlitePlant() : Plant(StoreProvider.Sqlite);

    public sealed class PostgresqlPlant() : Plant(StoreProvider.Postgresql);
}

/// <summary>The tests above on the embedded store.</summary>
public sealed class AnalysisCliTestsOnSqlite(AnalysisCliTests.SqlitePlant plant) : AnalysisCliTests(plant), IClassFixture<AnalysisCliTests.SqlitePlant>;

/// <summary>The tests above on PostgreSQL (a site of its own on the tests' server).</summary>
public sealed class AnalysisCliTestsOnPostgresql(AnalysisCliTests.PostgresqlPlant plant) : AnalysisCliTests(plant), IClassFixture<AnalysisCliTests.PostgresqlPlant>;
