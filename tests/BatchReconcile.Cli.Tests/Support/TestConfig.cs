using System.Text.Json.Nodes;

namespace BatchReconcile.Cli.Tests.Support;

/// <summary>
/// A config folder for one test: the repository's process definitions and site settings, with the
/// intake timings replaced so that the service reacts within a test's patience.
/// </summary>
public static class TestConfig
{
    /// <summary>Writes <c>appsettings.json</c> and <c>processes/*.json</c> into <paramref name="folder"/> and returns it.</summary>
    public static string Write(string folder, double settleSeconds = 0.3, double rescanSeconds = 1.0, int groupCommitMaxFiles = 64)
    {
        CopyProcesses(folder);
        var settings = JsonNode.Parse(File.ReadAllText(Path.Combine(RepoPaths.Root, "config", "appsettings.json")))!.AsObject();
        settings["Intake"] = new JsonObject
        {
            ["SettleSeconds"] = settleSeconds,
            ["RescanSeconds"] = rescanSeconds,
            ["GroupCommitMaxFiles"] = groupCommitMaxFiles,
        };
        File.WriteAllText(Path.Combine(folder, "appsettings.json"), settings.ToJsonString());
        return folder;
    }

    /// <summary>An exact copy of the repository's config folder in <paramref name="folder"/>, to change in a test; returns it.</summary>
    public static string CopyVerbatim(string folder)
    {
        CopyProcesses(folder);
        File.Copy(Path.Combine(RepoPaths.Root, "config", "appsettings.json"), Path.Combine(folder, "appsettings.json"));
        return folder;
    }

    private static void CopyProcesses(string folder)
    {
        var processes = Path.Combine(folder, "processes");
        Directory.CreateDirectory(processes);
        foreach (var file in Directory.EnumerateFiles(Path.Combine(RepoPaths.Root, "config", "processes"), "*.json"))
        {
            File.Copy(file, Path.Combine(processes, Path.GetFileName(file)));
        }
    }
}
