using System.Globalization;
using System.Text.Json;
using BatchReconcile.Cli;
using BatchReconcile.Storage;
using BatchReconcile.Storage.Queries;
using BatchReconcile.Tests.Support;

namespace BatchReconcile.Tests.Cli;

/// <summary>
/// <c>batches list</c>, <c>flags show</c>, <c>audit list</c>/<c>show</c> and <c>export steps</c> in process, on a real
/// database filled by <c>ingest</c> of a copy of the demo plant's exports (sample-data/inbox). Expected lists are read
/// from the store itself, so the checks hold however the sample grows. On either store (<see cref="HostSandbox"/>).
/// </summary>
public abstract class AcrossBatchesCliTests : IDisposable
{
    private readonly HostSandbox _sandbox;

    protected AcrossBatchesCliTests(StoreProvider provider)
    {
        _sandbox = new(TimeProvider.System, provider);
        var drop = Path.Combine(_sandbox.Root, "drop");
        Directory.CreateDirectory(drop);
        foreach (var file in Directory.EnumerateFiles(Path.Combine(HostSandbox.RepositoryRoot, "sample-data", "inbox"), "*.csv"))
        {
            File.Copy(file, Path.Combine(drop, Path.GetFileName(file)));
        }

        var ingest = Run("ingest", drop, "--json");
        Assert.True(ingest.Exit is 0 or 3, ingest.Err);
    }

    public void Dispose()
    {
        _sandbox.Dispose();
        GC.SuppressFinalize(this);
    }

    private (int Exit, string Out, string Err) Run(params string[] args) => _sandbox.Run(args);

    private JsonElement Json(params string[] args)
    {
        var result = Run([.. args, "--json"]);
        Assert.True(result.Exit == 0, result.Err);
        return JsonDocument.Parse(result.Out).RootElement.Clone();
    }

    private T WithStore<T>(Func<BatchStore, T> read)
    {
        using var store = _sandbox.OpenStore();
        return read(store);
    }

    /// <summary>Changes stored rows behind the program's back (<see cref="HostSandbox.Tamper"/>).</summary>
    private void Sql(string sql) => _sandbox.Tamper(sql);

    /// <summary>Rows of revisions, flags, step results and the audit trail: what a refused command must leave as it was.</summary>
    private long StoredRows() =>
        _sandbox.Scalar("SELECT (SELECT count(*) FROM batch_revision) + (SELECT count(*) FROM flag) + (SELECT count(*) FROM audit_event) + (SELECT count(*) FROM step_result)");

    [Fact]
    public void Batches_list_gives_every_current_batch_in_production_order_in_json_and_text()
    {
        var expected = WithStore(s => s.ListBatches(BatchFilter.All));
        Assert.NotEmpty(expected);

        var json = Json("batches", "list").EnumerateArray().ToList();

        Assert.Equal(expected.Select(b => (b.BatchId, b.Revision)), json.Select(b => (b.GetProperty("batch").GetString()!, b.GetProperty("revision").GetInt32())));
        foreach (var name in new[] { "batch", "revision", "recipe", "recipeVersion", "day", "steps", "routeYieldPct", "routeYieldNote", "flags", "openFlags" })
        {
            Assert.All(json, b => Assert.True(b.TryGetProperty(name, out _), name));
        }

        var days = json.Select(b => b.GetProperty("day").GetString()!).ToList();
        Assert.Equal(days.Order(StringComparer.Ordinal), days);

        var text = Run("batches", "list");
        Assert.Equal(0, text.Exit);
        var lines = text.Out.TrimEnd().Split('\n').Select(l => l.TrimEnd('\r')).ToList();
        Assert.StartsWith("day ", lines[0], StringComparison.Ordinal);
        Assert.Contains("route yield", lines[0], StringComparison.Ordinal);
        Assert.Equal(expected.Count + 2, lines.Count);
        Assert.Equal(string.Create(CultureInfo.InvariantCulture, $"{expected.Count} batches"), lines[^1]);
        var first = expected[0];
        Assert.StartsWith(string.Create(CultureInfo.InvariantCulture, $"{first.ProductionDay:yyyy-MM-dd}  {first.BatchId}"), lines[1], StringComparison.Ordinal);
        Assert.Contains(string.Create(CultureInfo.InvariantCulture, $"{first.Recipe} v{first.RecipeVersion}"), lines[1], StringComparison.Ordinal);
        // A batch whose route yield is not computable says why instead of a number.
        Assert.All(expected.Where(b => b.RouteYieldPct is null).Select(b => lines.Single(l => l.Contains("  " + b.BatchId + " ", StringComparison.Ordinal))),
            line => Assert.Contains("not computable: ", line, StringComparison.Ordinal));
    }

    [Fact]
    public void Batches_list_filters_by_recipe_days_and_open_flags()
    {
        var all = WithStore(s => s.ListBatches(BatchFilter.All));
        var recipe = all[0].Recipe;
        var day = all[^1].ProductionDay.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture);

        Assert.All(Json("batches", "list", "--recipe", recipe).EnumerateArray(), b => Assert.Equal(recipe, b.GetProperty("recipe").GetString()));
        Assert.All(Json("batches", "list", "--from", day, "--to", day).EnumerateArray(), b => Assert.Equal(day, b.GetProperty("day").GetString()));
        var flagged = Json("batches", "list", "--flagged").EnumerateArray().ToList();
        Assert.Equal(all.Count(b => b.OpenFlagCount > 0), flagged.Count);
        Assert.All(flagged, b => Assert.True(b.GetProperty("openFlags").GetInt32() > 0));
    }

    [Theory]
    [InlineData(new[] { "batches", "list", "--from", "2026-02-30" }, "--from '2026-02-30'")]
    [InlineData(new[] { "batches", "list", "--to", "26-11-01" }, "--to '26-11-01'")]
    [InlineData(new[] { "batches", "list", "--from", "2026-11-28", "--to", "2026-11-01" }, "--from 2026-11-28 is after --to 2026-11-01")]
    [InlineData(new[] { "batches", "list", "--recipe", "XYZ-999" }, "--recipe 'XYZ-999'")]
    [InlineData(new[] { "flags", "show", "987654" }, "FLAG_ID 987654")]
    [InlineData(new[] { "audit", "show", "987654" }, "N 987654")]
    [InlineData(new[] { "audit", "list", "--kind", "flag.reveiw" }, "--kind 'flag.reveiw'")]
    [InlineData(new[] { "audit", "list", "--from", "yesterday" }, "--from 'yesterday'")]
    [InlineData(new[] { "export", "steps", "--recipe", "XYZ-999", "--out", "x.csv" }, "--recipe 'XYZ-999'")]
    [InlineData(new[] { "export", "steps", "--from", "2026-11-30", "--to", "2026-11-01", "--out", "x.csv" }, "--from 2026-11-30 is after --to 2026-11-01")]
    public void Bad_input_exits_2_with_one_line_naming_the_option_and_value(string[] args, string named)
    {
        var before = StoredRows();

        var result = Run(args);

        Assert.Equal(2, result.Exit);
        Assert.Contains(named, result.Err, StringComparison.Ordinal);
        Assert.Single(result.Err.TrimEnd().Split('\n'));
        Assert.Equal(string.Empty, result.Out);
        Assert.Equal(before, StoredRows());
    }

    [Fact]
    public void Empty_results_say_so_and_exit_0()
    {
        var batches = Run("batches", "list", "--from", "2099-01-01");
        Assert.Equal((0, "no batches from 2099-01-01"), (batches.Exit, batches.Out.TrimEnd()));
        Assert.Equal("[]", Run("batches", "list", "--from", "2099-01-01", "--json").Out.Trim());

        var audit = Run("audit", "list", "--from", "2099-01-01");
        Assert.Equal((0, "no audit entries from 2099-01-01"), (audit.Exit, audit.Out.TrimEnd()));

        var file = Path.Combine(_sandbox.Root, "none.csv");
        var export = Run("export", "steps", "--from", "2099-01-01", "--out", file);
        Assert.Equal(0, export.Exit);
        Assert.StartsWith("no batches from 2099-01-01", export.Out, StringComparison.Ordinal);
        Assert.Equal(string.Join(",", ExportCommand.Columns), File.ReadAllText(file).TrimEnd());
    }

    [Fact]
    public void Flags_show_gives_the_deciding_figures_stored_limits_and_review_history()
    {
        var flag = Json("flags", "list").EnumerateArray().First();
        var id = flag.GetProperty("id").GetInt64().ToString(CultureInfo.InvariantCulture);
        Assert.Equal(0, Run("flags", "review", id, "--state", "in-review", "--by", "A. Chen", "--note", "checking the drum weights").Exit);

        var shown = Json("flags", "show", id);

        Assert.Equal(flag.GetProperty("batch").GetString(), shown.GetProperty("batch").GetString());
        Assert.Equal("in-review", shown.GetProperty("state").GetString());
        Assert.Equal(flag.GetProperty("step").GetString(), shown.GetProperty("stepFigures").GetProperty("step").GetString());
        Assert.True(shown.GetProperty("stepFigures").GetProperty("limits").TryGetProperty("yieldMinPct", out _));
        var entry = Assert.Single(shown.GetProperty("history").EnumerateArray());
        Assert.Equal(("flag.review", "A. Chen", "open", "in-review"),
            (entry.GetProperty("kind").GetString(), entry.GetProperty("actor").GetString(), entry.GetProperty("fromState").GetString(), entry.GetProperty("toState").GetString()));

        var text = Run("flags", "show", id);
        Assert.Equal(0, text.Exit);
        Assert.StartsWith($"flag #{id}: ", text.Out, StringComparison.Ordinal);
        Assert.Contains("    limits: yield ", text.Out, StringComparison.Ordinal);
        Assert.Contains("review history (1 entry of the audit trail):", text.Out, StringComparison.Ordinal);
        Assert.Contains("flag.review flag:" + id + " by A. Chen: open -> in-review \"checking the drum weights\"", text.Out, StringComparison.Ordinal);
    }

    [Fact]
    public void Flags_show_says_unknown_for_limits_stored_before_they_were_kept_never_0()
    {
        var id = Json("flags", "list").EnumerateArray().First().GetProperty("id").GetInt64();
        // As a row stored before migration 6 holds it: no limits.
        Sql($"""
            UPDATE step_result SET yield_min_pct = NULL, yield_max_pct = NULL, balance_tolerance_pct = NULL, coverage_factor = NULL,
                expanded_uncertainty_kg = NULL, equivalents_ranges = NULL, product_in_waste_max_pct = NULL
            WHERE (revision_ref, step) = (SELECT revision_ref, step FROM flag WHERE id = {id});
            """);
        var key = id.ToString(CultureInfo.InvariantCulture);

        var text = Run("flags", "show", key);
        var json = Json("flags", "show", key);

        Assert.Contains("    limits: yield unknown, balance tolerance unknown, product in waste unknown, equivalents unknown", text.Out, StringComparison.Ordinal);
        Assert.Contains("(U unknown, k unknown)", text.Out, StringComparison.Ordinal);
        var limits = json.GetProperty("stepFigures").GetProperty("limits");
        Assert.All(limits.EnumerateObject(), p => Assert.Equal(JsonValueKind.Null, p.Value.ValueKind));
    }

    [Fact]
    public void Audit_list_filters_by_kind_and_audit_show_gives_one_entry_whose_hash_matches()
    {
        var id = Json("flags", "list").EnumerateArray().First().GetProperty("id").GetInt64().ToString(CultureInfo.InvariantCulture);
        Assert.Equal(0, Run("flags", "review", id, "--state", "closed", "--by", "B. Osei", "--note", "wet cake", "--outcome", "deviation", "--deviation", "DEV-2026-0412").Exit);

        var all = Json("audit", "list").EnumerateArray().ToList();
        var reviews = Json("audit", "list", "--kind", "flag.review").EnumerateArray().ToList();
        var ingests = Json("audit", "list", "--kind", "ingest").EnumerateArray().ToList();

        Assert.Equal(WithStore(s => s.ListAudit(new AuditFilter()).Count), all.Count);
        Assert.All(reviews, e => Assert.Equal("flag.review", e.GetProperty("kind").GetString()));
        Assert.Contains(reviews, e => e.GetProperty("subject").GetString() == "flag:" + id && e.GetProperty("deviationRef").GetString() == "DEV-2026-0412");
        Assert.NotEmpty(ingests);
        Assert.All(ingests, e => Assert.StartsWith("ingest.", e.GetProperty("kind").GetString(), StringComparison.Ordinal));
        Assert.Equal("object", ingests[0].GetProperty("detail").ValueKind.ToString().ToLowerInvariant());

        var last = reviews[^1].GetProperty("id").GetInt64().ToString(CultureInfo.InvariantCulture);
        var shown = Json("audit", "show", last);
        Assert.True(shown.GetProperty("contentMatchesHash").GetBoolean());
        Assert.Equal(reviews[^1].GetProperty("hash").GetString(), shown.GetProperty("entry").GetProperty("hash").GetString());
        var text = Run("audit", "show", last);
        Assert.Contains("  deviation: DEV-2026-0412", text.Out, StringComparison.Ordinal);
        Assert.Contains("(its content gives this hash)", text.Out, StringComparison.Ordinal);

        var listed = Run("audit", "list", "--kind", "flag");
        Assert.EndsWith(string.Create(CultureInfo.InvariantCulture, $"{reviews.Count} entr{(reviews.Count == 1 ? "y" : "ies")}"), listed.Out.TrimEnd(), StringComparison.Ordinal);
    }

    [Fact]
    public void Export_steps_writes_one_header_and_one_row_per_current_batch_step_with_formula_like_cells_neutralised()
    {
        var rows = WithStore(s =>
        {
            var list = new List<(string Recipe, RecipeStepRow Row)>();
            s.ForEachStep(null, null, null, (r, row) => list.Add((r, row)));
            return list;
        });
        var first = rows[0].Row;
        // A batch id and a ladder that a spreadsheet would read as formulas; a negative gap that must stay a number.
        Sql($"""
            UPDATE batch SET batch_id = '=1+2' WHERE batch_id = '{first.BatchId}';
            UPDATE step_result SET gap_kg = -1.5, limiting_reactant = '@SUM(A1)'
            WHERE step = '{first.Outcome.Step}' AND is_current = 1 AND revision_ref = (SELECT r.id FROM batch_revision r JOIN batch b ON b.id = r.batch_ref WHERE b.batch_id = '=1+2' AND r.superseded_at IS NULL);
            """);
        var file = Path.Combine(_sandbox.Root, "steps.csv");

        var result = Run("export", "steps", "--out", file);

        Assert.True(result.Exit == 0, result.Err);
        var lines = File.ReadAllText(file).Split("\r\n", StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal(string.Join(",", ExportCommand.Columns), lines[0]);
        Assert.Equal(rows.Count + 1, lines.Length);
        Assert.StartsWith(string.Create(CultureInfo.InvariantCulture, $"\"'=1+2\",{first.Revision},{rows[0].Recipe},{first.RecipeVersion},{first.Day:yyyy-MM-dd},"), lines[1], StringComparison.Ordinal);
        Assert.Contains(",\"'@SUM(A1)\",", lines[1], StringComparison.Ordinal);
        Assert.Contains(",-1.5,", lines[1], StringComparison.Ordinal);
        Assert.Contains(string.Create(CultureInfo.InvariantCulture, $"{rows.Count} step rows of "), result.Out, StringComparison.Ordinal);
        // Only temporary files of its own are ever beside it, and none is left.
        Assert.Empty(Directory.EnumerateFiles(_sandbox.Root, ".steps.csv.*"));

        var recipe = rows[^1].Recipe;
        var one = Path.Combine(_sandbox.Root, "one.csv");
        Assert.Equal(0, Run("export", "steps", "--recipe", recipe, "--out", one).Exit);
        Assert.Equal(rows.Count(r => r.Recipe == recipe) + 1, File.ReadAllText(one).Split("\r\n", StringSplitOptions.RemoveEmptyEntries).Length);
    }
}

/// <summary>The tests above on the embedded store.</summary>
public sealed class AcrossBatchesCliTestsOnSqlite() : AcrossBatchesCliTests(StoreProvider.Sqlite);

/// <summary>The tests above on PostgreSQL (a site of its own on the tests' server).</summary>
public sealed class AcrossBatchesCliTestsOnPostgresql() : AcrossBatchesCliTests(StoreProvider.Postgresql);
