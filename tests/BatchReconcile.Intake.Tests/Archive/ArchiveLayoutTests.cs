using BatchReconcile.Intake.Archive;

namespace BatchReconcile.Intake.Tests.Archive;

public class ArchiveLayoutTests
{
    // Offsets from the IANA tz database (tzdata): Europe/Berlin is UTC+01:00 (CET) in winter and
    // UTC+02:00 (CEST) from the last Sunday of March to the last Sunday of October;
    // America/Chicago is UTC-06:00 (CST) in November.
    [Theory]
    [InlineData("2026-11-24T10:15:00Z", "Europe/Berlin", "2026/11/24")]
    [InlineData("2026-12-31T23:30:00Z", "Europe/Berlin", "2027/01/01")]
    [InlineData("2026-07-15T21:59:59Z", "Europe/Berlin", "2026/07/15")]
    [InlineData("2026-07-15T22:00:00Z", "Europe/Berlin", "2026/07/16")]
    [InlineData("2026-11-24T03:00:00Z", "America/Chicago", "2026/11/23")]
    [InlineData("2026-03-05T00:00:00Z", "UTC", "2026/03/05")]
    public void The_folder_is_the_plant_local_date_of_processing(string instant, string zone, string expected)
    {
        var layout = new ArchiveLayout("archive", TimeZoneInfo.FindSystemTimeZoneById(zone));

        var folder = layout.DirectoryFor(DateTimeOffset.Parse(instant, System.Globalization.CultureInfo.InvariantCulture));

        Assert.Equal(Path.Combine(layout.Root, expected.Replace('/', Path.DirectorySeparatorChar)), folder);
    }
}
