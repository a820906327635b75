namespace BatchReconcile.Browser.Tests.Support;

/// <summary>A temporary folder for one test, deleted afterwards.</summary>
public sealed class ScratchFolder : IDisposable
{
    public ScratchFolder()
    {
        Path = System.IO.Path.Combine(System.IO.Path.GetTempPath(), "batchreconcile-tests", Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(Path);
    }

    public string Path { get; }

    public string Combine(params string[] parts) => System.IO.Path.Combine([Path, .. parts]);

    /// <summary>A copy of the repository's config folder (settings and process definitions) to change in a test.</summary>
    public string CopyOfRepositoryConfig()
    {
        var config = Combine("config");
        Directory.CreateDirectory(System.IO.Path.Combine(config, "processes"));
        File.Copy(System.IO.Path.Combine(RepoPaths.Root, "config", "appsettings.json"), System.IO.Path.Combine(config, "appsettings.json"));
        foreach (var file in Directory.GetFiles(System.IO.Path.Combine(RepoPaths.Root, "config", "processes"), "*.json"))
        {
            File.Copy(file, System.IO.Path.Combine(config, "processes", System.IO.Path.GetFileName(file)));
        }

        return config;
    }

    public void Dispose()
    {
        try
        {
            Directory.Delete(Path, recursive: true);
        }
        catch (IOException)
        {
            // A process that is still shutting down may hold a file; the temp folder is cleaned up later.
        }
    }
}
