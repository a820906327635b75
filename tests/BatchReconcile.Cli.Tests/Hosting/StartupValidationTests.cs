using BatchReconcile.Cli.Tests.Support;

namespace BatchReconcile.Cli.Tests.Hosting;

/// <summary>Bad settings or process definitions stop every command before any file is touched (exit 2, one line).</summary>
public class StartupValidationTests
{
    private static readonly string SampleFile = Path.Combine(RepoPaths.Root, "sample-data", "inbox", "2026-11-23T1012_KB3-PZ-0227.csv");

    [Fact]
    public async Task A_reaction_that_does_not_balance_stops_start_up_naming_file_recipe_step_and_element()
    {
        using var temp = new TempFolder();
        var config = TestConfig.CopyVerbatim(temp.Sub("config"));
        var file = Path.Combine(config, "processes", "piperazine.json");
        // One HCl too many, written as a coefficient: H and Cl no longer balance.
        File.WriteAllText(file, File.ReadAllText(file).Replace("BOCPZ + 2 HCL -> PPZ2HCL", "BOCPZ + 3 HCL -> PPZ2HCL", StringComparison.Ordinal));

        var result = await ProgramRunner.RunAsync("check", SampleFile, "--config", config, "--data", temp.Sub("data"));

        Assert.Equal(2, result.ExitCode);
        // A heading, then each problem on a line of its own naming file, recipe, version and step.
        var lines = result.Stderr.TrimEnd().Split('\n');
        Assert.Equal(2, lines.Length);
        Assert.EndsWith("refused (1 problem):", lines[0], StringComparison.Ordinal);
        Assert.Contains("processes/piperazine.json, recipe PPZ-220 version 1, step S1: reaction 'BOCPZ + 3 HCL -> PPZ2HCL", lines[1], StringComparison.Ordinal);
        Assert.Contains("Cl by 1 (reactants 3, products 2)", lines[1], StringComparison.Ordinal);
        Assert.EndsWith("is a HCL (hydrogen chloride) missing on the right (or one too many on the left)?", lines[1].TrimEnd(), StringComparison.Ordinal);
        Assert.False(File.Exists(temp.Sub("data", "batchreconcile.db")));
    }

    [Fact]
    public async Task Several_definition_problems_stop_start_up_one_per_line_with_a_suggestion_for_an_unknown_code()
    {
        using var temp = new TempFolder();
        var config = TestConfig.CopyVerbatim(temp.Sub("config"));
        var file = Path.Combine(config, "processes", "piperazine.json");
        var text = File.ReadAllText(file);
        Assert.Contains("BOCPZ + 2 HCL -> PPZ2HCL", text);
        Assert.Contains("\"product\": \"PPZ2HCL\"", text);
        File.WriteAllText(file, text
            .Replace("BOCPZ + 2 HCL -> PPZ2HCL", "BOCPZ + 2 HLC -> PPZ2HCL", StringComparison.Ordinal)
            .Replace("\"product\": \"PPZ2HCL\"", "\"product\": \"PPZ2HC\"", StringComparison.Ordinal));

        var result = await ProgramRunner.RunAsync("check", SampleFile, "--config", config, "--data", temp.Sub("data"));

        Assert.Equal(2, result.ExitCode);
        var lines = result.Stderr.TrimEnd().Split('\n');
        Assert.Equal(3, lines.Length);
        Assert.EndsWith("refused (2 problems):", lines[0], StringComparison.Ordinal);
        Assert.All(lines[1..], l => Assert.StartsWith("  processes/piperazine.json, recipe PPZ-220 version 1, step S1: ", l, StringComparison.Ordinal));
        Assert.Contains(lines, l => l.Contains("product 'PPZ2HC' is not a material in any loaded file (did you mean 'PPZ2HCL'?)", StringComparison.Ordinal));
        Assert.Contains(lines, l => l.Contains("names 'HLC', which is not a material in any loaded file (species are written with material codes) (did you mean 'HCL'?)", StringComparison.Ordinal));
    }

    [Fact]
    public async Task A_material_code_defined_in_two_files_stops_start_up_naming_both()
    {
        using var temp = new TempFolder();
        var config = TestConfig.CopyVerbatim(temp.Sub("config"));
        File.WriteAllText(
            Path.Combine(config, "processes", "extra.json"),
            """{ "materials": [ { "code": "TOL", "name": "toluene again", "formula": "C7H8", "role": "solvent" } ], "recipes": [] }""");

        var result = await ProgramRunner.RunAsync("check", SampleFile, "--config", config, "--data", temp.Sub("data"));

        Assert.Equal(2, result.ExitCode);
        Assert.Contains("extra.json", result.Stderr);
        Assert.Contains("benzamide.json", result.Stderr);
    }

    [Theory]
    [InlineData("\"TimeZone\": \"Europe/Berlin\"", "\"TimeZone\": \"Europe/Atlantis\"", "Site:TimeZone")]
    [InlineData("\"ProductionDayStart\": \"06:00\"", "\"ProductionDayStart\": \"6 o'clock\"", "Site:ProductionDayStart")]
    [InlineData("\"SettleSeconds\": 2.0", "\"SettleSeconds\": -1", "SettleSeconds")]
    [InlineData("\"yield-low\": \"major\"", "\"yield-low\": \"urgent\"", "urgent")]
    [InlineData("\"Synchronous\": \"Full\"", "\"Synchronous\": \"Sometimes\"", "Synchronous")]
    public async Task A_bad_site_setting_stops_start_up_naming_the_setting(string good, string bad, string named)
    {
        using var temp = new TempFolder();
        var config = TestConfig.CopyVerbatim(temp.Sub("config"));
        var settings = Path.Combine(config, "appsettings.json");
        var text = File.ReadAllText(settings);
        Assert.Contains(good, text);
        File.WriteAllText(settings, text.Replace(good, bad, StringComparison.Ordinal));

        var result = await ProgramRunner.RunAsync("check", SampleFile, "--config", config, "--data", temp.Sub("data"));

        Assert.Equal(2, result.ExitCode);
        Assert.Single(result.Stderr.TrimEnd().Split('\n'));
        Assert.Contains(named, result.Stderr);
    }

    /// <summary>Issue 10 item 9: a value of the wrong type, a bad logging setting or malformed JSON is
    /// bad input (exit 2, one line naming the setting and the value, or the line and position), never a stack trace.</summary>
    [Theory]
    [InlineData("\"SettleSeconds\": 2.0", "\"SettleSeconds\": \"abc\"", "Intake:SettleSeconds = 'abc' is not a number")]
    [InlineData("\"GroupCommitMaxFiles\": 256", "\"GroupCommitMaxFiles\": 1.5", "Intake:GroupCommitMaxFiles = '1.5' is not a whole number")]
    [InlineData("\"DigestCatchUpDays\": 7", "\"DigestCatchUpDays\": \"week\"", "Site:DigestCatchUpDays = 'week' is not a whole number")]
    [InlineData("\"BusyTimeoutSeconds\": 30", "\"BusyTimeoutSeconds\": \"soon\"", "Storage:BusyTimeoutSeconds = 'soon' is not a number")]
    [InlineData("\"CoverageFactor\": 2.0", "\"CoverageFactor\": \"two\"", "Reconciliation:CoverageFactor = 'two' is not a number")]
    [InlineData("\"Default\": \"Information\"", "\"Default\": \"Loud\"", "Serilog: The value Loud is not a valid Serilog level")]
    [InlineData("\"SettleSeconds\": 2.0", "\"SettleSeconds\": 2.0,,", "not valid JSON at line 17, position 26")]
    [InlineData("\"SettleSeconds\": 2.0", "\"SettleSeconds\": 2.0 \"x\": 1", "not valid JSON at line 17, position 26")]
    public async Task A_setting_of_the_wrong_type_or_malformed_settings_exit_2_naming_setting_and_value(string good, string bad, string named)
    {
        using var temp = new TempFolder();
        var config = TestConfig.CopyVerbatim(temp.Sub("config"));
        var settings = Path.Combine(config, "appsettings.json");
        var text = File.ReadAllText(settings);
        Assert.Contains(good, text);
        File.WriteAllText(settings, text.Replace(good, bad, StringComparison.Ordinal));

        var result = await ProgramRunner.RunAsync("check", SampleFile, "--config", config, "--data", temp.Sub("data"));

        Assert.Equal(2, result.ExitCode);
        Assert.Single(result.Stderr.TrimEnd().Split('\n'));
        Assert.Contains(named, result.Stderr, StringComparison.Ordinal);
        Assert.DoesNotContain("   at ", result.Stderr, StringComparison.Ordinal);
    }

    [Fact]
    public async Task A_missing_config_folder_is_bad_input()
    {
        using var temp = new TempFolder();

        var result = await ProgramRunner.RunAsync("check", SampleFile, "--config", temp.Sub("nowhere"), "--data", temp.Sub("data"));

        Assert.Equal(2, result.ExitCode);
        Assert.Contains("appsettings.json", result.Stderr);
    }
}
