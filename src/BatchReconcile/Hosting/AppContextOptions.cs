namespace BatchReconcile.Hosting;

/// <summary>What the command line says about where things are, before any settings are read.</summary>
/// <param name="ConfigDirectory">Folder with appsettings.json and processes/ (absolute).</param>
/// <param name="DataOverride">The --data folder, when given.</param>
/// <param name="SiteOverride">The --site option: a site code (instead of <c>Site:Code</c>), <see cref="AllSites"/>, or null.</param>
public sealed record AppContextOptions(string ConfigDirectory, string? DataOverride, string? SiteOverride = null)
{
    /// <summary>The value of <c>--site</c> that reads across every site of the store.</summary>
    public const string AllSites = "all";

    public bool IsAllSites => string.Equals(SiteOverride, AllSites, StringComparison.OrdinalIgnoreCase);

    public string ProcessesDirectory => Path.Combine(ConfigDirectory, "processes");

    public static AppContextOptions From(DirectoryInfo? config, DirectoryInfo? data, string? site = null) =>
        new(Path.GetFullPath(config?.FullName ?? "config"), data?.FullName, site);
}
