using System.ComponentModel.DataAnnotations;

namespace BatchReconcile.Hosting;

/// <summary>Database settings (section <c>Storage</c>); docs/storage.md explains the choice of durability.</summary>
public sealed class StorageOptions
{
    public const string Section = "Storage";

    /// <summary>SQLite synchronous mode: Full or Normal.</summary>
    [RegularExpression("(?i)^(full|normal)$", ErrorMessage = "Storage:Synchronous must be Full or Normal")]
    public string Synchronous { get; set; } = "Full";

    [Range(1, 600)]
    public int BusyTimeoutSeconds { get; set; } = 30;
}
