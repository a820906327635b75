using BatchReconcile.Records.Definitions;
using BatchReconcile.Records.Definitions.Loading;
using Microsoft.Extensions.Logging;

namespace BatchReconcile.Pipeline;

/// <summary>
/// The process definitions in force. Loaded at start (a bad set stops start-up); while the service
/// runs, a change to a definition file reloads the whole set, and a set that fails its checks is
/// logged and ignored so the definitions already in force stay in use.
/// </summary>
public sealed class CatalogSource : IDisposable
{
    private static readonly TimeSpan Debounce = TimeSpan.FromMilliseconds(500);

    private readonly string _folder;
    private readonly ILogger<CatalogSource> _logger;
    private readonly object _gate = new();
    private FileSystemWatcher? _watcher;
    private Timer? _reloadTimer;
    private volatile ProcessCatalog _current;

    public CatalogSource(string folder, ILogger<CatalogSource> logger)
    {
        _folder = folder;
        _logger = logger;
        if (!Directory.Exists(folder))
        {
            throw new DefinitionsException(folder, [new DefinitionError(folder, null, null, "the process-definition folder does not exist")]);
        }

        var result = ProcessDefinitionLoader.LoadFolder(folder);
        LogNotes(result);
        if (!result.IsSuccess)
        {
            throw new DefinitionsException(folder, result.Errors);
        }

        _current = result.Catalog;
        _logger.LogInformation("Process definitions loaded: {Summary}", result.ToString());
    }

    public ProcessCatalog Current => _current;

    /// <summary>Starts reloading on changes to the definition files.</summary>
    public void Watch()
    {
        lock (_gate)
        {
            if (_watcher is not null)
            {
                return;
            }

            _reloadTimer = new Timer(_ => Reload(), null, Timeout.Infinite, Timeout.Infinite);
            _watcher = new FileSystemWatcher(_folder, "*.json")
            {
                NotifyFilter = NotifyFilters.FileName | NotifyFilters.LastWrite | NotifyFilters.Size,
            };
            FileSystemEventHandler changed = (_, _) => _reloadTimer.Change(Debounce, Timeout.InfiniteTimeSpan);
            _watcher.Created += changed;
            _watcher.Changed += changed;
            _watcher.Deleted += changed;
            _watcher.Renamed += (_, _) => _reloadTimer.Change(Debounce, Timeout.InfiniteTimeSpan);
            _watcher.EnableRaisingEvents = true;
        }
    }

    /// <summary>Loads the folder again; keeps the definitions in force when the new set is refused.</summary>
    public bool Reload()
    {
        var result = ProcessDefinitionLoader.LoadFolder(_folder);
        LogNotes(result);
        if (!result.IsSuccess)
        {
            foreach (var error in result.Errors)
            {
                _logger.LogError("Process definitions not reloaded: {Where}: {Problem}", error.Where, error.Message);
            }

            _logger.LogWarning("The definitions loaded before stay in use until the files are corrected");
            return false;
        }

        _current = result.Catalog;
        _logger.LogInformation("Process definitions reloaded: {Summary}", result.ToString());
        return true;
    }

    private void LogNotes(ProcessDefinitionLoadResult result)
    {
        foreach (var note in result.Notes)
        {
            _logger.LogInformation("{Where}: {Note}", note.Where, note.Message);
        }
    }

    public void Dispose()
    {
        _watcher?.Dispose();
        _reloadTimer?.Dispose();
    }
}
