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
        Assert.Single(result.Stderr.TrimEnd().Split('\n'));
        Assert.Contains("piperazine.json", result.Stderr);
        Assert.Contains("PPZ-220", result.Stderr);
        Assert.Contains("S1", result.Stderr);
        Assert.Contains("Cl is off by 1", result.Stderr);
        Assert.False(File.Exists(temp.Sub("data", "batchreconcile.db")));
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

    [Fact]
    public async Task A_missing_config_folder_is_bad_input()
    {
        using var temp = new TempFolder();

        var result = await ProgramRunner.RunAsync("check", SampleFile, "--config", temp.Sub("nowhere"), "--data", temp.Sub("data"));

        Assert.Equal(2, result.ExitCode);
        Assert.Contains("appsettings.json", result.Stderr);
    }
}
