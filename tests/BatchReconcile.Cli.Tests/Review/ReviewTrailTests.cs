using System.Diagnostics;
using System.Text.Json;
using BatchReconcile.Cli.Tests.Support;

namespace BatchReconcile.Cli.Tests.Review;

/// <summary>
/// The QA review trail through the real program: flags list, flags review (allowed and refused
/// transitions), audit verify before and after the audit table is altered with the sqlite3 shell,
/// and digest --day. Each test runs the demo scenario into its own data folder.
/// </summary>
public sealed class ReviewTrailTests : IDisposable
{
    private readonly TempFolder _temp = new();

    private string Data => _temp.Sub("data");

    [Fact]
    public async Task A_flag_goes_from_open_to_in_review_to_closed_and_the_trail_verifies()
    {
        var id = await FirstFlagOf("2026-11-24");

        await Ok("flags", "review", id, "--state", "in-review", "--by", "A. Chen", "--note", "checking the TEA charge record");
        var closed = await Ok("flags", "review", id, "--state", "closed", "--by", "A. Chen", "--note", "second drum charged late", "--outcome", "explained");

        Assert.Contains("closed (explained)", closed.Stdout);
        var open = await Ok("flags", "list", "--open", "--json");
        Assert.DoesNotContain(JsonDocument.Parse(open.Stdout).RootElement.EnumerateArray(), f => f.GetProperty("id").GetInt64().ToString(System.Globalization.CultureInfo.InvariantCulture) == id);
        var verify = await Ok("audit", "verify");
        Assert.Contains("audit trail intact", verify.Stdout);
    }

    [Theory]
    // Closing needs an outcome.
    [InlineData(new[] { "--state", "closed", "--by", "Q", "--note", "n" }, "outcome")]
    // The outcome deviation needs its reference.
    [InlineData(new[] { "--state", "closed", "--by", "Q", "--note", "n", "--outcome", "deviation" }, "--deviation")]
    // A note is always needed.
    [InlineData(new[] { "--state", "in-review", "--by", "Q", "--note", " " }, "note")]
    public async Task A_refused_review_exits_2_saying_why_and_changes_nothing(string[] options, string why)
    {
        var id = await FirstFlagOf("2026-11-24");

        var result = await Run(["flags", "review", id, .. options]);

        Assert.Equal(2, result.ExitCode);
        Assert.Contains(why, result.Stderr);
        Assert.Single(result.Stderr.TrimEnd().Split('\n'));
        var flag = JsonDocument.Parse((await Ok("flags", "list", "--day", "2026-11-24", "--json")).Stdout).RootElement.EnumerateArray()
            .Single(f => f.GetProperty("id").GetInt64().ToString(System.Globalization.CultureInfo.InvariantCulture) == id);
        Assert.Equal("open", flag.GetProperty("state").GetString());
    }

    [Fact]
    public async Task Closing_a_closed_flag_is_refused_and_a_deviation_keeps_its_reference()
    {
        var id = await FirstFlagOf("2026-11-25");
        await Ok("flags", "review", id, "--state", "closed", "--by", "B. Osei", "--note", "wet cake", "--outcome", "deviation", "--deviation", "DEV-2026-0412");

        var again = await Run(["flags", "review", id, "--state", "closed", "--by", "B. Osei", "--note", "again", "--outcome", "explained"]);

        Assert.Equal(2, again.ExitCode);
        Assert.Contains("already closed", again.Stderr);
        // The reason names the flag once ("flag 5: flag 5 is already closed" said it twice).
        var line = Assert.Single(again.Stderr.Split('\n'), l => l.Contains("already closed", StringComparison.Ordinal));
        Assert.Equal(1, System.Text.RegularExpressions.Regex.Count(line, $"flag {id}\\b"));
        var list = await Ok("flags", "list", "--day", "2026-11-25");
        Assert.Contains("closed (deviation)", list.Stdout);
    }

    [Fact]
    public async Task Audit_verify_fails_naming_the_entry_after_a_row_is_altered_with_the_sqlite3_shell()
    {
        var id = await FirstFlagOf("2026-11-24");
        await Ok("flags", "review", id, "--state", "in-review", "--by", "A. Chen", "--note", "looking");
        var entry = Scalar("SELECT max(id) FROM audit_event WHERE subject = 'flag:" + id + "'");

        // Someone with file access drops the append-only trigger and rewrites the note.
        Sqlite3($"DROP TRIGGER IF EXISTS audit_event_no_update; UPDATE audit_event SET note = 'nothing to see' WHERE id = {entry};");
        var result = await Run(["audit", "verify"]);

        Assert.Equal(1, result.ExitCode);
        Assert.Contains($"entry {entry}", result.Stderr);
    }

    [Fact]
    public async Task Audit_verify_fails_naming_the_flag_and_both_values_after_the_flag_table_is_edited_with_the_sqlite3_shell()
    {
        var id = await FirstFlagOf("2026-11-25");
        await Ok("flags", "review", id, "--state", "closed", "--by", "A. Chen", "--note", "assay low, deviation raised", "--outcome", "deviation", "--deviation", "DEV-2026-117");
        Assert.Contains("audit trail intact", (await Ok("audit", "verify")).Stdout);

        // A person with shell access drops the review-validation triggers and turns the deviation into an explained flag.
        Sqlite3($"DROP TRIGGER flag_review_valid_update; UPDATE flag SET outcome = 'explained', deviation_ref = NULL, reviewed_by = 'B. Osei' WHERE id = {id};");
        var list = await Ok("flags", "list", "--day", "2026-11-25");
        Assert.Contains("closed (explained)", list.Stdout);
        var result = await Run(["audit", "verify"]);

        Assert.Equal(1, result.ExitCode);
        Assert.Contains($"flag {id}: outcome is 'explained' in the live tables but the trail (entry", result.Stderr);
        Assert.Contains("says 'deviation'", result.Stderr);
        Assert.Contains($"flag {id}: deviation reference is none in the live tables but the trail", result.Stderr);
        Assert.Contains("'DEV-2026-117'", result.Stderr);
        Assert.Contains($"flag {id}: reviewer is 'B. Osei' in the live tables", result.Stderr);
        Assert.Contains("3 live values differ", result.Stderr);
    }

    [Fact]
    public async Task Log_lines_use_the_names_a_user_reads_not_the_programs_internal_ones()
    {
        await FirstFlagOf("2026-11-25");

        var log = string.Concat(Directory.EnumerateFiles(Path.Combine(Data, "logs")).Select(File.ReadAllText));

        // sample-data/README.md: BZ-0413 on the 25th is yield-low (major).
        Assert.Matches(@"batch KB3-BZ-0413 step S\d flag yield-low \(major\): ", log);
        Assert.Matches(@"batch KB3-[A-Z]+-\d+ new as revision 1 with \d+ flags", log);
        Assert.Matches(@"recipe NBB-150 version 1, step S1: reaction '[^']+' was written without coefficients and was balanced to", log);
        foreach (var internalName in new[] { "YieldLow", "BalanceGap", "YieldOverTheory", "(Major)", "(Critical)", "(Minor)", "\"New\"", "\"Revision\"" })
        {
            Assert.DoesNotContain(internalName, log, StringComparison.Ordinal);
        }
    }

    [Fact]
    public async Task Digest_of_a_day_writes_three_files_and_a_rewrite_is_recorded()
    {
        await Ok("demo", "--samples", Path.Combine(RepoPaths.Root, "sample-data", "inbox"));

        var first = await Ok("digest", "--day", "2026-11-25", "--json");
        var second = await Ok("digest", "--day", "2026-11-25", "--json", "--by", "A. Chen");

        using var doc = JsonDocument.Parse(second.Stdout);
        Assert.Equal("2026-11-25", doc.RootElement.GetProperty("day").GetString());
        var files = doc.RootElement.GetProperty("files").EnumerateArray().Select(f => f.GetString()!).ToList();
        Assert.Equal(new[] { ".html", ".md", ".csv" }, files.Select(Path.GetExtension));
        Assert.All(files, f => Assert.True(new FileInfo(f).Length > 0));
        // sample-data/README.md: three flags on the 25th (NB-0163 balance-gap, PZ-0231 yield-over-theory, BZ-0413 yield-low).
        Assert.Equal(3, doc.RootElement.GetProperty("flags").GetInt32());
        Assert.Equal(1, Scalar("SELECT count(*) FROM audit_event WHERE kind = 'digest.rewritten'"));
        Assert.NotEqual(string.Empty, first.Stdout);
        // The log names the day in ISO form, never in a culture's date pattern (01/05/2026 is ambiguous).
        Assert.Contains("Digest of 2026-11-25 rewritten as issue 2", second.Stderr, StringComparison.Ordinal);
        Assert.Contains("rewritten at the request of A. Chen", second.Stderr, StringComparison.Ordinal);
    }

    private async Task<string> FirstFlagOf(string day)
    {
        await Ok("demo", "--samples", Path.Combine(RepoPaths.Root, "sample-data", "inbox"));
        var list = await Ok("flags", "list", "--day", day, "--json");
        return JsonDocument.Parse(list.Stdout).RootElement.EnumerateArray().First().GetProperty("id").GetInt64()
            .ToString(System.Globalization.CultureInfo.InvariantCulture);
    }

    private async Task<ProgramResult> Ok(params string[] args)
    {
        var result = await Run(args);
        Assert.True(result.ExitCode == 0, $"batchreconcile {string.Join(' ', args)} exited {result.ExitCode}: {result.Stderr}");
        return result;
    }

    private Task<ProgramResult> Run(string[] args) => ProgramRunner.RunAsync([.. args, "--data", Data]);

    private long Scalar(string sql) => new DataRoot(Data).Scalar(sql);

    private void Sqlite3(string sql)
    {
        var start = new ProcessStartInfo("sqlite3") { RedirectStandardError = true, UseShellExecute = false };
        start.ArgumentList.Add(Path.Combine(Data, "batchreconcile.db"));
        start.ArgumentList.Add(sql);
        Process process;
        try
        {
            process = Process.Start(start)!;
        }
        catch (System.ComponentModel.Win32Exception e)
        {
            throw new InvalidOperationException("the sqlite3 shell is needed for this test: apt-get install sqlite3", e);
        }

        using (process)
        {
            process.WaitForExit();
            Assert.True(process.ExitCode == 0, process.StandardError.ReadToEnd());
        }
    }

    public void Dispose() => _temp.Dispose();
}
