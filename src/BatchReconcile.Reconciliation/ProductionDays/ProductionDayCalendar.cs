using System.Diagnostics.CodeAnalysis;
using System.Globalization;
using BatchReconcile.Reconciliation.Outcomes;

namespace BatchReconcile.Reconciliation.ProductionDays;

/// <summary>The plant's production days: day D runs from dayStart local time on D to dayStart local time on D + 1.</summary>
/// <remarks>
/// <para>Rule: a production day starts at the first instant at which the plant's clock reads dayStart or later on
/// that date. So across daylight-saving changes a day lasts 23 or 25 hours (with a 06:00 start in Central Europe,
/// the days that contain the change, e.g. 28 March and 24 October 2026).</para>
/// <para>When dayStart falls in a spring-forward gap (02:30 on a night the clock jumps from 02:00 to 03:00) the day
/// starts at the jump, when the clock first reads a later time. When it occurs twice on a fall-back night the day
/// starts at its first occurrence (summer time). Either way no instant belongs to two days or to none.</para>
/// </remarks>
public sealed class ProductionDayCalendar
{
    public ProductionDayCalendar(TimeZoneInfo zone, TimeOnly dayStart)
    {
        ArgumentNullException.ThrowIfNull(zone);
        Zone = zone;
        DayStart = dayStart;
    }

    public TimeZoneInfo Zone { get; }

    public TimeOnly DayStart { get; }

    /// <summary>From site settings: an IANA time-zone id and a local time "HH:mm" (or "HH:mm:ss").</summary>
    public static bool TryCreate(
        string? timeZoneId,
        string? dayStart,
        [NotNullWhen(true)] out ProductionDayCalendar? calendar,
        [NotNullWhen(false)] out string? error)
    {
        calendar = null;
        if (string.IsNullOrWhiteSpace(timeZoneId) || !TimeZoneInfo.TryFindSystemTimeZoneById(timeZoneId.Trim(), out var zone))
        {
            error = $"Site:TimeZone: '{timeZoneId}' is not a known IANA time-zone id (e.g. Europe/Berlin).";
            return false;
        }

        if (!TimeOnly.TryParseExact(dayStart?.Trim(), ["HH:mm", "HH:mm:ss"], CultureInfo.InvariantCulture, DateTimeStyles.None, out var start))
        {
            error = $"Site:ProductionDayStart: '{dayStart}' is not a local time of day; expected HH:mm, e.g. 06:00.";
            return false;
        }

        calendar = new ProductionDayCalendar(zone, start);
        error = null;
        return true;
    }

    /// <summary>The production day that contains <paramref name="instant"/>.</summary>
    public DateOnly DayOf(DateTimeOffset instant)
    {
        var local = TimeZoneInfo.ConvertTime(instant, Zone).DateTime;
        var day = DateOnly.FromDateTime(local);
        if (TimeOnly.FromDateTime(local) < DayStart)
        {
            day = day.AddDays(-1);
        }

        // The clock-reading guess is off only around a daylight-saving change; the bounds decide.
        while (instant < StartOf(day))
        {
            day = day.AddDays(-1);
        }

        while (instant >= StartOf(day.AddDays(1)))
        {
            day = day.AddDays(1);
        }

        return day;
    }

    /// <summary>Start (inclusive) and end (exclusive) of a production day, each with the plant's offset at that instant.</summary>
    public (DateTimeOffset Start, DateTimeOffset End) Bounds(DateOnly day) => (StartOf(day), StartOf(day.AddDays(1)));

    /// <summary>The production day of a batch: that of its last output row with a time, else of the file's arrival.</summary>
    public DateOnly DayOfBatch(BatchOutcome batch, DateTimeOffset arrival)
    {
        ArgumentNullException.ThrowIfNull(batch);
        return DayOf(batch.LastOutputAt ?? arrival);
    }

    private DateTimeOffset StartOf(DateOnly day) => InstantAt(day, DayStart);

    /// <summary>
    /// The instant at which the plant clock reads <paramref name="time"/> on <paramref name="date"/>, by the same
    /// rule as the day start: the first occurrence when the clock shows it twice, the jump when it never does.
    /// </summary>
    public DateTimeOffset InstantAt(DateOnly date, TimeOnly time)
    {
        var local = date.ToDateTime(time, DateTimeKind.Unspecified);
        DateTime utc;
        if (Zone.IsAmbiguousTime(local))
        {
            // Twice on the clock: the first occurrence has the larger offset.
            var offset = Zone.GetAmbiguousTimeOffsets(local).Max();
            utc = DateTime.SpecifyKind(local - offset, DateTimeKind.Utc);
        }
        else if (Zone.IsInvalidTime(local))
        {
            utc = FirstInstantReading(local);
        }
        else
        {
            utc = DateTime.SpecifyKind(local - Zone.GetUtcOffset(local), DateTimeKind.Utc);
        }

        return TimeZoneInfo.ConvertTime(new DateTimeOffset(utc), Zone);
    }

    /// <summary>The first UTC instant at which the local clock reads <paramref name="local"/> or later (for a time in a gap: the jump).</summary>
    private DateTime FirstInstantReading(DateTime local)
    {
        // The jump T satisfies T + offset_before <= local < T + offset_after, so T lies between local minus the
        // larger and local minus the smaller of the offsets a day either side; the clock only moves forward there.
        var before = Zone.GetUtcOffset(local.AddDays(-1));
        var after = Zone.GetUtcOffset(local.AddDays(1));
        long lo = (local - (before > after ? before : after)).Ticks;
        long hi = (local - (before < after ? before : after)).Ticks;
        while (lo < hi)
        {
            long mid = lo + ((hi - lo) / 2);
            var reading = TimeZoneInfo.ConvertTimeFromUtc(new DateTime(mid, DateTimeKind.Utc), Zone);
            if (reading >= local)
            {
                hi = mid;
            }
            else
            {
                lo = mid + 1;
            }
        }

        return new DateTime(lo, DateTimeKind.Utc);
    }
}
