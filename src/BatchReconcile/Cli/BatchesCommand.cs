using System.CommandLine;
using System.Globalization;
using BatchReconcile.Storage;
using Microsoft.Extensions.DependencyInjection;

namespace BatchReconcile.Cli;

/// <summary><c>batches show BATCH [--revision N] [--json]</c>: a stored batch, its steps and flags.</summary>
public static class BatchesCommand
{
    public static Command Create(GlobalOptions globals, TextWriter stdout)
    {
        var batchId = new Argument<string>("BATCH") { Description = "Batch identifier, e.g. KB3-BZ-0412" };
        var revision = new Option<int?>("--revision") { Description = "A given revision instead of the latest" };
        var json = new Option<bool>("--json") { Description = "Print one JSON document on stdout" };
        var show = new Command("show", "The latest (or a given) revision of a stored batch: every step's figures and flags") { batchId, revision, json };
        show.SetAction(parse => HostedCommand.Run(parse, globals, service: false, host =>
        {
            var store = host.Services.GetRequiredService<BatchStore>();
            var id = parse.GetRequiredValue(batchId);
            var rev = parse.GetValue(revision);
            var view = store.GetBatch(id, rev)
                ?? throw new UsageException(rev is null ? $"batch '{id}' is not stored" : $"batch '{id}' has no revision {rev}");
            if (parse.GetValue(json))
            {
                JsonOutput.Write(stdout, BatchJson.From(view));
                return ExitCodes.Success;
            }

            var state = view.IsCurrent
                ? string.Create(CultureInfo.InvariantCulture, $", revision {view.Revision} of {view.RevisionCount}")
                : string.Create(CultureInfo.InvariantCulture, $", revision {view.Revision} of {view.RevisionCount} (superseded by {view.SupersededByRevision})");
            BatchText.Write(
                stdout,
                BatchText.Header(view.BatchId, view.Recipe, view.RecipeVersion, view.RecipeVersionSource, view.ProductionDay, state),
                [$"from {view.SourceFile}"],
                view.Steps.Select(s => (s.Outcome, (IReadOnlyList<(Reconciliation.Flags.Flag, long?)>)s.Flags.Select(f => (f.Flag, (long?)f.Id)).ToList())));
            BatchText.WriteRoute(stdout, view.Route, view.Links);
            return ExitCodes.Success;
        }, storeOnly: true));

        return new Command("batches", "Stored batches") { show };
    }
}
