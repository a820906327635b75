using BatchReconcile.Hosting;
using Microsoft.Extensions.Hosting;

namespace BatchReconcile.Tests.Support;

/// <summary>
/// A throwaway data folder for in-process host tests, with the repository's config and a clock the
/// test controls; deleted on dispose.
/// </summary>
public sealed class HostSandbox(TimeProvider clock) : IDisposable
{
    public string Root { get; } = Path.Combine(Path.GetTempPath(), "batchreconcile-tests", Guid.NewGuid().ToString("N"));

    public static string RepositoryRoot { get; } = FindRepositoryRoot();

    /// <summary>Builds and validates the host on this data folder (not started).</summary>
    public IHost Start(bool service)
    {
        var context = new AppContextOptions(Path.Combine(RepositoryRoot, "config"), Root);
        var host = AppHost.Build(context, service, quietConsole: true, time: clock);
        AppHost.Validate(host.Services);
        return host;
    }

    private static string FindRepositoryRoot()
    {
        for (var dir = new DirectoryInfo(AppContext.BaseDirectory); dir is not null; dir = dir.Parent)
        {
            if (File.Exists(Path.Combine(dir.FullName, "BatchReconcile.sln")))
            {
                return dir.FullName;
            }
        }

        throw new InvalidOperationException("BatchReconcile.sln not found");
    }

    public void Dispose()
    {
        try
        {
            Directory.Delete(Root, recursive: true);
        }
        catch (IOException)
        {
            // A file still held by a disposing host; the temp folder is cleaned up later.
        }
    }
}
