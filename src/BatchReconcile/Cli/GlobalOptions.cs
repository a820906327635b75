using System.CommandLine;

namespace BatchReconcile.Cli;

/// <summary>Options every command accepts: where the configuration and the data live.</summary>
public sealed class GlobalOptions
{
    public Option<DirectoryInfo?> Config { get; } = new("--config")
    {
        Description = "Folder with appsettings.json and processes/*.json (default: config/)",
        Recursive = true,
    };

    public Option<DirectoryInfo?> Data { get; } = new("--data")
    {
        Description = "Root of the database, inbox, archive, quarantine and digests (default: from settings)",
        Recursive = true,
    };

    public Option<string?> Site { get; } = new("--site")
    {
        Description = "The site whose records to read or write (default: Site:Code of the settings); 'all' reads across the sites of a shared store (batches list)",
        Recursive = true,
    };

    public void AddTo(RootCommand root)
    {
        root.Options.Add(Config);
        root.Options.Add(Data);
        root.Options.Add(Site);
    }
}
