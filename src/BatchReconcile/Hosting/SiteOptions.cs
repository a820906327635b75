using System.ComponentModel.DataAnnotations;
using System.Globalization;

namespace BatchReconcile.Hosting;

/// <summary>The plant: its clock, its production day and where its data lives (section <c>Site</c>).</summary>
public sealed class SiteOptions : IValidatableObject
{
    public const string Section = "Site";

    [Required]
    public string Name { get; set; } = string.Empty;

    /// <summary>
    /// Short code of the site (a letter, then letters, digits, '-' or '_'; e.g. KB3). In a shared PostgreSQL store
    /// every batch, file, flag, digest and audit entry belongs to the site of this code (its schema <c>site_kb3</c>).
    /// </summary>
    public string Code { get; set; } = "main";

    /// <summary>IANA time-zone id of the plant, e.g. Europe/Berlin.</summary>
    [Required]
    public string TimeZone { get; set; } = "UTC";

    /// <summary>Local time at which a production day starts, "HH:mm".</summary>
    [Required]
    public string ProductionDayStart { get; set; } = "06:00";

    /// <summary>Local time after the day's end at which its digest is written, "HH:mm".</summary>
    [Required]
    public string DigestTime { get; set; } = "07:30";

    /// <summary>On start, digests missed while the service was down are written for at most this many recent days.</summary>
    [Range(1, 366)]
    public int DigestCatchUpDays { get; set; } = 7;

    /// <summary>Root of the database and the folders below; relative paths are taken from the working directory.</summary>
    [Required]
    public string DataRoot { get; set; } = "data";

    [Required]
    public string Inbox { get; set; } = "inbox";

    [Required]
    public string Archive { get; set; } = "archive";

    [Required]
    public string Quarantine { get; set; } = "quarantine";

    [Required]
    public string Digests { get; set; } = "digests";

    [Required]
    public string Database { get; set; } = "batchreconcile.db";

    /// <remarks>Methods, not properties: the configuration binder reads complex properties while binding.</remarks>
    public TimeZoneInfo GetZone() => TimeZoneInfo.FindSystemTimeZoneById(TimeZone);

    public TimeOnly GetDigestTime() => TimeOnly.ParseExact(DigestTime, "HH:mm", CultureInfo.InvariantCulture);

    public TimeOnly GetDayStart() => TimeOnly.ParseExact(ProductionDayStart, "HH:mm", CultureInfo.InvariantCulture);

    public IEnumerable<ValidationResult> Validate(ValidationContext validationContext)
    {
        if (!BatchReconcile.Storage.BatchStore.IsValidSiteCode(Code))
        {
            yield return new ValidationResult($"Site:Code '{Code}' must be a letter followed by up to 39 letters, digits, '-' or '_' (e.g. KB3)", [nameof(Code)]);
        }

        if (!TimeZoneInfo.TryFindSystemTimeZoneById(TimeZone, out _))
        {
            yield return new ValidationResult($"Site:TimeZone '{TimeZone}' is not a known IANA time zone (e.g. Europe/Berlin)", [nameof(TimeZone)]);
        }

        foreach (var (name, value) in new[] { (nameof(ProductionDayStart), ProductionDayStart), (nameof(DigestTime), DigestTime) })
        {
            if (!TimeOnly.TryParseExact(value, "HH:mm", CultureInfo.InvariantCulture, DateTimeStyles.None, out _))
            {
                yield return new ValidationResult($"Site:{name} '{value}' is not a time of day as HH:mm (e.g. 06:00)", [name]);
            }
        }
    }
}
