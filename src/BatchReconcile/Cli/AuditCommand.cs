using System.CommandLine;
using System.Globalization;
using BatchReconcile.Storage;
using Microsoft.Extensions.DependencyInjection;

namespace BatchReconcile.Cli;

/// <summary><c>audit verify</c>: walks the hash chain of the audit trail.</summary>
public static class AuditCommand
{
    public static Command Create(GlobalOptions globals, TextWriter stdout, TextWriter stderr)
    {
        var verify = new Command("verify", "Check that no entry of the audit trail was changed or removed; exit 1 naming the first that does not verify");
        verify.SetAction(parse => HostedCommand.Run(parse, globals, service: false, host =>
        {
            var result = host.Services.GetRequiredService<BatchStore>().VerifyAudit();
            if (result.Intact)
            {
                stdout.WriteLine(string.Create(CultureInfo.InvariantCulture, $"audit trail intact: {result.EntriesChecked} entries, last hash {result.LastHash}"));
                return ExitCodes.Success;
            }

            stderr.WriteLine($"batchreconcile: audit trail broken at entry {result.FirstBadId}: {result.Message}");
            return ExitCodes.UnexpectedFailure;
        }, storeOnly: true));
        return new Command("audit", "The audit trail of ingests, revisions, reviews and digests") { verify };
    }
}
