using System.CommandLine;
using System.Globalization;
using BatchReconcile.Storage;
using BatchReconcile.Storage.Audit;
using Microsoft.Extensions.DependencyInjection;

namespace BatchReconcile.Cli;

/// <summary><c>audit verify</c>: walks the hash chain of the audit trail.</summary>
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
        return new Command("audit", "The audit trail of ingests, revisions, reviews and digests") { verify };
    }
}
