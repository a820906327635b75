using System.ComponentModel.DataAnnotations;

namespace BatchReconcile.Storage;

/// <summary>Settings of the SQLite store (section <c>Storage</c> of appsettings.json).</summary>
public sealed record StoreSettings
{
    /// <summary>Durability of a commit; see <see cref="SynchronousMode"/>.</summary>
    public SynchronousMode Synchronous { get; init; } = SynchronousMode.Full;

    /// <summary>How long a connection waits for another process's lock before it gives up.</summary>
    [Range(0.0, 3600.0)]
    public double BusyTimeoutSeconds { get; init; } = 30.0;

    public TimeSpan BusyTimeout => TimeSpan.FromSeconds(BusyTimeoutSeconds);

    /// <summary>Problems with these settings, one plain sentence each; empty when they are usable.</summary>
    public IReadOnlyList<string> Validate()
    {
        var errors = new List<string>();
        if (!Enum.IsDefined(Synchronous))
        {
            errors.Add($"Storage:Synchronous must be \"Full\" or \"Normal\", not {(int)Synchronous}.");
        }

        if (!double.IsFinite(BusyTimeoutSeconds) || BusyTimeoutSeconds < 0 || BusyTimeoutSeconds > 3600)
        {
            errors.Add(FormattableString.Invariant(
                $"Storage:BusyTimeoutSeconds must be between 0 and 3600, not {BusyTimeoutSeconds}."));
        }

        return errors;
    }
}
