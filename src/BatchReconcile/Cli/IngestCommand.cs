using System.CommandLine;
using BatchReconcile.Digests;
using BatchReconcile.Hosting;
using BatchReconcile.Intake.Inbox;
using BatchReconcile.Pipeline;
using BatchReconcile.Records;
using BatchReconcile.Storage.Ingest;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Options;
using Spectre.Console;

namespace BatchReconcile.Cli;

/// <summary><c>ingest PATH... [--json]</c>: the service's pipeline once over files or folders, then exit.</summary>
public static class IngestCommand
{
    public static Command Create(GlobalOptions globals, TextWriter stdout, TextWriter stderr)
    {
        var paths = new Argument<string[]>("PATH") { Description = "Export files, or folders whose ready files are taken in arrival order", Arity = ArgumentArity.OneOrMore };
        var json = new Option<bool>("--json") { Description = "Print one JSON document on stdout" };
        var command = new Command("ingest", "Validate, reconcile and store export files once; archive or quarantine each") { paths, json };
        command.SetAction(parse => HostedCommand.Run(parse, globals, service: false, host =>
        {
            var intake = host.Services.GetRequiredService<IOptions<IntakeOptions>>().Value;
            var time = host.Services.GetRequiredService<TimeProvider>();
            var ignored = new List<IgnoredEntry>();
            var files = Collect(parse.GetRequiredValue(paths), TimeSpan.FromSeconds(intake.SettleSeconds), time, stderr, ignored);
            var pipeline = host.Services.GetRequiredService<IngestPipeline>();
            var asJson = parse.GetValue(json);
            var left = new List<string>();
            var outcomes = Run(pipeline, files, intake.GroupCommitMaxFiles, asJson ? stderr : stdout, showProgress: !asJson && !Console.IsOutputRedirected, left);
            // A file for a day whose digest exists makes that digest stale: it is rewritten now, not at the service's next pass.
            var rewritten = host.Services.GetRequiredService<DigestWriter>().RewriteStale();
            if (asJson)
            {
                JsonOutput.Write(stdout, outcomes.Select(ToJson).ToList());
                foreach (var entry in ignored)
                {
                    // stdout holds the JSON document only.
                    stderr.WriteLine($"batchreconcile: {SafeText.Escape(entry.Name)} is a {entry.KindText}; never read");
                }
            }
            else
            {
                WriteSummary(stdout, outcomes, ignored);
            }

            foreach (var digest in rewritten)
            {
                // With --json stdout holds the one JSON document only, so the note goes to stderr.
                (asJson ? stderr : stdout).WriteLine(
                    $"digest of {digest.Day:yyyy-MM-dd} rewritten as issue {digest.Issue} ({digest.Reason}): {digest.Files[0]}");
            }

            foreach (var name in left)
            {
                stderr.WriteLine($"batchreconcile: {SafeText.Escape(name)} changed each of the {IngestPipeline.MaxReads} times it was read; nothing of it was stored and it is left where it is (ingest it again once it is complete)");
            }

            return left.Count > 0 ? ExitCodes.UnexpectedFailure
                : outcomes.Any(o => o.Outcome == IngestOutcome.Quarantined) ? ExitCodes.CompletedWithQuarantine : ExitCodes.Success;
        }));
        return command;
    }

    /// <summary>Processes the files in groups; on a terminal shows a progress bar, otherwise one plain line per file.</summary>
    /// <param name="left">Receives the names of files that changed each time they were read (nothing of them stored or moved).</param>
    public static IReadOnlyList<FileOutcome> Run(IngestPipeline pipeline, IReadOnlyList<ReadyFile> files, int groupSize, TextWriter lines, bool showProgress, List<string>? left = null)
    {
        IReadOnlyList<FileOutcome> Group(ReadyFile[] group)
        {
            try
            {
                return pipeline.Process(group);
            }
            catch (FilesStillChangingException e) when (left is not null)
            {
                left.AddRange(e.Left);
                return e.Done;
            }
        }

        var outcomes = new List<FileOutcome>(files.Count);
        var groups = files.Chunk(groupSize).ToList();
        if (showProgress && files.Count > 1)
        {
            AnsiConsole.Progress().AutoClear(true).Start(ctx =>
            {
                var task = ctx.AddTask("ingesting", maxValue: files.Count);
                foreach (var group in groups)
                {
                    outcomes.AddRange(Group(group));
                    task.Increment(group.Length);
                }
            });
            return outcomes;
        }

        foreach (var group in groups)
        {
            foreach (var outcome in Group(group))
            {
                outcomes.Add(outcome);
                lines.WriteLine($"[{outcomes.Count}/{files.Count}] {SafeText.Escape(outcome.File)}: {outcome.Outcome.ToText()}");
            }
        }

        return outcomes;
    }

    private static IReadOnlyList<ReadyFile> Collect(string[] paths, TimeSpan settle, TimeProvider time, TextWriter stderr, List<IgnoredEntry> ignored)
    {
        var files = new List<ReadyFile>();
        foreach (var path in paths)
        {
            if (Directory.Exists(path))
            {
                var scan = InboxScanner.ScanOnceAsync(path, settle, time).GetAwaiter().GetResult();
                files.AddRange(scan.Ready);
                ignored.AddRange(scan.Ignored.Select(i => i with { Name = Path.Combine(path, i.Name) }));
                foreach (var notReady in scan.NotReady)
                {
                    stderr.WriteLine($"batchreconcile: {SafeText.Escape(notReady)} is still being written; left for a later run");
                }
            }
            else if (File.Exists(path))
            {
                var name = Path.GetFileName(path);
                if (!InboxFileName.IsCandidate(name))
                {
                    throw new UsageException($"{path}: files starting with '.' or ending in .part or .tmp are never read");
                }

                var info = new FileInfo(path);
                var written = new DateTimeOffset(info.LastWriteTimeUtc, TimeSpan.Zero);
                files.Add(new ReadyFile(info.FullName, name, written, info.Length, written));
            }
            else
            {
                throw new UsageException($"{path}: no such file or folder");
            }
        }

        return files;
    }

    private static void WriteSummary(TextWriter stdout, IReadOnlyList<FileOutcome> outcomes, IReadOnlyList<IgnoredEntry> ignored)
    {
        foreach (var o in outcomes)
        {
            var batches = o.Batches.Count > 0 ? " (" + string.Join(", ", o.Batches.Select(b => $"{SafeText.Escape(b.BatchId)} rev {b.Revision}")) + ")" : string.Empty;
            stdout.WriteLine($"{SafeText.Escape(o.File)}: {o.Outcome.ToText()}{batches} -> {SafeText.Escape(o.MovedTo)}");
            if (o.ReportPath is not null)
            {
                stdout.WriteLine($"  {o.Errors.Count} problem(s); report {SafeText.Escape(o.ReportPath)}");
            }
        }

        foreach (var entry in ignored)
        {
            stdout.WriteLine($"{SafeText.Escape(entry.Name)}: never read (a {entry.KindText})");
        }

        var counts = outcomes.GroupBy(o => o.Outcome).OrderBy(g => g.Key).Select(g => $"{g.Count()} {g.Key.ToText()}");
        stdout.WriteLine(string.Join(", ", ignored.Count > 0 ? counts.Append($"{ignored.Count} ignored") : counts));
    }

    private static IngestFileJson ToJson(FileOutcome o) => new(
        o.File,
        o.Sha256,
        o.Outcome.ToText(),
        o.Batches.Select(b => b.BatchId).ToList(),
        o.Errors.Select(BatchJson.ErrorJson.From).ToList());

    private sealed record IngestFileJson(string File, string Sha256, string Outcome, IReadOnlyList<string> Batches, IReadOnlyList<BatchJson.ErrorJson> Errors);
}
