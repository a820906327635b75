using System.Globalization;

namespace BatchReconcile.Intake.Archive;

/// <summary>
/// Where processed files are kept: <c>ROOT/YYYY/MM/DD/</c>, the calendar date in the plant's time
/// zone of the moment the file was processed. Plant-local because that is the date the people who
/// go looking for a file have in mind; the processing date rather than the production day because
/// the archive records what the service did with a file, while the production day belongs to the
/// batch and is kept in the store.
/// </summary>
public sealed class ArchiveLayout
{
    /// <summary>Creates the layout for an archive folder and the plant's time zone.</summary>
    public ArchiveLayout(string root, TimeZoneInfo plantTimeZone)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(root);
        Root = Path.GetFullPath(root);
        PlantTimeZone = plantTimeZone ?? throw new ArgumentNullException(nameof(plantTimeZone));
    }

    /// <summary>The archive folder (absolute).</summary>
    public string Root { get; }

    /// <summary>The plant's time zone, which decides the date folder.</summary>
    public TimeZoneInfo PlantTimeZone { get; }

    /// <summary>The folder for a file processed at <paramref name="processedAt"/>.</summary>
    public string DirectoryFor(DateTimeOffset processedAt)
    {
        var local = TimeZoneInfo.ConvertTime(processedAt, PlantTimeZone);
        return Path.Combine(
            Root,
            local.Year.ToString("D4", CultureInfo.InvariantCulture),
            local.Month.ToString("D2", CultureInfo.InvariantCulture),
            local.Day.ToString("D2", CultureInfo.InvariantCulture));
    }
}
