using System.CommandLine;
using System.Globalization;
using BatchReconcile.Digests;
using BatchReconcile.Hosting;
using BatchReconcile.Intake.Inbox;
using BatchReconcile.Pipeline;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Storage;
using BatchReconcile.Storage.Ingest;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Options;
using Spectre.Console;

namespace BatchReconcile.Cli;

/// <summary>
/// <c>demo</c>: the whole job once over the sample scenario, into a fresh data folder, then a summary of
/// batches, yields and flags and where every file went.
/// </summary>
/// <remarks>
/// The scenario's history (sample-data/history: earlier batches of one recipe over two versions, for trends and
/// comparisons) is ingested first, then the week's exports; the batch table lists the week's batches and one line
/// sums up the history.
/// </remarks>
/// <remarks>
/// Exits 0 when the scenario ran: its malformed files are meant to be quarantined, and the summary says so.
/// </remarks>
public static class DemoCommand
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    public static Command Create(GlobalOptions globals, TextWriter stdout)
    {
        var samples = new Option<DirectoryInfo>("--samples")
        {
            Description = "Folder of sample exports (default: sample-data/inbox)",
            DefaultValueFactory = _ => new DirectoryInfo(Path.Combine("sample-data", "inbox")),
        };
        var history = new Option<DirectoryInfo?>("--history")
        {
            Description = "Folder of earlier exports ingested before the samples (default: the 'history' folder beside --samples, when there is one)",
        };
        var command = new Command("demo", "Run the whole job once over the sample scenario into a fresh data folder and summarise it") { samples, history };
        command.SetAction(parse =>
        {
            var source = parse.GetRequiredValue(samples);
            if (!source.Exists)
            {
                throw new UsageException($"{source.FullName}: no such folder (run from the repository root, or give --samples)");
            }

            var earlier = parse.GetValue(history) ?? new DirectoryInfo(Path.Combine(source.Parent?.FullName ?? ".", "history"));
            if (parse.GetValue(history) is { Exists: false } missing)
            {
                throw new UsageException($"{missing.FullName}: no such folder (--history)");
            }

            var data = parse.GetValue(globals.Data)?.FullName
                ?? Path.GetFullPath(Path.Combine("demo-data", DateTime.UtcNow.ToString("yyyyMMdd-HHmmss", Inv)));
            if (Directory.Exists(data) && Directory.EnumerateFileSystemEntries(data).Any())
            {
                throw new UsageException($"{data}: the demo needs a new or empty data folder");
            }

            var context = AppContextOptions.From(parse.GetValue(globals.Config), new DirectoryInfo(data));
            using var host = HostedCommand.Start(context, service: false, quietConsole: true);
            var services = host.Services;
            var folders = services.GetRequiredService<DataFolders>();
            var groupSize = services.GetRequiredService<IOptions<IntakeOptions>>().Value.GroupCommitMaxFiles;
            var pipeline = services.GetRequiredService<IngestPipeline>();
            var historyFiles = earlier.Exists ? CopyIntoInbox(earlier, folders.Inbox, services.GetRequiredService<TimeProvider>()) : [];
            var historyOutcomes = IngestCommand.Run(pipeline, historyFiles, groupSize, TextWriter.Null, showProgress: false);
            var files = CopyIntoInbox(source, folders.Inbox, services.GetRequiredService<TimeProvider>());
            var outcomes = IngestCommand.Run(pipeline, files, groupSize, TextWriter.Null, showProgress: false);

            var console = AnsiConsole.Create(new AnsiConsoleSettings { Out = new AnsiConsoleOutput(stdout) });
            if (Console.IsOutputRedirected || console.Profile.Width < 160)
            {
                // Tables wrap badly at 80 columns; a file or a narrow terminal gets the full width.
                console.Profile.Width = 160;
            }

            var site = services.GetRequiredService<IOptions<SiteOptions>>().Value;
            console.WriteLine($"BatchReconcile demo: {site.Name} ({site.TimeZone}, production day from {site.ProductionDayStart})");
            var store = services.GetRequiredService<BatchStore>();
            if (historyFiles.Count > 0)
            {
                WriteHistory(console, earlier, historyOutcomes, store);
            }

            console.WriteLine($"{files.Count} export files from {source.FullName}");
            console.WriteLine();
            WriteFiles(console, outcomes);
            var earlierBatches = historyOutcomes.SelectMany(o => o.Batches).Select(b => b.BatchId).ToHashSet(StringComparer.Ordinal);
            WriteBatches(console, store, earlierBatches);
            WriteFlags(console, store);
            var digest = WriteLastDayDigest(services);
            WhereEverythingWent(console, folders, [.. historyOutcomes, .. outcomes]);
            if (digest is not null)
            {
                console.WriteLine(string.Create(Inv, $"Digest of the last production day, {digest.Day:yyyy-MM-dd} ({digest.Flags} flags):"));
                foreach (var file in digest.Files)
                {
                    console.WriteLine($"  {file}");
                }
            }

            if (WriteReport(services, folders) is { } report)
            {
                console.WriteLine(string.Create(Inv, $"Analysis report of recipe {report.Recipe} ({report.Batches} batches: trends with control limits, losses, versions compared):"));
                console.WriteLine($"  {report.Path}");
            }

            console.WriteLine("The figures support, not replace, the site's deviation procedure and qualified review.");
            return ExitCodes.Success;
        });
        return command;
    }

    /// <summary>Copies the sample exports into the inbox in name order (their names carry the arrival time).</summary>
    private static IReadOnlyList<ReadyFile> CopyIntoInbox(DirectoryInfo source, string inbox, TimeProvider time)
    {
        var start = time.GetUtcNow();
        var ready = new List<ReadyFile>();
        foreach (var (file, i) in source.EnumerateFiles("*.csv").OrderBy(f => f.Name, StringComparer.Ordinal).Select((f, i) => (f, i)))
        {
            var target = Path.Combine(inbox, file.Name);
            file.CopyTo(target);
            var arrived = start.AddMilliseconds(i);
            ready.Add(new ReadyFile(target, file.Name, arrived, file.Length, arrived));
        }

        return ready;
    }

    private static void WriteFiles(IAnsiConsole console, IReadOnlyList<FileOutcome> outcomes)
    {
        var table = new Table().Title("Files").AddColumns("file", "outcome", "batches");
        foreach (var o in outcomes)
        {
            var batches = o.Outcome == IngestOutcome.Quarantined
                ? string.Create(Inv, $"{o.Errors.Count} problem(s), e.g. line {o.Errors[0].Line} {o.Errors[0].Column}: {o.Errors[0].Reason}")
                : string.Join(", ", o.Batches.Select(b => string.Create(Inv, $"{b.BatchId} rev {b.Revision}")));
            table.AddRow(Markup.Escape(o.File), o.Outcome.ToText(), Markup.Escape(batches));
        }

        console.Write(table);
        console.WriteLine();
    }

    /// <summary>One paragraph for the history: how many files and batches, of which recipes and versions, over which days.</summary>
    private static void WriteHistory(IAnsiConsole console, DirectoryInfo folder, IReadOnlyList<FileOutcome> outcomes, BatchStore store)
    {
        var ids = outcomes.SelectMany(o => o.Batches).Select(b => b.BatchId).ToHashSet(StringComparer.Ordinal);
        var batches = store.ListBatches().Where(b => ids.Contains(b.BatchId)).ToList();
        var stored = outcomes.Count(o => o.Outcome != IngestOutcome.Quarantined);
        console.WriteLine(string.Create(Inv, $"History: {outcomes.Count} export files from {folder.FullName}, {stored} stored"));
        if (batches.Count > 0)
        {
            var versions = string.Join(", ", batches
                .GroupBy(b => (b.Recipe, b.RecipeVersion))
                .OrderBy(g => g.Key.Recipe, StringComparer.Ordinal).ThenBy(g => g.Key.RecipeVersion)
                .Select(g => string.Create(Inv, $"{g.Key.Recipe} v{g.Key.RecipeVersion}: {g.Count()}")));
            var flags = store.ListFlags().Count(f => ids.Contains(f.BatchId));
            console.WriteLine(string.Create(
                Inv,
                $"  {batches.Count} batches ({Markup.Escape(versions)}), production days {batches.Min(b => b.ProductionDay):yyyy-MM-dd} to {batches.Max(b => b.ProductionDay):yyyy-MM-dd}, {flags} flags"));
        }

        console.WriteLine();
    }

    private static void WriteBatches(IAnsiConsole console, BatchStore store, IReadOnlySet<string> leaveOut)
    {
        var table = new Table().Title("Batches (latest revision)").AddColumns("day", "batch", "recipe", "rev", "step", "yield %", "AE %", "PMI", "closure %", "flags");
        foreach (var summary in store.ListBatches().Where(b => !leaveOut.Contains(b.BatchId)).OrderBy(b => b.ProductionDay).ThenBy(b => b.BatchId, StringComparer.Ordinal))
        {
            var view = store.GetLatestBatch(summary.BatchId)!;
            foreach (var step in view.Steps)
            {
                var s = step.Outcome;
                table.AddRow(
                    summary.ProductionDay.ToString("yyyy-MM-dd", Inv),
                    Markup.Escape(summary.BatchId),
                    Markup.Escape(summary.Recipe),
                    summary.Revision.ToString(Inv),
                    Markup.Escape(s.Step),
                    F(s.YieldPct, "F1"),
                    F(s.AtomEconomyPct, "F1"),
                    F(s.Pmi, "F2"),
                    F(s.ClosurePct, "F1"),
                    Markup.Escape(string.Join(", ", step.Flags.Select(f => f.Flag.Code.ToText()))));
            }
        }

        console.Write(table);
        console.WriteLine();
    }

    private static void WriteFlags(IAnsiConsole console, BatchStore store)
    {
        var flags = store.ListFlags();
        var table = new Table().Title("Flags of current revisions").AddColumns("id", "day", "severity", "batch", "step", "code", "message");
        foreach (var f in flags.OrderBy(f => f.ProductionDay).ThenBy(f => f.Severity).ThenBy(f => f.Id))
        {
            table.AddRow(f.Id.ToString(Inv), f.ProductionDay.ToString("yyyy-MM-dd", Inv), f.Severity.ToText(), Markup.Escape(f.BatchId), Markup.Escape(f.Step), f.Code.ToText(), Markup.Escape(f.Message));
        }

        console.Write(table);
        console.WriteLine();
    }

    /// <summary>The scenario ends with the digest of its last production day.</summary>
    private static DigestWriteResult? WriteLastDayDigest(IServiceProvider services)
    {
        var batches = services.GetRequiredService<BatchStore>().ListBatches();
        return batches.Count == 0
            ? null
            : services.GetRequiredService<DigestWriter>().Write(batches.Max(b => b.ProductionDay), rewrite: false, by: "demo");
    }

    /// <summary>The scenario ends with the analysis report of the recipe with the most batches, under reports/ in the data folder.</summary>
    private static (string Recipe, int Batches, string Path)? WriteReport(IServiceProvider services, DataFolders folders)
    {
        var busiest = services.GetRequiredService<BatchStore>().ListBatches()
            .GroupBy(b => b.Recipe, StringComparer.Ordinal)
            .OrderByDescending(g => g.Count()).ThenBy(g => g.Key, StringComparer.Ordinal)
            .FirstOrDefault();
        if (busiest is null)
        {
            return null;
        }

        var folder = Directory.CreateDirectory(Path.Combine(folders.Root, "reports")).FullName;
        var path = ReportCommand.Write(services, busiest.Key, null, null, Path.Combine(folder, $"report-{ReportCommand.FileSafe(busiest.Key)}.html"));
        return (busiest.Key, busiest.Count(), path);
    }

    private static void WhereEverythingWent(IAnsiConsole console, DataFolders folders, IReadOnlyList<FileOutcome> outcomes)
    {
        console.WriteLine($"Data folder:  {folders.Root}");
        console.WriteLine($"  database:   {folders.Database}");
        console.WriteLine(string.Create(Inv, $"  archive:    {folders.Archive} ({outcomes.Count(o => o.Outcome != IngestOutcome.Quarantined)} files)"));
        console.WriteLine(string.Create(Inv, $"  quarantine: {folders.Quarantine} ({outcomes.Count(o => o.Outcome == IngestOutcome.Quarantined)} files, each with a .report.txt)"));
        console.WriteLine($"  logs:       {folders.Logs}");
        console.WriteLine("Look closer: batchreconcile batches show BATCH --data " + folders.Root);
    }

    private static string F(double? value, string format) => value is { } v ? v.ToString(format, Inv) : "-";
}
