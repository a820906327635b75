using System.CommandLine;
using System.Globalization;
using BatchReconcile.Pipeline;
using BatchReconcile.Records;
using BatchReconcile.Records.Exports;
using BatchReconcile.Storage.Ingest;
using Microsoft.Extensions.DependencyInjection;

namespace BatchReconcile.Cli;

/// <summary><c>check FILE [--json]</c>: validate and reconcile one export; store and move nothing.</summary>
public static class CheckCommand
{
    public static Command Create(GlobalOptions globals, TextWriter stdout, TextWriter stderr)
    {
        var file = new Argument<FileInfo>("FILE") { Description = "An export file" };
        var json = new Option<bool>("--json") { Description = "Print one JSON document on stdout" };
        var command = new Command("check", "Validate and reconcile an export file without storing anything") { file, json };
        command.SetAction(parse => HostedCommand.Run(parse, globals, service: false, host =>
        {
            var info = parse.GetRequiredValue(file);
            if (!info.Exists)
            {
                throw new UsageException($"{info.FullName}: no such file");
            }

            var pipeline = host.Services.GetRequiredService<IngestPipeline>();
            var (read, batches) = pipeline.Check(info.FullName, new DateTimeOffset(info.LastWriteTimeUtc, TimeSpan.Zero));
            if (parse.GetValue(json))
            {
                JsonOutput.Write(stdout, new CheckJson(
                    read.FileName,
                    read.IsValid,
                    read.Errors.Select(BatchJson.ErrorJson.From).ToList(),
                    batches.Select(ToJson).ToList()));
            }
            else if (read.IsValid)
            {
                foreach (var batch in batches)
                {
                    BatchText.Write(stdout, batch.Outcome, batch.ProductionDay);
                }
            }
            else
            {
                foreach (var error in read.Errors)
                {
                    stdout.WriteLine(SafeText.Escape(error.ToString()));
                }
            }

            if (!read.IsValid)
            {
                var first = read.Errors[0];
                stderr.WriteLine($"batchreconcile: {SafeText.Escape(read.FileName)} would be quarantined: {read.Errors.Count} problem(s), first {Where(first)}: {SafeText.Escape(first.Reason)}");
                return ExitCodes.BadInput;
            }

            return ExitCodes.Success;
        }));
        return command;
    }

    private static string Where(ExportError e) => e.Line > 0 ? $"line {e.Line.ToString(CultureInfo.InvariantCulture)}{(e.Column.Length > 0 ? $" column {e.Column}" : "")}" : "file";

    private static CheckBatchJson ToJson(BatchIngest b) => new(
        b.BatchId,
        b.Outcome.Batch.RecipeCode,
        b.Outcome.Batch.RecipeVersion,
        b.Outcome.Batch.RecipeVersionSource.ToText(),
        b.ProductionDay.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture),
        b.Outcome.Batch.Warnings,
        b.Outcome.Steps.Select(s => BatchJson.Step(s, s.Flags.Select(f => BatchJson.Flag(f, null)).ToList())).ToList(),
        BatchJson.RoundPct(b.Outcome.Route.YieldPct),
        BatchJson.RoundPct(b.Outcome.Route.TheoreticalKg),
        b.Outcome.Route.Reason,
        b.Outcome.Links.Select(BatchJson.Link).ToList());

    private sealed record CheckJson(string File, bool Valid, IReadOnlyList<BatchJson.ErrorJson> Errors, IReadOnlyList<CheckBatchJson> Batches);

    private sealed record CheckBatchJson(
        string Batch,
        string Recipe,
        int RecipeVersion,
        string RecipeVersionSource,
        string ProductionDay,
        IReadOnlyList<string> Warnings,
        IReadOnlyList<BatchJson.StepJson> Steps,
        double? RouteYieldPct,
        double? RouteTheoreticalKg,
        string? RouteYieldNote,
        IReadOnlyList<BatchJson.LinkJson> Intermediates);
}
