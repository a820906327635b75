using System.Text.Json;
using BatchReconcile.Cli.Tests.Support;

namespace BatchReconcile.Cli.Tests.Review;

/// <summary>
/// What the real program logs about the review trail: the trail itself is tested in process on both stores
/// (BatchReconcile.Tests, Review/ReviewTrailTests); the log is read here, from a process that has ended.
/// </summary>
public sealed class ReviewLogTests : IDisposable
{
    private readonly TempFolder _temp = new();

    private string Data => _temp.Sub("data");

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
    public async Task A_digest_rewrite_is_logged_with_the_day_in_iso_form_and_who_asked()
    {
        await Ok("demo", "--samples", Path.Combine(RepoPaths.Root, "sample-data", "inbox"));
        await Ok("digest", "--day", "2026-11-25");

        var second = await Ok("digest", "--day", "2026-11-25", "--by", "A. Chen");

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

    public void Dispose() => _temp.Dispose();
}
