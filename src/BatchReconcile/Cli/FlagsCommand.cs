using System.CommandLine;
using System.Globalization;
using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Records;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Storage;
using Microsoft.Extensions.DependencyInjection;

namespace BatchReconcile.Cli;

/// <summary><c>flags list</c> and <c>flags review</c>: the QA review of flags.</summary>
public static class FlagsCommand
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    public static Command Create(GlobalOptions globals, TextWriter stdout)
    {
        return new Command("flags", "List flags, show one with its history, and record their review") { List(globals, stdout), Show(globals, stdout), Review(globals, stdout) };
    }

    private static Command List(GlobalOptions globals, TextWriter stdout)
    {
        var open = new Option<bool>("--open") { Description = "Only flags not closed yet (open or in review)" };
        var day = DigestCommand.DayOption("Only flags of this production day (YYYY-MM-DD)");
        var json = new Option<bool>("--json") { Description = "Print one JSON document on stdout" };
        var command = new Command("list", "Flags of current batch revisions, oldest day first") { open, day, json };
        command.SetAction(parse => HostedCommand.Run(parse, globals, service: false, host =>
        {
            var flags = host.Services.GetRequiredService<BatchStore>()
                .ListFlags(DigestCommand.ParseDay(parse.GetValue(day)), unresolvedOnly: parse.GetValue(open));
            if (parse.GetValue(json))
            {
                JsonOutput.Write(stdout, flags.Select(f => new FlagJson(
                    f.Id, f.BatchId, f.Revision, f.Step, f.Code.ToText(), f.Severity.ToText(), f.Review.State.ToText(),
                    f.Review.Outcome?.ToText(), f.ProductionDay.ToString("yyyy-MM-dd", Inv), f.Message)).ToList());
                return ExitCodes.Success;
            }

            foreach (var f in flags)
            {
                var state = f.Review.Outcome is { } outcome ? $"closed ({outcome.ToText()})" : f.Review.State.ToText();
                stdout.WriteLine(string.Create(Inv, $"#{f.Id} {f.ProductionDay:yyyy-MM-dd} {f.Severity.ToText(),-8} {SafeText.Escape(f.BatchId)} rev {f.Revision} {SafeText.Escape(f.Step)} {f.Code.ToText()} [{state}]"));
                stdout.WriteLine($"    {SafeText.Escape(f.Message)}");
            }

            stdout.WriteLine(string.Create(Inv, $"{flags.Count} flag(s)"));
            return ExitCodes.Success;
        }, storeOnly: true));
        return command;
    }

    private static Command Review(GlobalOptions globals, TextWriter stdout)
    {
        var id = new Argument<long>("FLAG_ID") { Description = "The flag's number, as flags list shows it" };
        var state = new Option<string>("--state") { Description = "in-review or closed", Required = true };
        state.AcceptOnlyFromAmong("in-review", "closed");
        var by = new Option<string>("--by") { Description = "Reviewer's name (free text)", Required = true };
        var note = new Option<string>("--note") { Description = "What was found or decided", Required = true };
        var outcome = new Option<string?>("--outcome") { Description = "When closing: explained, deviation or corrected" };
        outcome.AcceptOnlyFromAmong("explained", "deviation", "corrected");
        var deviation = new Option<string?>("--deviation") { Description = "Deviation reference (needed with --outcome deviation)" };
        var command = new Command("review", "Move a flag to in-review or closed, with who, why and (when closing) the outcome")
        {
            id, state, by, note, outcome, deviation,
        };
        command.SetAction(parse => HostedCommand.Run(parse, globals, service: false, host =>
        {
            ReviewText.TryParseState(parse.GetRequiredValue(state), out var to);
            CloseOutcome? closeOutcome = ReviewText.TryParseOutcome(parse.GetValue(outcome), out var parsed) ? parsed : null;
            var store = host.Services.GetRequiredService<BatchStore>();
            var flagId = parse.GetValue(id);
            var result = store.ReviewFlag(flagId, to!.Value, parse.GetRequiredValue(by), parse.GetRequiredValue(note), closeOutcome, parse.GetValue(deviation));
            if (!result.Accepted)
            {
                throw new UsageException(result.Reason!);
            }

            var review = result.Review!;
            var detail = review.Outcome is { } o ? $" ({o.ToText()}{(review.DeviationRef is { } r ? $", {r}" : "")})" : string.Empty;
            stdout.WriteLine(string.Create(Inv, $"flag {flagId}: {review.State.ToText()}{detail}, by {SafeText.Escape(review.By)} at {review.At:yyyy-MM-ddTHH:mm:ssZ}; audit entry {result.AuditId}"));
            return ExitCodes.Success;
        }, storeOnly: true));
        return command;
    }

    private static Command Show(GlobalOptions globals, TextWriter stdout)
    {
        var id = new Argument<long>("FLAG_ID") { Description = "The flag's number, as flags list shows it" };
        var json = new Option<bool>("--json") { Description = "Print one JSON document on stdout" };
        var command = new Command("show", "One flag: the step figures and stored limits that decided it, and its review history from the audit trail") { id, json };
        command.SetAction(parse => HostedCommand.Run(parse, globals, service: false, host =>
        {
            var flagId = parse.GetValue(id);
            var detail = host.Services.GetRequiredService<BatchStore>().GetFlag(flagId)
                ?? throw new UsageException(string.Create(Inv, $"FLAG_ID {flagId}: no flag has this number (flags list shows them)"));
            var f = detail.Flag;
            if (parse.GetValue(json))
            {
                JsonOutput.Write(stdout, new FlagShowJson(
                    f.Id, detail.BatchId, detail.Revision, f.IsCurrent, detail.SupersededByRevision, detail.Recipe, detail.RecipeVersion,
                    detail.ProductionDay.ToString("yyyy-MM-dd", Inv), f.Flag.Step, f.Flag.Code.ToText(), f.Flag.Severity.ToText(), f.State,
                    f.Review.Outcome?.ToText(), f.Review.DeviationRef, f.Review.By, f.Review.At?.ToString("yyyy-MM-dd'T'HH:mm:ss'Z'", Inv), f.Review.Note,
                    f.Flag.Message, BatchJson.RoundPct(f.Flag.Measured), BatchJson.RoundPct(f.Flag.Limit), f.Flag.Unit, f.Flag.Subject,
                    f.CreatedAt.ToString("yyyy-MM-dd'T'HH:mm:ss'Z'", Inv),
                    BatchJson.Step(detail.Step.Outcome, detail.Step.Flags.Select(x => BatchJson.Flag(x.Flag, x.Id)).ToList()),
                    detail.History.Select(AuditJson.From).ToList()));
                return ExitCodes.Success;
            }

            var state = f.Review.Outcome is { } outcome ? $"closed ({outcome.ToText()}{(f.Review.DeviationRef is { } r ? ", " + SafeText.Escape(r) : "")})" : f.State;
            stdout.WriteLine(string.Create(Inv, $"flag #{f.Id}: {f.Flag.Severity.ToText()} {f.Flag.Code.ToText()} on step {SafeText.Escape(f.Flag.Step)}, {state}"));
            var revision = f.IsCurrent ? "current" : detail.SupersededByRevision is { } n ? string.Create(Inv, $"superseded by revision {n}") : "superseded";
            stdout.WriteLine(string.Create(Inv, $"  batch {SafeText.Escape(detail.BatchId)} revision {detail.Revision} ({revision}), recipe {SafeText.Escape(detail.Recipe)} v{detail.RecipeVersion}, production day {detail.ProductionDay:yyyy-MM-dd}; stored {f.CreatedAt:yyyy-MM-dd'T'HH:mm:ss'Z'}"));
            stdout.WriteLine($"  {SafeText.Escape(f.Flag.Message)}");
            stdout.WriteLine($"  measured {Figure(f.Flag.Measured, f.Flag.Unit)}, limit {Figure(f.Flag.Limit, f.Flag.Unit)}{(f.Flag.Subject is { } subject ? ", subject " + SafeText.Escape(subject) : "")}");
            stdout.WriteLine("  the step's figures and the limits stored with them:");
            BatchText.Write(
                stdout,
                string.Empty,
                [],
                [(detail.Step.Outcome, (IReadOnlyList<(Flag, long?)>)detail.Step.Flags.Select(x => (x.Flag, (long?)x.Id)).ToList())],
                writeHeader: false);
            if (detail.History.Count == 0)
            {
                stdout.WriteLine("  review history: none yet (open since it was stored)");
            }
            else
            {
                stdout.WriteLine(string.Create(Inv, $"  review history ({detail.History.Count} entr{(detail.History.Count == 1 ? "y" : "ies")} of the audit trail):"));
                foreach (var entry in detail.History)
                {
                    stdout.WriteLine("    " + AuditJson.Line(entry));
                }
            }

            return ExitCodes.Success;
        }, storeOnly: true));
        return command;
    }

    private static string Figure(double? value, string unit) => value is { } v ? string.Create(Inv, $"{v:0.###} {SafeText.Escape(unit)}") : "unknown";

    private sealed record FlagShowJson(
        long Id, string Batch, int Revision, bool Current, int? SupersededByRevision, string Recipe, int RecipeVersion, string Day, string Step,
        string Code, string Severity, string State, string? Outcome, string? DeviationRef, string? ReviewedBy, string? ReviewedAt, string? ReviewNote,
        string Message, double? Measured, double? Limit, string Unit, string? Subject, string CreatedAt, BatchJson.StepJson StepFigures,
        IReadOnlyList<AuditJson> History);

    private sealed record FlagJson(long Id, string Batch, int Revision, string Step, string Code, string Severity, string State, string? Outcome, string Day, string Message);
}
