namespace BatchReconcile.Hosting;

/// <summary>The absolute folders and database file of one data root.</summary>
public sealed record DataFolders(string Root, string Inbox, string Archive, string Quarantine, string Digests, string Logs, string Database)
{
    public static DataFolders From(SiteOptions site, string? dataOverride)
    {
        var root = Path.GetFullPath(dataOverride ?? site.DataRoot);
        string Under(string path) => Path.GetFullPath(Path.Combine(root, path));
        return new DataFolders(root, Under(site.Inbox), Under(site.Archive), Under(site.Quarantine), Under(site.Digests), Under("logs"), Under(site.Database));
    }

    public void Create()
    {
        foreach (var folder in new[] { Root, Inbox, Archive, Quarantine, Digests, Logs, Path.GetDirectoryName(Database)! })
        {
            Directory.CreateDirectory(folder);
        }
    }
}
