using System.CommandLine;
using System.Globalization;
using BatchReconcile.Digests;
using BatchReconcile.Reconciliation.ProductionDays;
using Microsoft.Extensions.DependencyInjection;

namespace BatchReconcile.Cli;

/// <summary><c>digest [--day YYYY-MM-DD] [--by NAME] [--json]</c>: write or rewrite one production day's digest.</summary>
public static class DigestCommand
{
    public static Command Create(GlobalOptions globals, TextWriter stdout)
    {
        var day = DayOption("Production day (default: the last complete one)");
        var by = new Option<string>("--by") { Description = "Who asks for it (recorded in the audit trail; default: the login name)" };
        var json = new Option<bool>("--json") { Description = "Print one JSON document on stdout" };
        var command = new Command("digest", "Write (or rewrite) the digest of a production day: HTML, Markdown and CSV under digests/") { day, by, json };
        command.SetAction(parse => HostedCommand.Run(parse, globals, service: false, host =>
        {
            var services = host.Services;
            var target = ParseDay(parse.GetValue(day))
                ?? services.GetRequiredService<DigestSchedule>().LastCompleteDay(services.GetRequiredService<TimeProvider>().GetUtcNow());
            var result = services.GetRequiredService<DigestWriter>().Write(target, rewrite: true, Reviewer.Name(parse.GetValue(by)));
            if (!result.Written)
            {
                throw new UsageException($"digest of {target:yyyy-MM-dd} not written: {result.Refusal}");
            }

            if (parse.GetValue(json))
            {
                JsonOutput.Write(stdout, new DigestJson(target.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture), result.Files, result.Flags));
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

    private sealed record DigestJson(string Day, IReadOnlyList<string> Files, int Flags);
}
