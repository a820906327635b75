using System.CommandLine;
using System.Globalization;
using System.Text.Json;
using BatchReconcile.Reconciliation.ProductionDays;
using BatchReconcile.Records;
using BatchReconcile.Storage;
using BatchReconcile.Storage.Queries;
using BatchReconcile.Storage.Audit;
using Microsoft.Extensions.DependencyInjection;

namespace BatchReconcile.Cli;

/// <summary>
/// <c>audit verify</c>: walks the hash chain of the audit trail; <c>audit list [--from D] [--to D] [--kind K] [--json]</c> and
/// <c>audit show N [--json]</c>: read it.
/// </summary>
public static class AuditCommand
{
    public static Command Create(GlobalOptions globals, TextWriter stdout, TextWriter stderr)
    {
        var verify = new Command("verify", "Check that no entry of the audit trail was changed or removed and that the live review state and current revisions are what it records; exit 1 naming what does not verify");
        verify.SetAction(parse => HostedCommand.Run(parse, globals, service: false, host =>
        {
            var result = host.Services.GetRequiredService<BatchStore>().VerifyAudit();
            if (result.Intact)
            {
                stdout.WriteLine(string.Create(CultureInfo.InvariantCulture, $"audit trail intact: {result.EntriesChecked} entries, last hash {result.LastHash}"));
                return ExitCodes.Success;
            }

            if (result.Problem == AuditProblem.LiveStateDiffers)
            {
                // One line per difference: each names the flag or batch, the field, the live value and the trail's.
                stderr.WriteLine(string.Create(CultureInfo.InvariantCulture,
                    $"batchreconcile: the audit chain of {result.EntriesChecked} entries is intact, but {result.Differences.Count} live value{(result.Differences.Count == 1 ? " differs" : "s differ")} from what it records (changed outside the program?):"));
                foreach (var difference in result.Differences)
                {
                    stderr.WriteLine("  " + difference.Message);
                }

                return ExitCodes.UnexpectedFailure;
            }

            stderr.WriteLine($"batchreconcile: audit trail broken at entry {result.FirstBadId}: {result.Message}");
            return ExitCodes.UnexpectedFailure;
        }, storeOnly: true));
        return new Command("audit", "The audit trail of ingests, revisions, reviews and digests") { verify, List(globals, stdout), Show(globals, stdout) };
    }

    /// <summary>The kinds the program writes; a family is the part before the dot (<c>flag</c> for every <c>flag.*</c>).</summary>
    public static IReadOnlyList<string> ProgramKinds { get; } =
    [
        "ingest.stored", "ingest.revision", "ingest.duplicate", "ingest.quarantined", "batch.revision", "flag.review", "digest.written", "digest.rewritten",
    ];

    private static Command List(GlobalOptions globals, TextWriter stdout)
    {
        var history = new HistoryOptions();
        var kind = new Option<string?>("--kind") { Description = "Only entries of this kind (flag.review) or family of kinds (flag, ingest, digest, batch)" };
        var json = new Option<bool>("--json") { Description = "Print one JSON document on stdout" };
        var command = new Command("list", "Audit entries, oldest first; --from/--to are production days on the plant's calendar") { kind, json };
        history.AddTo(command, recipe: false);
        command.SetAction(parse => HostedCommand.Run(parse, globals, service: false, host =>
        {
            var store = host.Services.GetRequiredService<BatchStore>();
            var calendar = host.Services.GetRequiredService<ProductionDayCalendar>();
            var (from, to) = history.Days(parse);
            var k = parse.GetValue(kind)?.Trim();
            if (k is not null)
            {
                var known = ProgramKinds.Concat(store.AuditKinds()).Distinct(StringComparer.Ordinal).Order(StringComparer.Ordinal).ToList();
                if (!known.Any(x => x == k || x.StartsWith(k + ".", StringComparison.Ordinal)))
                {
                    throw new UsageException($"--kind '{SafeText.Escape(SafeText.Prefix(k, 80))}' is no kind of audit entry; kinds: {string.Join(", ", known)} (or a family: {string.Join(", ", known.Select(x => x.Split('.')[0]).Distinct())})");
                }
            }

            var entries = store.ListAudit(new AuditFilter(from is { } f ? calendar.Bounds(f).Start : null, to is { } t ? calendar.Bounds(t).End : null, k));
            if (parse.GetValue(json))
            {
                JsonOutput.Write(stdout, entries.Select(AuditJson.From).ToList());
                return ExitCodes.Success;
            }

            if (entries.Count == 0)
            {
                stdout.WriteLine($"no audit entries{(k is null ? "" : $" of kind {k}")}{HistoryOptions.Describe(null, from, to)}");
                return ExitCodes.Success;
            }

            foreach (var entry in entries)
            {
                stdout.WriteLine(AuditJson.Line(entry));
            }

            stdout.WriteLine(string.Create(CultureInfo.InvariantCulture, $"{entries.Count} entr{(entries.Count == 1 ? "y" : "ies")}"));
            return ExitCodes.Success;
        }, storeOnly: true));
        return command;
    }

    private static Command Show(GlobalOptions globals, TextWriter stdout)
    {
        var id = new Argument<long>("N") { Description = "The entry's number, as audit list shows it" };
        var json = new Option<bool>("--json") { Description = "Print one JSON document on stdout" };
        var command = new Command("show", "One audit entry with its detail, and whether its content still gives its hash") { id, json };
        command.SetAction(parse => HostedCommand.Run(parse, globals, service: false, host =>
        {
            var n = parse.GetValue(id);
            var entry = host.Services.GetRequiredService<BatchStore>().GetAuditEntry(n)
                ?? throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"N {n}: the audit trail has no entry with this number (audit list shows them)"));
            var matches = string.Equals(AuditCanonicalForm.Hash(entry), entry.Hash, StringComparison.Ordinal);
            var shown = AuditJson.From(entry);
            if (parse.GetValue(json))
            {
                JsonOutput.Write(stdout, new AuditShowJson(shown, matches));
                return ExitCodes.Success;
            }

            stdout.WriteLine($"audit entry #{entry.Id.ToString(CultureInfo.InvariantCulture)}");
            stdout.WriteLine($"  at:        {entry.At}");
            stdout.WriteLine($"  kind:      {SafeText.Escape(entry.Kind)}");
            stdout.WriteLine($"  subject:   {SafeText.Escape(entry.Subject)}");
            stdout.WriteLine($"  actor:     {SafeText.Escape(entry.Actor)}");
            if (entry.FromState is not null || entry.ToState is not null)
            {
                stdout.WriteLine($"  states:    {entry.FromState ?? "-"} -> {entry.ToState ?? "-"}");
            }

            if (entry.Note is not null)
            {
                stdout.WriteLine($"  note:      {SafeText.Escape(entry.Note)}");
            }

            if (entry.DeviationRef is not null)
            {
                stdout.WriteLine($"  deviation: {SafeText.Escape(entry.DeviationRef)}");
            }

            stdout.WriteLine("  detail:");
            foreach (var line in JsonSerializer.Serialize(shown.Detail, JsonOutput.Options).Split('\n'))
            {
                stdout.WriteLine("    " + SafeText.Escape(line.TrimEnd('\r')));
            }

            stdout.WriteLine($"  previous:  {entry.PreviousHash}");
            stdout.WriteLine($"  hash:      {entry.Hash} ({(matches ? "its content gives this hash" : "its content does NOT give this hash: run audit verify")})");
            return ExitCodes.Success;
        }, storeOnly: true));
        return command;
    }

    /// <summary><c>audit show --json</c>: the entry and whether its content still gives its hash (the chain is checked by <c>audit verify</c>).</summary>
    private sealed record AuditShowJson(AuditJson Entry, bool ContentMatchesHash);
}
