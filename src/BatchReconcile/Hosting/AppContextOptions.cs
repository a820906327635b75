namespace BatchReconcile.Hosting;

/// <summary>What the command line says about where things are, before any settings are read.</summary>
/// <param name="ConfigDirectory">Folder with appsettings.json and processes/ (absolute).</param>
/// <param name="DataOverride">The --data folder, when given.</param>
public sealed record AppContextOptions(string ConfigDirectory, string? DataOverride)
{
    public string ProcessesDirectory => Path.Combine(ConfigDirectory, "processes");

    public static AppContextOptions From(DirectoryInfo? config, DirectoryInfo? data) =>
        new(Path.GetFullPath(config?.FullName ?? "config"), data?.FullName);
}
