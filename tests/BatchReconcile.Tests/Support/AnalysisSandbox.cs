using System.Globalization;
using BatchReconcile.Cli;
using BatchReconcile.Storage;

namespace BatchReconcile.Tests.Support;

/// <summary>
/// A config folder with the repository's site settings and the lidocaine route only, a data folder, and the command line
/// run in process against both, on either store (<see cref="HostSandbox"/>). Batches go in through <c>ingest</c> of
/// generated exports, as a user's would.
/// </summary>
public sealed class AnalysisSandbox : IDisposable
{
    private readonly HostSandbox _sandbox;
    private int _files;

    public AnalysisSandbox(StoreProvider provider = StoreProvider.Sqlite)
    {
        _sandbox = new(TimeProvider.System, provider);
        Config = Path.Combine(_sandbox.Root, "config");
        Directory.CreateDirectory(Path.Combine(Config, "processes"));
        File.Copy(Path.Combine(HostSandbox.RepositoryRoot, "config", "appsettings.json"), Path.Combine(Config, "appsettings.json"));
        File.WriteAllText(Path.Combine(Config, "processes", "lidocaine.json"), LidocaineRoute.Definitions);
        _sandbox.UseStoreIn(Config);
    }

    public string Root => _sandbox.Root;

    public string Config { get; }

    /// <summary>The data folder (the SQLite store's file and the digests), which is the sandbox's root.</summary>
    public string Data => _sandbox.Root;

    /// <summary>One value from the store (<see cref="HostSandbox.Scalar"/>).</summary>
    public long Scalar(string sql) => _sandbox.Scalar(sql);

    /// <summary>Batch ids as the plant names them: KB3-LD-001 ...</summary>
    public static string BatchId(int n) => string.Create(CultureInfo.InvariantCulture, $"KB3-LD-{n:000}");

    public (int Exit, string Out, string Err) Run(params string[] args)
    {
        using var stdout = new StringWriter();
        using var stderr = new StringWriter();
        var exit = CommandLine.Run([.. args, "--config", Config, "--data", Data], stdout, stderr);
        return (exit, stdout.ToString(), stderr.ToString());
    }

    /// <summary>Writes the exports into a fresh drop folder and ingests it; fails the test when ingest does not exit 0.</summary>
    public void Ingest(IEnumerable<string> exports)
    {
        var folder = Path.Combine(_sandbox.Root, "drop-" + (_files++).ToString(CultureInfo.InvariantCulture));
        Directory.CreateDirectory(folder);
        var i = 0;
        foreach (var text in exports)
        {
            File.WriteAllText(Path.Combine(folder, string.Create(CultureInfo.InvariantCulture, $"export-{i++:000}.csv")), text);
        }

        var (exit, o, e) = Run("ingest", folder);
        Assert.True(exit == 0, $"ingest exited {exit}:\n{o}\n{e}");
    }

    public void Dispose() => _sandbox.Dispose();
}
