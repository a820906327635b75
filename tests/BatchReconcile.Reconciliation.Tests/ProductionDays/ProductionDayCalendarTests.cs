using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Reconciliation.ProductionDays;
using BatchReconcile.Records.Exports;

namespace BatchReconcile.Reconciliation.Tests.ProductionDays;

/// <summary>
/// Europe/Berlin (IANA tz database): CET +01:00, CEST +02:00; in 2026 summer time starts Sunday 29 March at 02:00 CET
/// (01:00 UTC) and ends Sunday 25 October at 03:00 CEST (01:00 UTC) — EU Directive 2000/84/EC (last Sundays of March
/// and October, 01:00 UTC).
/// </summary>
public class ProductionDayCalendarTests
{
    private static readonly ProductionDayCalendar Berlin6 = Create("Europe/Berlin", "06:00");

    private static ProductionDayCalendar Create(string zone, string start)
    {
        Assert.True(ProductionDayCalendar.TryCreate(zone, start, out var calendar, out var error), error);
        return calendar;
    }

    [Theory]
    [InlineData("2026-11-25T05:59:00+01:00", "2026-11-24")]
    [InlineData("2026-11-25T06:00:00+01:00", "2026-11-25")]
    [InlineData("2026-11-25T04:59:59Z", "2026-11-24")]       // 05:59:59 CET
    [InlineData("2026-11-25T05:00:00Z", "2026-11-25")]       // 06:00 CET
    [InlineData("2026-11-24T23:30:00-05:00", "2026-11-24")]  // = 04:30 UTC = 05:30 CET on the 25th, before 06:00
    [InlineData("2026-07-01T03:59:59Z", "2026-06-30")]       // 05:59:59 CEST
    [InlineData("2026-07-01T04:00:00Z", "2026-07-01")]       // 06:00 CEST
    [InlineData("2026-12-31T23:59:00+01:00", "2026-12-31")]
    [InlineData("2027-01-01T05:00:00+01:00", "2026-12-31")]  // across the year end
    // Spring forward, night of 28/29 March 2026.
    [InlineData("2026-03-29T00:59:59Z", "2026-03-28")]       // 01:59:59 CET, just before the jump
    [InlineData("2026-03-29T01:00:00Z", "2026-03-28")]       // 03:00 CEST
    [InlineData("2026-03-29T03:59:59Z", "2026-03-28")]       // 05:59:59 CEST
    [InlineData("2026-03-29T04:00:00Z", "2026-03-29")]       // 06:00 CEST
    // Fall back, night of 24/25 October 2026: 02:30 local happens twice.
    [InlineData("2026-10-25T02:30:00+02:00", "2026-10-24")]  // first 02:30 (CEST)
    [InlineData("2026-10-25T02:30:00+01:00", "2026-10-24")]  // second 02:30 (CET)
    [InlineData("2026-10-25T04:59:59Z", "2026-10-24")]       // 05:59:59 CET
    [InlineData("2026-10-25T05:00:00Z", "2026-10-25")]       // 06:00 CET
    public void Day_of_an_instant(string instant, string day) =>
        Assert.Equal(DateOnly.ParseExact(day, "yyyy-MM-dd", System.Globalization.CultureInfo.InvariantCulture), Berlin6.DayOf(Parse(instant)));

    /// <summary>With a 06:00 start the days that contain the clock change are the 23- and 25-hour ones.</summary>
    [Theory]
    [InlineData("2026-03-28", "2026-03-28T05:00:00Z", "2026-03-29T04:00:00Z", 23)]
    [InlineData("2026-03-29", "2026-03-29T04:00:00Z", "2026-03-30T04:00:00Z", 24)]
    [InlineData("2026-10-24", "2026-10-24T04:00:00Z", "2026-10-25T05:00:00Z", 25)]
    [InlineData("2026-10-25", "2026-10-25T05:00:00Z", "2026-10-26T05:00:00Z", 24)]
    [InlineData("2026-11-24", "2026-11-24T05:00:00Z", "2026-11-25T05:00:00Z", 24)]
    public void Bounds_across_daylight_saving_changes(string day, string start, string end, int hours)
    {
        var (s, e) = Berlin6.Bounds(Day(day));
        Assert.Equal(Parse(start), s);
        Assert.Equal(Parse(end), e);
        Assert.Equal(TimeSpan.FromHours(hours), e - s);
        Assert.Equal(Day(day), Berlin6.DayOf(s));
        Assert.Equal(Day(day), Berlin6.DayOf(e.AddTicks(-1)));

        // Bounds carry the plant's offset at that instant (06:00 local).
        Assert.Equal(new TimeOnly(6, 0), TimeOnly.FromTimeSpan(s.TimeOfDay));
    }

    /// <summary>
    /// A 02:30 start: on 29 March 2026 02:30 does not exist, so the day starts at the jump (03:00 CEST = 01:00 UTC);
    /// on 25 October 2026 02:30 happens twice, so the day starts at the first (02:30 CEST = 00:30 UTC).
    /// </summary>
    [Theory]
    [InlineData("2026-03-28", "2026-03-28T01:30:00Z", "2026-03-29T01:00:00Z", 23.5)]
    [InlineData("2026-03-29", "2026-03-29T01:00:00Z", "2026-03-30T00:30:00Z", 23.5)]
    [InlineData("2026-10-24", "2026-10-24T00:30:00Z", "2026-10-25T00:30:00Z", 24)]
    [InlineData("2026-10-25", "2026-10-25T00:30:00Z", "2026-10-26T01:30:00Z", 25)]
    public void A_start_in_the_gap_or_the_overlap(string day, string start, string end, double hours)
    {
        var calendar = Create("Europe/Berlin", "02:30");
        var (s, e) = calendar.Bounds(Day(day));
        Assert.Equal(Parse(start), s);
        Assert.Equal(Parse(end), e);
        Assert.Equal(TimeSpan.FromHours(hours), e - s);
        Assert.Equal(Day(day), calendar.DayOf(s));
        Assert.Equal(Day(day), calendar.DayOf(e.AddTicks(-1)));
    }

    [Fact]
    public void Every_minute_of_the_changeover_weeks_belongs_to_exactly_the_day_whose_bounds_hold_it()
    {
        foreach (var calendar in new[] { Berlin6, Create("Europe/Berlin", "02:30"), Create("America/New_York", "02:00") })
        {
            foreach (var from in new[] { Parse("2026-03-05T00:00:00Z"), Parse("2026-03-26T00:00:00Z"), Parse("2026-10-22T00:00:00Z"), Parse("2026-10-30T00:00:00Z") })
            {
                for (var t = from; t < from.AddDays(5); t = t.AddMinutes(7))
                {
                    var day = calendar.DayOf(t);
                    var (s, e) = calendar.Bounds(day);
                    Assert.True(s <= t && t < e, $"{t:o} -> {day:yyyy-MM-dd} [{s:o}, {e:o})");
                }
            }
        }
    }

    [Fact]
    public void Day_of_a_batch_is_that_of_its_last_output_row_else_of_the_arrival()
    {
        var arrival = Parse("2026-11-25T09:15:00+01:00");
        var batch = new BatchRecord("B-1", "R", 1, RecipeVersionSource.Export, null, [], []);
        Assert.Equal(new DateOnly(2026, 11, 24), Berlin6.DayOfBatch(new BatchOutcome(batch, [], Parse("2026-11-25T05:40:00+01:00")), arrival));
        Assert.Equal(new DateOnly(2026, 11, 25), Berlin6.DayOfBatch(new BatchOutcome(batch, [], null), arrival));
    }

    [Theory]
    [InlineData("Europe/Berlln", "06:00", "Site:TimeZone: 'Europe/Berlln' is not a known IANA time-zone id")]
    [InlineData("", "06:00", "Site:TimeZone: '' is not")]
    [InlineData("Europe/Berlin", "6 am", "Site:ProductionDayStart: '6 am' is not a local time of day; expected HH:mm")]
    [InlineData("Europe/Berlin", "25:00", "Site:ProductionDayStart: '25:00'")]
    public void Bad_site_settings_are_refused_with_a_reason(string zone, string start, string message)
    {
        Assert.False(ProductionDayCalendar.TryCreate(zone, start, out var calendar, out var error));
        Assert.Null(calendar);
        Assert.StartsWith(message, error, StringComparison.Ordinal);
    }

    private static DateTimeOffset Parse(string text) =>
        DateTimeOffset.Parse(text, System.Globalization.CultureInfo.InvariantCulture, System.Globalization.DateTimeStyles.None);

    private static DateOnly Day(string text) =>
        DateOnly.ParseExact(text, "yyyy-MM-dd", System.Globalization.CultureInfo.InvariantCulture);
}
