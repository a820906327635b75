using System.Collections.Concurrent;
using System.Diagnostics;
using System.Globalization;
using System.Runtime.InteropServices;
using System.Text.Json.Nodes;
using System.Text.RegularExpressions;
using BatchReconcile.Bench.Harness.Generation;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Bench.Harness.Measuring;

/// <summary>
/// One harness run: publishes the program as it is deployed, generates the data, measures the published
/// program as a process (each figure the median of several runs on fresh data folders) and the sqlite3
/// floor on the same rows.
/// </summary>
internal sealed partial class Suite(SuiteOptions o)
{
    /// <summary>How long before their use the generated files count as written: well beyond any settle interval.</summary>
    private static readonly TimeSpan GeneratedAge = TimeSpan.FromMinutes(10);

    private readonly JsonObject _results = new();

    // The deployment form (docs/configuration.md): framework-dependent, ReadyToRun for this machine's RID.
    // A plain build would be measured with its start-up spent in the JIT, which a site does not see.
    private static string Rid => RuntimeInformation.RuntimeIdentifier;
    private string App => Path.Combine(o.Work, "app");
    private string Dll => Path.Combine(App, "batchreconcile.dll");
    private string Config => Path.Combine(o.Repo, "config");
    private string Runs => Path.Combine(o.Work, "runs");

    public JsonObject Run(string commandLine)
    {
        if (Directory.Exists(o.Work))
        {
            Directory.Delete(o.Work, recursive: true);
        }

        Directory.CreateDirectory(Runs);
        _results["command"] = commandLine;
        _results["quick"] = o.Quick;
        _results["machine"] = Machine();
        _results["build"] = "publish ReadyToRun " + Rid;
        var total = Stopwatch.StartNew();
        var buildSeconds = Build();
        if (o.SmallFilesOnly)
        {
            _results["smallFiles"] = SmallFiles();
            return Finish(total, buildSeconds);
        }

        var small = Generate("backlog-small", new GeneratorOptions { OutputFolder = Path.Combine(o.Work, "sets", "backlog-small"), Batches = o.SmallBacklog, Seed = o.Seed + 1, FirstIndex = 900_000 });
        var large = Generate("backlog-large", new GeneratorOptions { OutputFolder = Path.Combine(o.Work, "sets", "backlog-large"), Batches = o.LargeBacklog, Seed = o.Seed, BatchesPerDay = o.BatchesPerDay });
        var backlog = new JsonArray { Backlog(small, keep: false, out _), Backlog(large, keep: true, out var largeStore) };
        _results["backlog"] = backlog;
        _results["smallFiles"] = SmallFiles();

        _results["latency"] = new JsonArray { Latency(Config, "default"), Latency(ContrastConfig(), "contrast") };

        _results["bigFileAndHistory"] = BigFileAndHistory(largeStore);

        if (o.Kernels)
        {
            _results["kernels"] = Kernels();
        }

        return Finish(total, buildSeconds);
    }

    private JsonObject Finish(Stopwatch total, double buildSeconds)
    {
        _results["machine"]!["loadAverageAtEnd"] = LoadAverage();
        _results["targets"] = Targets.Evaluate(_results);
        var measureSeconds = total.Elapsed.TotalSeconds - buildSeconds;
        _results["harnessSeconds"] = new JsonObject { ["buildAndPublish"] = Math.Round(buildSeconds, 1), ["measuring"] = Math.Round(measureSeconds, 1) };
        Log(Inv($"done: build and publish {buildSeconds:F1} s, measuring {measureSeconds:F1} s"));
        return _results;
    }

    /// <summary>The 1, 5 and 15 minute load averages, as <c>uptime</c> prints them.</summary>
    private static string LoadAverage() => string.Join(", ", File.ReadAllText("/proc/loadavg").Split(' ')[..3]);

    private JsonObject Machine()
    {
        var cpu = File.ReadLines("/proc/cpuinfo").FirstOrDefault(l => l.StartsWith("model name", StringComparison.Ordinal))?.Split(':', 2)[1].Trim() ?? "unknown";
        var memKb = File.ReadLines("/proc/meminfo").First(l => l.StartsWith("MemTotal:", StringComparison.Ordinal)).Split(' ', StringSplitOptions.RemoveEmptyEntries)[1];
        var commit = ProcessRun.Capture("git", "-C", o.Repo, "rev-parse", "HEAD").Trim();
        var dirty = ProcessRun.Capture("git", "-C", o.Repo, "status", "--porcelain", "--", "src", "config").Trim().Length > 0;
        return new JsonObject
        {
            ["nproc"] = Environment.ProcessorCount,
            ["cpu"] = cpu,
            ["ramGb"] = Math.Round(double.Parse(memKb, CultureInfo.InvariantCulture) / 1024 / 1024, 1),
            ["os"] = RuntimeInformation.OSDescription,
            ["dotnet"] = Environment.Version.ToString(),
            ["sqlite3"] = ProcessRun.Capture("sqlite3", "--version").Split(' ')[0],
            ["dateUtc"] = DateTimeOffset.UtcNow.ToString("yyyy-MM-dd'T'HH:mm'Z'", CultureInfo.InvariantCulture),
            ["commit"] = commit,
            ["srcDirty"] = dirty,
            // Other work on the machine while measuring (2 shared cores): the load averages at the start.
            ["loadAverage"] = LoadAverage(),
        };
    }

    /// <summary>Publishes the program into <see cref="App"/> and builds the kernel benchmarks; returns the seconds spent.</summary>
    private double Build()
    {
        Log($"publishing the program (Release, ReadyToRun, {Rid}, framework-dependent) into {App}");
        var (seconds, exit, _) = ProcessRun.Timed(Path.Combine(o.Work, "publish.out"), Path.Combine(o.Work, "publish.err"),
            "dotnet", "publish", Path.Combine(o.Repo, "src", "BatchReconcile", "BatchReconcile.csproj"), "-c", "Release",
            "-r", Rid, "--self-contained", "false", "-p:PublishReadyToRun=true", "-o", App, "-nologo", "-v", "q");
        Expect(exit == 0 && File.Exists(Dll), "the program did not publish; see " + Path.Combine(o.Work, "publish.out"));
        Log(Inv($"published in {seconds:F1} s"));
        if (o.Kernels && !o.SmallFilesOnly)
        {
            // Built here so that the kernels' time below is measuring only.
            double built;
            (built, exit, _) = ProcessRun.Timed(Path.Combine(o.Work, "bdn-build.out"), Path.Combine(o.Work, "bdn-build.err"),
                "dotnet", "build", Path.Combine(o.Repo, "bench", "BatchReconcile.Benchmarks"), "-c", "Release", "-nologo", "-v", "q");
            Expect(exit == 0, "the benchmarks did not build; see " + Path.Combine(o.Work, "bdn-build.out"));
            Log(Inv($"benchmarks built in {built:F1} s"));
            seconds += built;
        }

        return seconds;
    }

    private GeneratedSet Generate(string label, GeneratorOptions options)
    {
        var stopwatch = Stopwatch.StartNew();
        var set = new BatchGenerator(options, Path.Combine(o.Repo, "sample-data", "inbox")).Write();

        // A backlog is made of files written before the program sees them. The sets are generated just
        // before they are used, so they are dated back once here; the copies keep that time (CopyFiles).
        // Otherwise the intake's settle interval, counted from a file's last write, would make the program
        // wait for files "still being written", a wait that is not ingestion work.
        var written = DateTime.UtcNow - GeneratedAge;
        foreach (var name in set.FileNames)
        {
            File.SetLastWriteTimeUtc(Path.Combine(set.Folder, name), written);
        }

        Log(Inv($"{label}: {set.Files} files, {set.Batches} batches, {set.Rows} rows, {set.Bytes / 1e6:F1} MB in {stopwatch.Elapsed.TotalSeconds:F1} s"));
        return set;
    }

    private JsonObject Backlog(GeneratedSet set, bool keep, out string lastRunStore)
    {
        var concatenated = Concatenate(set);
        var floor = new List<double>();
        var handling = new List<double>();
        var ingest = new List<double>();
        var ingestPeak = new List<double>();
        var run = new List<double>();
        var runPeak = new List<double>();
        lastRunStore = string.Empty;
        double bytesPerBatch = double.NaN;
        long storedBatches = 0;
        for (var i = 0; i < o.Runs; i++)
        {
            floor.Add(Floor(concatenated, Inv($"floor-{set.Files}-{i}")));
            handling.Add(FileHandling(set, Inv($"files-{set.Files}-{i}")));

            var data = Fresh(Inv($"ingest-{set.Files}-{i}"));
            CopyFiles(set, Path.Combine(data, "incoming"));
            var (seconds, exit, peak) = ProcessRun.Timed(Path.Combine(data, "ingest.out"), Path.Combine(data, "ingest.err"),
                "dotnet", Dll, "--config", Config, "--data", data, "ingest", Path.Combine(data, "incoming"));
            Expect(exit is 0 or 3, Inv($"ingest exited with {exit}; see {data}"));
            Expect(Processed(data) == set.Files, Inv($"ingest left files behind in {data}"));
            ingest.Add(seconds);
            ingestPeak.Add(peak);
            Directory.Delete(data, recursive: true);

            data = Fresh(Inv($"run-{set.Files}-{i}"));
            CopyFiles(set, Path.Combine(data, "inbox"));
            var drained = Drain(data, set.Files);
            run.Add(drained.Seconds);
            runPeak.Add(drained.PeakMb);
            (bytesPerBatch, storedBatches) = DatabaseSize(data);
            if (keep && i == o.Runs - 1)
            {
                lastRunStore = data;
            }
            else
            {
                Directory.Delete(data, recursive: true);
            }

            Log(Inv($"backlog {set.Files}: run {i + 1}/{o.Runs}: floor {floor[^1]:F2} s, file handling {handling[^1]:F2} s, ingest {ingest[^1]:F2} s ({ingestPeak[^1]:F0} MB), run {run[^1]:F2} s ({runPeak[^1]:F0} MB)"));
        }

        var floorS = Summary.Of(floor);
        var ingestS = Summary.Of(ingest);
        var runS = Summary.Of(run);
        return new JsonObject
        {
            ["files"] = set.Files,
            ["batches"] = set.Batches,
            ["rows"] = set.Rows,
            ["megabytes"] = Math.Round(set.Bytes / 1e6, 2),
            ["faults"] = new JsonObject { ["lowYield"] = set.LowYield, ["gap"] = set.Gap, ["malformed"] = set.Malformed },
            ["floorSeconds"] = Json(floorS),
            ["floorRowsPerSecond"] = Math.Round(set.Rows / floorS.Median),
            ["fileHandlingSeconds"] = Json(Summary.Of(handling)),
            ["ingest"] = Throughput(set, ingestS, floorS, Summary.Of(ingestPeak)),
            ["run"] = Throughput(set, runS, floorS, Summary.Of(runPeak)),
            ["databaseBytesPerStoredBatch"] = Math.Round(bytesPerBatch),
            ["storedBatches"] = storedBatches,
        };
    }

    private static JsonObject Throughput(GeneratedSet set, Summary wall, Summary floor, Summary peak) => new()
    {
        ["wallSeconds"] = Json(wall),
        ["filesPerSecond"] = Math.Round(set.Files / wall.Median, 1),
        ["rowsPerSecond"] = Math.Round(set.Rows / wall.Median),
        ["timesFloor"] = Math.Round(wall.Median / floor.Median, 2),
        ["peakResidentMb"] = Json(peak),
    };

    /// <summary>Starts <c>run</c> on an inbox holding the whole set and times it until every file is archived or quarantined.</summary>
    private (double Seconds, double PeakMb) Drain(string data, int files)
    {
        var stopwatch = Stopwatch.StartNew();
        using var process = ProcessRun.Start(Path.Combine(data, "run.out"), Path.Combine(data, "run.err"),
            "dotnet", Dll, "--config", Config, "--data", data, "run");
        var inbox = Path.Combine(data, "inbox");
        var limit = TimeSpan.FromMinutes(30);
        while (true)
        {
            Thread.Sleep(50);
            Expect(!process.HasExited, "run stopped by itself; see " + data);
            Expect(stopwatch.Elapsed < limit, "run did not drain the inbox in 30 minutes: " + data);
            if (!Directory.EnumerateFileSystemEntries(inbox).Any() && Processed(data) == files)
            {
                break;
            }
        }

        var seconds = stopwatch.Elapsed.TotalSeconds;
        var peak = ProcessRun.PeakResidentMb(process.Id);
        var exit = ProcessRun.Terminate(process, TimeSpan.FromSeconds(30));
        Expect(exit == 0, Inv($"run exited with {exit} after SIGTERM; see {data}"));
        return (seconds, peak);
    }

    /// <summary>Files moved out of the inbox: archived, or quarantined (their reports are not counted).</summary>
    private static int Processed(string data)
    {
        int Count(string folder, bool reports) => Directory.Exists(folder)
            ? Directory.EnumerateFiles(folder, "*", SearchOption.AllDirectories).Count(f => reports || !f.EndsWith(".report.txt", StringComparison.Ordinal))
            : 0;
        return Count(Path.Combine(data, "archive"), true) + Count(Path.Combine(data, "quarantine"), false);
    }

    private static (double BytesPerBatch, long Batches) DatabaseSize(string data)
    {
        var db = Path.Combine(data, "batchreconcile.db");
        long bytes = 0;
        foreach (var part in new[] { db, db + "-wal" })
        {
            bytes += File.Exists(part) ? new FileInfo(part).Length : 0;
        }

        var batches = (long)Scalar(db, "SELECT COUNT(*) FROM batch_revision");
        return (batches == 0 ? double.NaN : (double)bytes / batches, batches);
    }

    private static object Scalar(string db, string sql)
    {
        using var connection = new SqliteConnection(new SqliteConnectionStringBuilder { DataSource = db, Mode = SqliteOpenMode.ReadOnly, Pooling = false }.ToString());
        connection.Open();
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        return command.ExecuteScalar() ?? 0L;
    }

    /// <summary>The set's rows in one CSV with one header: what the floor imports.</summary>
    private string Concatenate(GeneratedSet set)
    {
        var path = set.Folder + ".all.csv";
        using var writer = new StreamWriter(path) { NewLine = "\n" };
        writer.WriteLine(ExportRow.Header);
        foreach (var name in set.FileNames)
        {
            foreach (var line in File.ReadLines(Path.Combine(set.Folder, name)).Skip(1))
            {
                writer.WriteLine(line);
            }
        }

        return path;
    }

    /// <summary>
    /// File handling alone, in this process: list the folder, then for each file open it, read it to the end
    /// and rename it into another folder on the same file system. A lower bound for the per-file work of the
    /// program that is not database work (it also hashes, parses and validates, and syncs).
    /// </summary>
    private double FileHandling(GeneratedSet set, string label)
    {
        var folder = Fresh(label);
        var from = Path.Combine(folder, "incoming");
        var to = Path.Combine(folder, "done");
        CopyFiles(set, from);
        Directory.CreateDirectory(to);
        var buffer = new byte[64 * 1024];
        var moved = 0;
        var stopwatch = Stopwatch.StartNew();
        foreach (var file in Directory.EnumerateFiles(from).ToList())
        {
            using (var stream = new FileStream(file, FileMode.Open, FileAccess.Read, FileShare.Read, bufferSize: 1))
            {
                while (stream.Read(buffer, 0, buffer.Length) > 0)
                {
                }
            }

            File.Move(file, Path.Combine(to, Path.GetFileName(file)));
            moved++;
        }

        var seconds = stopwatch.Elapsed.TotalSeconds;
        Expect(moved == set.Files, Inv($"file handling moved {moved} of {set.Files} files; see {folder}"));
        Directory.Delete(folder, recursive: true);
        return seconds;
    }

    /// <summary>The floor: the sqlite3 shell imports the rows into one bare table, in one transaction, WAL and synchronous FULL as the program.</summary>
    private double Floor(string csv, string label)
    {
        var folder = Fresh(label);
        var script = Path.Combine(folder, "import.sql");
        File.WriteAllText(script, $"PRAGMA journal_mode=WAL;\nPRAGMA synchronous=FULL;\nBEGIN;\n.import --csv '{csv}' export_row\nCOMMIT;\n");
        var (seconds, exit, _) = ProcessRun.Timed(Path.Combine(folder, "out"), Path.Combine(folder, "err"),
            "sqlite3", Path.Combine(folder, "floor.db"), ".read '" + script + "'");
        Expect(exit == 0, "sqlite3 import failed; see " + folder);
        Directory.Delete(folder, recursive: true);
        return seconds;
    }

    /// <summary>Steady state: files renamed into the inbox one at a time while <c>run</c> is up; time until each leaves the inbox (after its commit).</summary>
    private JsonObject Latency(string config, string label)
    {
        var settle = SettleSeconds(config);
        var set = Generate("latency", new GeneratorOptions { OutputFolder = Path.Combine(o.Work, "sets", "latency-" + label), Batches = o.LatencyFiles * o.Runs, Seed = o.Seed + 7, FirstIndex = 800_000 });
        var p50 = new List<double>();
        var p95 = new List<double>();
        var max = new List<double>();
        var all = new List<double>();
        for (var run = 0; run < o.Runs; run++)
        {
            var data = Fresh(Inv($"latency-{label}-{run}"));
            var stage = Path.Combine(data, "stage");
            var names = set.FileNames.Skip(run * o.LatencyFiles).Take(o.LatencyFiles).ToList();
            Directory.CreateDirectory(stage);
            foreach (var name in names)
            {
                CopyFile(Path.Combine(set.Folder, name), Path.Combine(stage, name));
            }

            var err = Path.Combine(data, "run.err");
            using var process = ProcessRun.Start(Path.Combine(data, "run.out"), err, "dotnet", Dll, "--config", config, "--data", data, "run");
            var waited = Stopwatch.StartNew();
            while (!(File.Exists(err) && File.ReadAllText(err).Contains("Watching", StringComparison.Ordinal)))
            {
                Expect(!process.HasExited && waited.Elapsed < TimeSpan.FromSeconds(60), "run did not start watching; see " + data);
                Thread.Sleep(20);
            }

            var inbox = Path.Combine(data, "inbox");
            var pending = new ConcurrentDictionary<string, long>();
            var latencies = new ConcurrentBag<double>();
            var done = false;
            var monitor = new Thread(() =>
            {
                while (!Volatile.Read(ref done) || !pending.IsEmpty)
                {
                    foreach (var (name, at) in pending)
                    {
                        if (!File.Exists(Path.Combine(inbox, name)) && pending.TryRemove(name, out _))
                        {
                            latencies.Add(Stopwatch.GetElapsedTime(at).TotalSeconds);
                        }
                    }

                    Thread.Sleep(2);
                }
            });
            monitor.Start();
            var start = Stopwatch.GetTimestamp();
            for (var k = 0; k < names.Count; k++)
            {
                var due = TimeSpan.FromSeconds(k / o.LatencyRatePerSecond) - Stopwatch.GetElapsedTime(start);
                if (due > TimeSpan.Zero)
                {
                    Thread.Sleep(due);
                }

                // The time is taken before the move and the file registered after it: registered before, the
                // monitor could count it as gone before it arrived; registered twice, it could count it twice.
                var renamedAt = Stopwatch.GetTimestamp();
                File.Move(Path.Combine(stage, names[k]), Path.Combine(inbox, names[k]));
                pending[names[k]] = renamedAt;
            }

            var limit = Stopwatch.StartNew();
            while (!pending.IsEmpty && limit.Elapsed < TimeSpan.FromSeconds(120))
            {
                Thread.Sleep(20);
            }

            Expect(pending.IsEmpty, "files stayed in the inbox for 2 minutes; see " + data);
            Volatile.Write(ref done, true);
            monitor.Join();
            ProcessRun.Terminate(process, TimeSpan.FromSeconds(30));
            var values = latencies.ToList();
            all.AddRange(values);
            p50.Add(Summary.Percentile(values, 50));
            p95.Add(Summary.Percentile(values, 95));
            max.Add(values.Max());
            Log(Inv($"latency {label} (settle {settle} s): run {run + 1}/{o.Runs}: p50 {p50[^1]:F3} s, p95 {p95[^1]:F3} s, max {max[^1]:F3} s"));
            Directory.Delete(data, recursive: true);
        }

        return new JsonObject
        {
            ["settings"] = label,
            ["settleSeconds"] = settle,
            ["filesPerRun"] = o.LatencyFiles,
            ["ratePerSecond"] = o.LatencyRatePerSecond,
            ["p50Seconds"] = Json(Summary.Of(p50)),
            ["p95Seconds"] = Json(Summary.Of(p95)),
            ["maxSeconds"] = Json(Summary.Of(max)),
            ["pooled"] = new JsonObject
            {
                ["samples"] = all.Count,
                ["p50"] = Math.Round(Summary.Percentile(all, 50), 3),
                ["p95"] = Math.Round(Summary.Percentile(all, 95), 3),
                ["max"] = Math.Round(all.Max(), 3),
            },
        };
    }

    private static double SettleSeconds(string config)
    {
        var json = JsonNode.Parse(File.ReadAllText(Path.Combine(config, "appsettings.json")))!;
        return json["Intake"]?["SettleSeconds"]?.GetValue<double>() ?? double.NaN;
    }

    /// <summary>A copy of the site's settings with only the settle interval changed.</summary>
    private string ContrastConfig()
    {
        var folder = Path.Combine(o.Work, "config-contrast");
        CopyTree(Config, folder);
        var settings = Path.Combine(folder, "appsettings.json");
        var text = SettleSetting().Replace(File.ReadAllText(settings), Inv($"\"SettleSeconds\": {o.ContrastSettleSeconds}"), 1);
        File.WriteAllText(settings, text);
        return folder;
    }

    [GeneratedRegex("\"SettleSeconds\"\\s*:\\s*[0-9.]+")]
    private static partial Regex SettleSetting();

    /// <summary>
    /// The large backlog's store gets one big export file of many batches (later days): its ingest is the
    /// big-file case (time, peak memory) and leaves the large history store. The day measured lies in the
    /// part both stores share, so the two stores answer for the same day with the same data.
    /// </summary>
    private JsonObject BigFileAndHistory(string smallHistory)
    {
        var day = new GeneratorOptions { OutputFolder = "-" }.FirstDay.AddDays(o.LargeBacklog / o.BatchesPerDay / 2);
        var emptyDay = day.AddYears(30);
        var result = new JsonObject
        {
            ["day"] = day.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture),
            ["batchesOnDay"] = o.BatchesPerDay,
        };
        result["smallHistory"] = History(smallHistory, day, emptyDay);

        var big = Generate("big file", new GeneratorOptions
        {
            OutputFolder = Path.Combine(o.Work, "sets", "big"),
            Batches = o.BigFileBatches,
            BatchesPerFile = o.BigFileBatches,
            FirstIndex = o.LargeBacklog,
            Seed = o.Seed,
            BatchesPerDay = o.BatchesPerDay,
        });
        var file = Path.Combine(big.Folder, big.FileNames[0]);
        var walls = new List<double>();
        var peaks = new List<double>();
        var floors = new List<double>();
        string? largeHistory = null;
        int exit = 0;
        for (var i = 0; i < o.BigFileRuns; i++)
        {
            floors.Add(Floor(file, Inv($"floor-big-{i}")));
            var data = Fresh(Inv($"big-{i}"));
            foreach (var part in Directory.EnumerateFiles(smallHistory, "batchreconcile.db*"))
            {
                File.Copy(part, Path.Combine(data, Path.GetFileName(part)));
            }

            Directory.CreateDirectory(Path.Combine(data, "incoming"));
            CopyFile(file, Path.Combine(data, "incoming", Path.GetFileName(file)));
            double seconds, peak;
            (seconds, exit, peak) = ProcessRun.Timed(Path.Combine(data, "ingest.out"), Path.Combine(data, "ingest.err"),
                "dotnet", Dll, "--config", Config, "--data", data, "ingest", Path.Combine(data, "incoming"));
            walls.Add(seconds);
            peaks.Add(peak);
            Log(Inv($"big file {big.Bytes / 1e6:F0} MB: run {i + 1}/{o.BigFileRuns}: floor {floors[^1]:F2} s, ingest {seconds:F1} s, exit {exit}, peak {peak:F0} MB"));
            if (exit != 0)
            {
                break;
            }

            if (largeHistory is not null)
            {
                Directory.Delete(largeHistory, recursive: true);
            }

            largeHistory = data;
        }

        var floor = Summary.Of(floors);
        var wall = Summary.Of(walls);
        result["bigFile"] = new JsonObject
        {
            ["megabytes"] = Math.Round(big.Bytes / 1e6, 1),
            ["batches"] = big.Batches,
            ["rows"] = big.Rows,
            ["exitCode"] = exit,
            ["floorSeconds"] = Json(floor),
            ["ingestSeconds"] = Json(wall),
            ["rowsPerSecond"] = Math.Round(big.Rows / wall.Median),
            ["timesFloor"] = Math.Round(wall.Median / floor.Median, 2),
            ["peakResidentMb"] = Json(Summary.Of(peaks)),
        };
        if (largeHistory is not null)
        {
            result["largeHistory"] = History(largeHistory, day, emptyDay);
        }

        return result;
    }

    /// <summary>The two-step demo recipe with two versions; the generator alternates its batches between them.</summary>
    private const string AnalysisRecipe = "BZC-410";

    private JsonObject History(string data, DateOnly day, DateOnly emptyDay)
    {
        var batches = (long)Scalar(Path.Combine(data, "batchreconcile.db"), "SELECT COUNT(*) FROM batch_revision WHERE superseded_at IS NULL");
        var dayText = day.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture);
        var onDay = (long)Scalar(Path.Combine(data, "batchreconcile.db"), $"SELECT COUNT(*) FROM batch_revision WHERE production_day = '{dayText}'");
        JsonObject Time(string label, params string[] args)
        {
            var values = new List<double>();
            for (var i = 0; i < o.Runs; i++)
            {
                var (seconds, exit, _) = ProcessRun.Timed(Path.Combine(data, label + ".out"), Path.Combine(data, label + ".err"),
                    ["dotnet", Dll, "--config", Config, "--data", data, .. args]);
                Expect(exit == 0, Inv($"{label} exited with {exit}; see {data}"));
                values.Add(seconds);
            }

            return Json(Summary.Of(values));
        }

        var result = new JsonObject
        {
            ["storedBatches"] = batches,
            ["batchesOnDay"] = onDay,
            ["digestSeconds"] = Time("digest", "digest", "--day", dayText, "--by", "bench", "--json"),
            ["flagsListSeconds"] = Time("flags", "flags", "list", "--day", dayText, "--json"),
            ["flagsListEmptyDaySeconds"] = Time("flags-empty", "flags", "list", "--day", emptyDay.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture), "--json"),
            ["startupChemMassSeconds"] = Time("chem", "chem", "mass", "H2O", "--json"),
        };

        // Across batches (issue 11): a year of production up to the last stored day, or all of it when shorter.
        var db = Path.Combine(data, "batchreconcile.db");
        var last = DateOnly.ParseExact((string)Scalar(db, "SELECT max(production_day) FROM batch_revision WHERE superseded_at IS NULL"), "yyyy-MM-dd", CultureInfo.InvariantCulture);
        var from = last.AddDays(-364).ToString("yyyy-MM-dd", CultureInfo.InvariantCulture);
        var to = last.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture);
        result["analysisPeriod"] = from + " to " + to;
        result["analysisRecipeBatches"] = (long)Scalar(db, Inv($"SELECT COUNT(*) FROM batch_revision WHERE superseded_at IS NULL AND recipe = '{AnalysisRecipe}' AND production_day BETWEEN '{from}' AND '{to}'"));
        result["trendSeconds"] = Time("trend", "trend", "--recipe", AnalysisRecipe, "--step", "S1", "--from", from, "--to", to, "--json");
        result["lossesSeconds"] = Time("losses", "losses", "--recipe", AnalysisRecipe, "--from", from, "--to", to, "--json");
        result["compareSeconds"] = Time("compare", "compare", "--recipe", AnalysisRecipe, "--versions", "1,2", "--from", from, "--to", to, "--json");
        Log(Inv($"history {batches} batches, {result["analysisRecipeBatches"]} of {AnalysisRecipe} in {from}..{to}: trend {result["trendSeconds"]!["median"]} s, losses {result["lossesSeconds"]!["median"]} s, compare {result["compareSeconds"]!["median"]} s"));
        Log(Inv($"history {batches} batches ({onDay} on {dayText}): digest {result["digestSeconds"]!["median"]} s, flags list {result["flagsListSeconds"]!["median"]} s, empty day {result["flagsListEmptyDaySeconds"]!["median"]} s"));
        return result;
    }

    private JsonObject Kernels()
    {
        Log("chemistry kernels (BenchmarkDotNet)");
        var artifacts = Path.Combine(o.Work, "bdn");
        string[] job = o.Quick ? ["--job", "dry", "--inProcess"] : ["--job", "short"];
        var (seconds, exit, _) = ProcessRun.Timed(Path.Combine(o.Work, "bdn.out"), Path.Combine(o.Work, "bdn.err"),
            ["dotnet", "run", "-c", "Release", "--no-build", "--project", Path.Combine(o.Repo, "bench", "BatchReconcile.Benchmarks"), "--",
             "--filter", "*", .. job, "--exporters", "json", "--artifacts", artifacts]);
        Expect(exit == 0, "the benchmarks failed; see " + Path.Combine(o.Work, "bdn.out"));
        var list = new JsonArray();
        foreach (var report in Directory.EnumerateFiles(Path.Combine(artifacts, "results"), "*.json"))
        {
            var json = JsonNode.Parse(File.ReadAllText(report))!;
            foreach (var b in json["Benchmarks"]!.AsArray())
            {
                var median = b!["Statistics"]?["Median"]?.GetValue<double>() ?? double.NaN;
                list.Add(new JsonObject
                {
                    ["benchmark"] = b["Type"]!.GetValue<string>() + "." + b["Method"]!.GetValue<string>()
                        + (b["Parameters"]?.GetValue<string>() is { Length: > 0 } p ? " (" + p.Replace("&", ", ", StringComparison.Ordinal) + ")" : string.Empty),
                    ["medianNs"] = Math.Round(median, 1),
                    ["perSecond"] = Math.Round(1e9 / median),
                    ["allocatedBytesPerOp"] = b["Memory"]?["BytesAllocatedPerOperation"]?.GetValue<double>(),
                });
            }
        }

        Log(Inv($"kernels done in {seconds:F0} s"));
        return new JsonObject { ["job"] = o.Quick ? "dry (smoke only, not a measurement)" : "short", ["results"] = list };
    }

    private string Fresh(string name)
    {
        var path = Path.Combine(Runs, name);
        if (Directory.Exists(path))
        {
            Directory.Delete(path, recursive: true);
        }

        Directory.CreateDirectory(path);
        return path;
    }

    private static void CopyFiles(GeneratedSet set, string to)
    {
        Directory.CreateDirectory(to);
        foreach (var name in set.FileNames)
        {
            CopyFile(Path.Combine(set.Folder, name), Path.Combine(to, name));
        }
    }

    /// <summary>Copies a generated file keeping its last-write time, as a transfer of a backlog would.</summary>
    private static void CopyFile(string from, string to)
    {
        File.Copy(from, to);
        File.SetLastWriteTimeUtc(to, File.GetLastWriteTimeUtc(from));
    }

    private static void CopyTree(string from, string to)
    {
        foreach (var dir in Directory.EnumerateDirectories(from, "*", SearchOption.AllDirectories).Prepend(from))
        {
            Directory.CreateDirectory(Path.Combine(to, Path.GetRelativePath(from, dir)));
        }

        foreach (var file in Directory.EnumerateFiles(from, "*", SearchOption.AllDirectories))
        {
            File.Copy(file, Path.Combine(to, Path.GetRelativePath(from, file)), overwrite: true);
        }
    }

    private static JsonObject Json(Summary s) => new()
    {
        ["median"] = Math.Round(s.Median, 3),
        ["min"] = Math.Round(s.Min, 3),
        ["max"] = Math.Round(s.Max, 3),
        ["runs"] = s.Runs,
    };

    private static void Expect(bool condition, string message)
    {
        if (!condition)
        {
            throw new InvalidOperationException(message);
        }
    }

    private static string Inv(FormattableString text) => FormattableString.Invariant(text);

    private static void Log(string message) =>
        Console.Error.WriteLine($"[{DateTime.Now.ToString("HH:mm:ss", CultureInfo.InvariantCulture)}] {message}");
}
