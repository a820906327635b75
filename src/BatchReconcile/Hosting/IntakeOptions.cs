using System.ComponentModel.DataAnnotations;

namespace BatchReconcile.Hosting;

/// <summary>How the inbox is watched (section <c>Intake</c>).</summary>
public sealed class IntakeOptions
{
    public const string Section = "Intake";

    /// <summary>A file is taken once its size and time have not changed for this long.</summary>
    [Range(0.05, 600.0)]
    public double SettleSeconds { get; set; } = 2.0;

    /// <summary>Period of the full rescan that catches what the watcher missed.</summary>
    [Range(0.5, 3600.0)]
    public double RescanSeconds { get; set; } = 15.0;

    /// <summary>At most this many files share one database transaction (each file stays atomic).</summary>
    [Range(1, 10_000)]
    public int GroupCommitMaxFiles { get; set; } = 256;
}
