using System.Globalization;
using System.Text.Json;
using BatchReconcile.Storage;
using BatchReconcile.Tests.Support;

namespace BatchReconcile.Tests.Review;

/// <summary>
/// The QA review trail through the command line, in process: flags list, flags review (allowed and refused
/// transitions), audit verify before and after the store is altered behind the program's back (the sqlite3 shell, or
/// a PostgreSQL session with triggers off), and digest --day. Each test runs the demo scenario into its own sandbox;
/// one fixture on both stores (a subclass per provider at the end of the file).
/// </summary>
public abstract class ReviewTrailTests : IDisposable
{
    private readonly HostSandbox _sandbox;

    protected ReviewTrailTests(StoreProvider provider) => _sandbox = new HostSandbox(TimeProvider.System, provider);

    [Fact]
    public void A_flag_goes_from_open_to_in_review_to_closed_and_the_trail_verifies()
    {
        var id = FirstFlagOf("2026-11-24");

        Ok("flags", "review", id, "--state", "in-review", "--by", "A. Chen", "--note", "checking the TEA charge record");
        var closed = Ok("flags", "review", id, "--state", "closed", "--by", "A. Chen", "--note", "second drum charged late", "--outcome", "explained");

        Assert.Contains("closed (explained)", closed.Out);
        var open = Ok("flags", "list", "--open", "--json");
        Assert.DoesNotContain(JsonDocument.Parse(open.Out).RootElement.EnumerateArray(), f => Id(f) == id);
        var verify = Ok("audit", "verify");
        Assert.Contains("audit trail intact", verify.Out);
    }

    [Theory]
    // Closing needs an outcome.
    [InlineData(new[] { "--state", "closed", "--by", "Q", "--note", "n" }, "outcome")]
    // The outcome deviation needs its reference.
    [InlineData(new[] { "--state", "closed", "--by", "Q", "--note", "n", "--outcome", "deviation" }, "--deviation")]
    // A note is always needed.
    [InlineData(new[] { "--state", "in-review", "--by", "Q", "--note", " " }, "note")]
    public void A_refused_review_exits_2_saying_why_and_changes_nothing(string[] options, string why)
    {
        var id = FirstFlagOf("2026-11-24");
        var trail = _sandbox.Scalar("SELECT count(*) FROM audit_event");

        var result = _sandbox.Run(["flags", "review", id, .. options]);

        Assert.Equal(2, result.Exit);
        Assert.Contains(why, result.Err);
        Assert.Single(result.Err.TrimEnd().Split('\n'));
        var flag = JsonDocument.Parse(Ok("flags", "list", "--day", "2026-11-24", "--json").Out).RootElement.EnumerateArray()
            .Single(f => Id(f) == id);
        Assert.Equal("open", flag.GetProperty("state").GetString());
        Assert.Equal(trail, _sandbox.Scalar("SELECT count(*) FROM audit_event"));
    }

    [Fact]
    public void Closing_a_closed_flag_is_refused_and_a_deviation_keeps_its_reference()
    {
        var id = FirstFlagOf("2026-11-25");
        Ok("flags", "review", id, "--state", "closed", "--by", "B. Osei", "--note", "wet cake", "--outcome", "deviation", "--deviation", "DEV-2026-0412");

        var again = _sandbox.Run("flags", "review", id, "--state", "closed", "--by", "B. Osei", "--note", "again", "--outcome", "explained");

        Assert.Equal(2, again.Exit);
        Assert.Contains("already closed", again.Err);
        // The reason names the flag once ("flag 5: flag 5 is already closed" said it twice).
        var line = Assert.Single(again.Err.Split('\n'), l => l.Contains("already closed", StringComparison.Ordinal));
        Assert.Equal(1, System.Text.RegularExpressions.Regex.Count(line, $"flag {id}\\b"));
        var list = Ok("flags", "list", "--day", "2026-11-25");
        Assert.Contains("closed (deviation)", list.Out);
    }

    [Fact]
    public void Audit_verify_fails_naming_the_entry_after_a_row_is_altered_behind_the_programs_back()
    {
        var id = FirstFlagOf("2026-11-24");
        Ok("flags", "review", id, "--state", "in-review", "--by", "A. Chen", "--note", "looking");
        var entry = _sandbox.Scalar("SELECT max(id) FROM audit_event WHERE subject = 'flag:" + id + "'");

        // Someone with the database's own tools drops the append-only trigger (or turns triggers off) and rewrites the note.
        _sandbox.Tamper($"DROP TRIGGER IF EXISTS audit_event_no_update; UPDATE audit_event SET note = 'nothing to see' WHERE id = {entry};");
        var result = _sandbox.Run("audit", "verify");

        Assert.Equal(1, result.Exit);
        Assert.Contains($"entry {entry}", result.Err);
    }

    [Fact]
    public void Audit_verify_fails_naming_the_flag_and_both_values_after_the_flag_table_is_edited_behind_the_programs_back()
    {
        var id = FirstFlagOf("2026-11-25");
        Ok("flags", "review", id, "--state", "closed", "--by", "A. Chen", "--note", "assay low, deviation raised", "--outcome", "deviation", "--deviation", "DEV-2026-117");
        Assert.Contains("audit trail intact", Ok("audit", "verify").Out);

        // A person with database access gets past the review-validation triggers and turns the deviation into an explained flag.
        _sandbox.Tamper($"DROP TRIGGER flag_review_valid_update; UPDATE flag SET outcome = 'explained', deviation_ref = NULL, reviewed_by = 'B. Osei' WHERE id = {id};");
        var list = Ok("flags", "list", "--day", "2026-11-25");
        Assert.Contains("closed (explained)", list.Out);
        var result = _sandbox.Run("audit", "verify");

        Assert.Equal(1, result.Exit);
        Assert.Contains($"flag {id}: outcome is 'explained' in the live tables but the trail (entry", result.Err);
        Assert.Contains("says 'deviation'", result.Err);
        Assert.Contains($"flag {id}: deviation reference is none in the live tables but the trail", result.Err);
        Assert.Contains("'DEV-2026-117'", result.Err);
        Assert.Contains($"flag {id}: reviewer is 'B. Osei' in the live tables", result.Err);
        Assert.Contains("3 live values differ", result.Err);
    }

    [Fact]
    public void Digest_of_a_day_writes_three_files_and_a_rewrite_is_recorded()
    {
        Ok("demo", "--samples", Samples);

        var first = Ok("digest", "--day", "2026-11-25", "--json");
        var second = Ok("digest", "--day", "2026-11-25", "--json", "--by", "A. Chen");

        using var doc = JsonDocument.Parse(second.Out);
        Assert.Equal("2026-11-25", doc.RootElement.GetProperty("day").GetString());
        var files = doc.RootElement.GetProperty("files").EnumerateArray().Select(f => f.GetString()!).ToList();
        Assert.Equal(new[] { ".html", ".md", ".csv" }, files.Select(Path.GetExtension));
        Assert.All(files, f => Assert.True(new FileInfo(f).Length > 0));
        // sample-data/README.md: three flags on the 25th (NB-0163 balance-gap, PZ-0231 yield-over-theory, BZ-0413 yield-low).
        Assert.Equal(3, doc.RootElement.GetProperty("flags").GetInt32());
        Assert.Equal(1, _sandbox.Scalar("SELECT count(*) FROM audit_event WHERE kind = 'digest.rewritten'"));
        Assert.NotEqual(string.Empty, first.Out);
        Assert.Contains("audit trail intact", Ok("audit", "verify").Out);
        // What the rewrite logs is tested on the real program (BatchReconcile.Cli.Tests, Review/ReviewLogTests).
    }

    private static string Samples => Path.Combine(HostSandbox.RepositoryRoot, "sample-data", "inbox");

    private static string Id(JsonElement flag) => flag.GetProperty("id").GetInt64().ToString(CultureInfo.InvariantCulture);

    private string FirstFlagOf(string day)
    {
        Ok("demo", "--samples", Samples);
        var list = Ok("flags", "list", "--day", day, "--json");
        return Id(JsonDocument.Parse(list.Out).RootElement.EnumerateArray().First());
    }

    private (int Exit, string Out, string Err) Ok(params string[] args)
    {
        var result = _sandbox.Run(args);
        Assert.True(result.Exit == 0, $"batchreconcile {string.Join(' ', args)} exited {result.Exit}: {result.Err}");
        return result;
    }

    public void Dispose()
    {
        _sandbox.Dispose();
        GC.SuppressFinalize(this);
    }
}

/// <summary>The tests above on the embedded store.</summary>
public sealed class ReviewTrailTestsOnSqlite() : ReviewTrailTests(StoreProvider.Sqlite);

/// <summary>The tests above on PostgreSQL (a site of its own on the tests' server).</summary>
public sealed class ReviewTrailTestsOnPostgresql() : ReviewTrailTests(StoreProvider.Postgresql);
