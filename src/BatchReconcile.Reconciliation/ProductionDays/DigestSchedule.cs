namespace BatchReconcile.Reconciliation.ProductionDays;

/// <summary>
/// When each production day's digest is due: at the site's digest time (plant clock) after the day has
/// ended, and which days are due but not yet written, looking back a bounded number of days.
/// </summary>
/// <remarks>
/// The digest of day D is due at the first instant at or after the end of D at which the plant clock reads
/// the digest time: with days starting 06:00 and a digest time of 07:30, at 07:30 the next morning; with a
/// digest time of 05:00 (before the day start), at 05:00 the morning after that, since D is still running at
/// 05:00 the next morning. Clock changes follow the calendar's rule (first occurrence; the jump for a gap).
/// </remarks>
public sealed class DigestSchedule
{
    private readonly ProductionDayCalendar _calendar;

    /// <param name="catchUpDays">How many of the most recent complete days are looked at (missed while down).</param>
    public DigestSchedule(ProductionDayCalendar calendar, TimeOnly digestTime, int catchUpDays)
    {
        ArgumentNullException.ThrowIfNull(calendar);
        ArgumentOutOfRangeException.ThrowIfLessThan(catchUpDays, 1);
        _calendar = calendar;
        DigestTime = digestTime;
        CatchUpDays = catchUpDays;
    }

    public TimeOnly DigestTime { get; }

    public int CatchUpDays { get; }

    public DateTimeOffset DueAt(DateOnly day)
    {
        var end = _calendar.Bounds(day).End;
        var endDate = DateOnly.FromDateTime(end.DateTime);
        var sameMorning = _calendar.InstantAt(endDate, DigestTime);
        return sameMorning >= end ? sameMorning : _calendar.InstantAt(endDate.AddDays(1), DigestTime);
    }

    /// <summary>Days whose digest is due at <paramref name="now"/> and not written yet, oldest first.</summary>
    public IReadOnlyList<DateOnly> DueDays(DateTimeOffset now, IReadOnlySet<DateOnly> written)
    {
        ArgumentNullException.ThrowIfNull(written);
        var current = _calendar.DayOf(now);
        var due = new List<DateOnly>();
        for (var day = current.AddDays(-CatchUpDays); day < current; day = day.AddDays(1))
        {
            if (DueAt(day) <= now && !written.Contains(day))
            {
                due.Add(day);
            }
        }

        return due;
    }

    /// <summary>The next instant after <paramref name="now"/> at which a digest falls due.</summary>
    public DateTimeOffset NextDue(DateTimeOffset now)
    {
        var current = _calendar.DayOf(now);
        return new[] { current.AddDays(-1), current, current.AddDays(1) }.Select(DueAt).Where(t => t > now).Min();
    }

    /// <summary>The last production day that has ended at <paramref name="now"/>.</summary>
    public DateOnly LastCompleteDay(DateTimeOffset now) => _calendar.DayOf(now).AddDays(-1);
}
