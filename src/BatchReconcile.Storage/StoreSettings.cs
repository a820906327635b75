using System.ComponentModel.DataAnnotations;

namespace BatchReconcile.Storage;

/// <summary>Settings of the store (section <c>Storage</c> of appsettings.json).</summary>
public sealed record StoreSettings
{
    /// <summary>Which database holds the store: the embedded SQLite file (default) or a shared PostgreSQL.</summary>
    public StoreProvider Provider { get; init; } = StoreProvider.Sqlite;

    /// <summary>
    /// For PostgreSQL, an Npgsql connection string (<c>Host=...;Database=...;Username=...;Password=...</c>).
    /// Give it through the environment (<c>Storage__ConnectionString</c>) or a file only the service reads,
    /// never in a settings file under version control; the password never appears in logs or messages.
    /// </summary>
    public string? ConnectionString { get; init; }

    /// <summary>Durability of a commit; see <see cref="SynchronousMode"/>.</summary>
    public SynchronousMode Synchronous { get; init; } = SynchronousMode.Full;

    /// <summary>How long a connection waits for another process's lock before it gives up.</summary>
    [Range(0.0, 3600.0)]
    public double BusyTimeoutSeconds { get; init; } = 30.0;

    public TimeSpan BusyTimeout => TimeSpan.FromSeconds(BusyTimeoutSeconds);

    /// <summary>The settings as a log line may show them: the provider, never the connection string.</summary>
    public override string ToString() => FormattableString.Invariant($"StoreSettings {{ Provider = {Provider}, Synchronous = {Synchronous}, BusyTimeoutSeconds = {BusyTimeoutSeconds} }}");

    /// <summary>Problems with these settings, one plain sentence each; empty when they are usable.</summary>
    public IReadOnlyList<string> Validate()
    {
        var errors = new List<string>();
        if (!Enum.IsDefined(Synchronous))
        {
            errors.Add($"Storage:Synchronous must be \"Full\" or \"Normal\", not {(int)Synchronous}.");
        }

        if (!Enum.IsDefined(Provider))
        {
            errors.Add($"Storage:Provider must be \"sqlite\" or \"postgresql\", not {(int)Provider}.");
        }
        else if (Provider == StoreProvider.Postgresql && string.IsNullOrWhiteSpace(ConnectionString))
        {
            errors.Add("Storage:ConnectionString is required when Storage:Provider is \"postgresql\" (set it in the environment as Storage__ConnectionString).");
        }
        else if (Provider == StoreProvider.Postgresql && PostgresTarget.ProblemOf(ConnectionString!) is { } problem)
        {
            errors.Add("Storage:ConnectionString " + problem);
        }

        if (!double.IsFinite(BusyTimeoutSeconds) || BusyTimeoutSeconds < 0 || BusyTimeoutSeconds > 3600)
        {
            errors.Add(FormattableString.Invariant(
                $"Storage:BusyTimeoutSeconds must be between 0 and 3600, not {BusyTimeoutSeconds}."));
        }

        return errors;
    }
}
