using System.CommandLine;
using System.Globalization;
using BatchReconcile.Digests;
using BatchReconcile.Reconciliation.ProductionDays;
using Microsoft.Extensions.DependencyInjection;

namespace BatchReconcile.Cli;

/// <summary>
/// <c>digest [--day YYYY-MM-DD] [--provisional] [--by NAME] [--json]</c>: write or rewrite one production day's digest;
/// a day that has not ended only as a provisional digest.
/// </summary>
public static class DigestCommand
{
    public static Command Create(GlobalOptions globals, TextWriter stdout)
    {
        var day = DayOption("Production day (default: the last complete one)");
        var by = new Option<string>("--by") { Description = "Who asks for it (recorded in the audit trail; default: the login name)" };
        var json = new Option<bool>("--json") { Description = "Print one JSON document on stdout" };
        var provisional = new Option<bool>("--provisional")
        {
            Description = "For a day that has not ended: write a provisional digest under its own names (never the day's digest)",
        };
        var command = new Command("digest", "Write (or rewrite) the digest of a production day: HTML, Markdown and CSV under digests/") { day, provisional, by, json };
        command.SetAction(parse => HostedCommand.Run(parse, globals, service: false, host =>
        {
            var services = host.Services;
            var now = services.GetRequiredService<TimeProvider>().GetUtcNow();
            var target = ParseDay(parse.GetValue(day)) ?? services.GetRequiredService<DigestSchedule>().LastCompleteDay(now);
            var writer = services.GetRequiredService<DigestWriter>();
            var who = Reviewer.Name(parse.GetValue(by));
            var ended = EndedOrRefuse(services.GetRequiredService<ProductionDayCalendar>(), target, now, parse.GetValue(provisional));
            var result = ended ? writer.Write(target, rewrite: true, who) : writer.WriteProvisional(target, who);
            if (!result.Written)
            {
                throw new UsageException($"digest of {target:yyyy-MM-dd} not written: {result.Refusal}");
            }

            if (parse.GetValue(json))
            {
                JsonOutput.Write(stdout, new DigestJson(
                    target.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture), result.Files, result.Flags, result.Provisional,
                    result.Provisional ? null : result.Issue, result.Reason, result.Kept));
            }
            else
            {
                foreach (var file in result.Files)
                {
                    stdout.WriteLine(file);
                }
            }

            return ExitCodes.Success;
        }));
        return command;
    }

    public static Option<string?> DayOption(string description) => new("--day") { Description = description };

    /// <summary>A production day as YYYY-MM-DD; anything else is bad input naming the value.</summary>
    public static DateOnly? ParseDay(string? text)
    {
        if (text is null)
        {
            return null;
        }

        return DateOnly.TryParseExact(text, "yyyy-MM-dd", CultureInfo.InvariantCulture, DateTimeStyles.None, out var day)
            ? day
            : throw new UsageException($"--day '{text}' is not a date as YYYY-MM-DD");
    }

    /// <summary>
    /// Whether <paramref name="day"/> has ended at <paramref name="now"/>. A day that has not (today, or a future day) is
    /// refused with the reason unless a provisional digest is asked for; a provisional digest of a day that has ended is refused too.
    /// </summary>
    public static bool EndedOrRefuse(ProductionDayCalendar calendar, DateOnly day, DateTimeOffset now, bool provisional)
    {
        ArgumentNullException.ThrowIfNull(calendar);
        var (start, end) = calendar.Bounds(day);
        var dayText = day.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture);
        var endText = TimeZoneInfo.ConvertTime(end, calendar.Zone).ToString("yyyy-MM-dd HH:mm zzz", CultureInfo.InvariantCulture);
        if (end <= now)
        {
            return provisional
                ? throw new UsageException($"--provisional: production day {dayText} has ended ({endText}); write its digest without --provisional")
                : true;
        }

        if (provisional)
        {
            return false;
        }

        throw new UsageException(start > now
            ? $"digest --day {dayText}: that production day has not started yet (it ends {endText}); --provisional writes a provisional digest"
            : $"digest --day {dayText}: that production day has not ended yet (it ends {endText}); --provisional writes a provisional digest");
    }

    private sealed record DigestJson(
        string Day, IReadOnlyList<string> Files, int Flags, bool Provisional, int? Issue, string? Reason, IReadOnlyList<string> Kept);
}
