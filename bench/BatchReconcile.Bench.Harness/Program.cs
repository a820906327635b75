using System.Globalization;
using System.Text.Json;
using BatchReconcile.Bench.Harness;
using BatchReconcile.Bench.Harness.Generation;
using BatchReconcile.Bench.Harness.Measuring;

// bench/run is the usual entry point; see bench/README.md.
var repo = FindRepo();
if (args.Length == 0 || args.Any(a => a is "-h" or "--help"))
{
    Console.Error.WriteLine("usage: harness generate --out DIR [--batches N] [--seed S] [--faults 0.05] [--rows-per-step R] [--max-rows-per-step M] [--per-day 50] [--first-day 2024-01-01] [--batches-per-file K] [--one-file-mb M]");
    Console.Error.WriteLine("       harness peer [--files 10000] [--runs 5]");
    Console.Error.WriteLine("       harness soak [--kills 100] [--files-per-round 40] [--seed 11]");
    Console.Error.WriteLine("       harness measure [--quick] [--runs 5] [--small 1000] [--large 10000] [--big-batches 106000] [--big-runs 1] [--small-files 10000] [--latency-files 20] [--rate 1] [--no-kernels]");
    return 2;
}

var options = Options.Parse(args.Skip(1));
try
{
    switch (args[0])
    {
        case "generate":
        {
            options.OnlyKnown("out", "batches", "seed", "faults", "rows-per-step", "max-rows-per-step", "per-day", "first-day", "batches-per-file", "one-file-mb");
            var set = new BatchGenerator(new GeneratorOptions
            {
                OutputFolder = Path.GetFullPath(options.Text("out") ?? throw new ArgumentException("--out DIR is required")),
                Batches = options.Int("batches", 100),
                Seed = options.Int("seed", 1),
                FaultShare = options.Double("faults", 0.05),
                RowsPerStep = options.Int("rows-per-step", 0),
                MaxRowsPerStep = options.Int("max-rows-per-step", 0),
                BatchesPerDay = options.Int("per-day", 50),
                FirstDay = DateOnly.ParseExact(options.Text("first-day") ?? "2024-01-01", "yyyy-MM-dd", CultureInfo.InvariantCulture),
                BatchesPerFile = options.Int("batches-per-file", 1),
                OneFileBytes = (long)(options.Double("one-file-mb", 0) * 1_000_000),
            }, Path.Combine(repo, "sample-data", "inbox")).Write();
            Console.WriteLine(FormattableString.Invariant(
                $"{set.Files} files, {set.Batches} batches, {set.Rows} rows, {set.Bytes} bytes; faults: {set.LowYield} low yield, {set.Gap} gap, {set.Malformed} malformed"));
            return 0;
        }

        case "peer":
        {
            options.OnlyKnown("files", "runs");
            // Only the small-file comparison of issue 12: publish, generate, then ingest, run, the peer script and the floor side by side.
            var work = Path.Combine(repo, "bench", "scratch");
            var baseOptions = new SuiteOptions { Repo = repo, Work = work, Kernels = false, SmallFilesOnly = true };
            var suite = baseOptions with
            {
                Runs = options.Int("runs", baseOptions.Runs),
                SmallFileBacklog = options.Int("files", baseOptions.SmallFileBacklog),
            };
            var command = "bench/run " + string.Join(' ', args);
            var results = new Suite(suite).Run(command);
            var json = results.ToJsonString(new JsonSerializerOptions { WriteIndented = true });
            var markdown = Report.PeerMarkdown(results);
            Directory.CreateDirectory(Path.Combine(repo, "bench", "results"));
            File.WriteAllText(Path.Combine(repo, "bench", "results", "peer.json"), json + "\n");
            Report.WriteInto(Path.Combine(repo, "bench", "README.md"), markdown, Report.PeerBegin, Report.PeerEnd);
            Console.WriteLine(markdown);
            return 0;
        }

        case "measure":
        {
            options.OnlyKnown("quick", "runs", "small", "large", "big-batches", "big-runs", "small-files", "latency-files", "rate", "no-kernels");
            var work = Path.Combine(repo, "bench", "scratch");
            var quick = options.Flag("quick");
            var baseOptions = quick ? SuiteOptions.ForQuick(repo, work) : new SuiteOptions { Repo = repo, Work = work };
            var suite = baseOptions with
            {
                Runs = options.Int("runs", baseOptions.Runs),
                SmallBacklog = options.Int("small", baseOptions.SmallBacklog),
                LargeBacklog = options.Int("large", baseOptions.LargeBacklog),
                BigFileBatches = options.Int("big-batches", baseOptions.BigFileBatches),
                BigFileRuns = options.Int("big-runs", baseOptions.BigFileRuns),
                LatencyFiles = options.Int("latency-files", baseOptions.LatencyFiles),
                SmallFileBacklog = options.Int("small-files", baseOptions.SmallFileBacklog),
                LatencyRatePerSecond = options.Double("rate", baseOptions.LatencyRatePerSecond),
                Kernels = !options.Flag("no-kernels"),
            };
            var command = "bench/run" + (args.Length > 1 ? " " + string.Join(' ', args.Skip(1)) : string.Empty);
            var results = new Suite(suite).Run(command);
            var json = results.ToJsonString(new JsonSerializerOptions { WriteIndented = true });
            var markdown = Report.Markdown(results);
            if (quick)
            {
                // The smoke run proves the harness works; it leaves the committed results alone.
                File.WriteAllText(Path.Combine(work, "quick-results.json"), json);
                Console.WriteLine(markdown);
            }
            else
            {
                Directory.CreateDirectory(Path.Combine(repo, "bench", "results"));
                File.WriteAllText(Path.Combine(repo, "bench", "results", "latest.json"), json + "\n");
                Report.WriteInto(Path.Combine(repo, "bench", "README.md"), markdown);
                Console.WriteLine(markdown);
            }

            return 0;
        }

        case "soak":
            options.OnlyKnown("kills", "files-per-round", "seed");
            return new KillSoak(repo, Path.Combine(repo, "bench", "scratch"), options.Int("kills", 100), options.Int("files-per-round", 40), options.Int("seed", 11)).Run();

        default:
            Console.Error.WriteLine($"harness: unknown command '{args[0]}'");
            return 2;
    }
}
catch (Exception e) when (e is InvalidOperationException or ArgumentException or IOException or FormatException)
{
    Console.Error.WriteLine("harness: " + e.Message);
    return 1;
}

static string FindRepo()
{
    for (var dir = new DirectoryInfo(Environment.CurrentDirectory); dir is not null; dir = dir.Parent)
    {
        if (File.Exists(Path.Combine(dir.FullName, "BatchReconcile.sln")))
        {
            return dir.FullName;
        }
    }

    throw new InvalidOperationException("run the harness inside the repository (BatchReconcile.sln not found)");
}
