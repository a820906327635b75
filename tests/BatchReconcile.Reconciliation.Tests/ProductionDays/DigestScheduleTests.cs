using System.Globalization;
using BatchReconcile.Reconciliation.ProductionDays;

namespace BatchReconcile.Reconciliation.Tests.ProductionDays;

/// <summary>
/// When a day's digest falls due, in Europe/Berlin. Clock changes in 2026: summer time starts 29 March and
/// ends 25 October at 01:00 UTC (Directive 2000/84/EC, last Sunday of March and of October; IANA tz database).
/// </summary>
public class DigestScheduleTests
{
    private static readonly ProductionDayCalendar Berlin = new(TimeZoneInfo.FindSystemTimeZoneById("Europe/Berlin"), new TimeOnly(6, 0));

    private static DateTimeOffset At(string iso) => DateTimeOffset.Parse(iso, CultureInfo.InvariantCulture);

    private static DateOnly Day(string iso) => DateOnly.ParseExact(iso, "yyyy-MM-dd", CultureInfo.InvariantCulture);

    [Theory]
    // An ordinary day: it ends 06:00 the next morning and its digest is due at 07:30 that morning.
    [InlineData("2026-11-25", "07:30", "2026-11-26T07:30:00+01:00")]
    // A digest time before the day start: the next morning at 05:00 the day is still running, so the morning after.
    [InlineData("2026-11-25", "05:00", "2026-11-27T05:00:00+01:00")]
    // The 23-hour day (clocks go forward in the night to 29 March): due 07:30 summer time.
    [InlineData("2026-03-28", "07:30", "2026-03-29T07:30:00+02:00")]
    // The 25-hour day (clocks go back in the night to 25 October): due 07:30 winter time.
    [InlineData("2026-10-24", "07:30", "2026-10-25T07:30:00+01:00")]
    // A digest time that the forward jump skips (02:30 on 29 March) is before the day's end anyway: the next night.
    [InlineData("2026-03-28", "02:30", "2026-03-30T02:30:00+02:00")]
    // A digest time that happens twice (02:30 on 25 October): the first occurrence, still summer time, is before the end; so the next night.
    [InlineData("2026-10-24", "02:30", "2026-10-26T02:30:00+01:00")]
    public void A_digest_falls_due_at_the_digest_time_after_the_day_ends(string day, string digestTime, string due)
    {
        var schedule = new DigestSchedule(Berlin, TimeOnly.Parse(digestTime, CultureInfo.InvariantCulture), catchUpDays: 7);

        Assert.Equal(At(due), schedule.DueAt(Day(day)));
    }

    [Fact]
    public void The_day_bounds_around_the_clock_changes_are_23_and_25_hours()
    {
        var (springStart, springEnd) = Berlin.Bounds(Day("2026-03-28"));
        var (autumnStart, autumnEnd) = Berlin.Bounds(Day("2026-10-24"));

        Assert.Equal(TimeSpan.FromHours(23), springEnd - springStart);
        Assert.Equal(TimeSpan.FromHours(25), autumnEnd - autumnStart);
    }

    [Fact]
    public void Missed_days_are_caught_up_oldest_first_within_the_bound()
    {
        var schedule = new DigestSchedule(Berlin, new TimeOnly(7, 30), catchUpDays: 7);
        // 07:00 on 26 November: the 26th has begun, the 25th has ended but its digest is due only at 07:30.
        var now = At("2026-11-26T07:00:00+01:00");

        var due = schedule.DueDays(now, new HashSet<DateOnly>());

        Assert.Equal(new[] { "2026-11-19", "2026-11-20", "2026-11-21", "2026-11-22", "2026-11-23", "2026-11-24" }.Select(Day), due);
    }

    [Fact]
    public void A_digest_already_written_is_not_due_again()
    {
        var schedule = new DigestSchedule(Berlin, new TimeOnly(7, 30), catchUpDays: 3);
        var now = At("2026-11-26T07:30:00+01:00");
        var written = new HashSet<DateOnly> { Day("2026-11-24"), Day("2026-11-25") };

        var due = schedule.DueDays(now, written);

        Assert.Equal(new[] { Day("2026-11-23") }, due);
        Assert.Empty(schedule.DueDays(now, new HashSet<DateOnly>(written) { Day("2026-11-23") }));
    }

    [Theory]
    [InlineData("2026-11-26T07:00:00+01:00", "2026-11-26T07:30:00+01:00")]
    [InlineData("2026-11-26T07:30:00+01:00", "2026-11-27T07:30:00+01:00")]
    [InlineData("2026-11-26T05:59:00+01:00", "2026-11-26T07:30:00+01:00")]
    // Saturday 28 March before the change: next due is the 27th's digest at 07:30 winter time; after it, the 28th's (summer time).
    [InlineData("2026-03-28T08:00:00+01:00", "2026-03-29T07:30:00+02:00")]
    public void The_next_wake_up_is_the_next_digest_due(string now, string next)
    {
        var schedule = new DigestSchedule(Berlin, new TimeOnly(7, 30), catchUpDays: 7);

        Assert.Equal(At(next), schedule.NextDue(At(now)));
    }
}
