using System.Globalization;
using System.Text.Json.Nodes;
using BatchReconcile.Bench.Harness.Generation;

namespace BatchReconcile.Bench.Harness.Measuring;

/// <summary>
/// The small-file backlog of issue 12: one-batch exports of about 10 rows each, handled side by side in one
/// run by the published program (<c>ingest FOLDER</c> and <c>run</c> draining it), the Python peer
/// (bench/peer/reconcile.py) and the sqlite3 floor, the four in a rotating order in every round.
/// </summary>
internal sealed partial class Suite
{
    /// <summary>Rows per step at most (GeneratorOptions.MaxRowsPerStep): 15, 7 and 9 rows for the three recipes, about 10.3 a file.</summary>
    private const int SmallFileMaxRowsPerStep = 7;

    private static readonly string[] Contenders = ["floor", "ingest", "run", "peer"];

    private static string Python => File.Exists("/usr/bin/python3") ? "/usr/bin/python3" : "python3";

    private string PeerScript => Path.Combine(o.Repo, "bench", "peer", "reconcile.py");

    private JsonObject SmallFiles()
    {
        var set = Generate("small-files", new GeneratorOptions
        {
            OutputFolder = Path.Combine(o.Work, "sets", "small-files"),
            Batches = o.SmallFileBacklog,
            Seed = o.Seed + 3,
            FirstIndex = 700_000,
            MaxRowsPerStep = SmallFileMaxRowsPerStep,
        });
        var concatenated = Concatenate(set);
        var rounds = o.Quick ? 1 : Math.Max(3, o.Runs);
        var times = Contenders.ToDictionary(c => c, _ => new List<double>());
        var peaks = Contenders.ToDictionary(c => c, _ => new List<double>());
        for (var i = 0; i < rounds; i++)
        {
            // Rotated every round, so that no contender always runs first (cold caches) or after the same one.
            foreach (var contender in Contenders.Skip(i % Contenders.Length).Concat(Contenders.Take(i % Contenders.Length)))
            {
                var label = Inv($"small-{contender}-{i}");
                var (seconds, peak) = contender switch
                {
                    "floor" => (Floor(concatenated, label), double.NaN),
                    "ingest" => SmallIngest(set, label),
                    "run" => SmallRun(set, label),
                    _ => SmallPeer(set, label),
                };
                times[contender].Add(seconds);
                peaks[contender].Add(peak);
            }

            Log(Inv($"small files {set.Files}: round {i + 1}/{rounds}: floor {times["floor"][^1]:F2} s, ingest {times["ingest"][^1]:F2} s, run {times["run"][^1]:F2} s, peer {times["peer"][^1]:F2} s"));
        }

        var median = Contenders.ToDictionary(c => c, c => Summary.Of(times[c]).Median);
        JsonObject Ratio(string over, string under) => new()
        {
            ["ofMedians"] = Math.Round(median[over] / median[under], 2),
            // The same ratio within each round (the two measured minutes apart at most): its spread shows the noise.
            ["perRound"] = Json(Summary.Of(times[over].Zip(times[under], (a, b) => a / b).ToList())),
        };

        return new JsonObject
        {
            ["files"] = set.Files,
            ["batches"] = set.Batches,
            ["rows"] = set.Rows,
            ["rowsPerFile"] = Math.Round((double)set.Rows / set.Files, 2),
            ["maxRowsPerStep"] = SmallFileMaxRowsPerStep,
            ["megabytes"] = Math.Round(set.Bytes / 1e6, 2),
            ["faults"] = new JsonObject { ["lowYield"] = set.LowYield, ["gap"] = set.Gap, ["malformed"] = set.Malformed },
            ["rounds"] = rounds,
            ["order"] = "floor, ingest, run, peer, rotated by one each round",
            ["peer"] = Inv($"{Path.GetRelativePath(o.Repo, PeerScript)} on {ProcessRun.Capture(Python, "--version").Trim()} ({Python})"),
            ["floorSeconds"] = Json(Summary.Of(times["floor"])),
            ["ingestSeconds"] = Json(Summary.Of(times["ingest"])),
            ["runSeconds"] = Json(Summary.Of(times["run"])),
            ["peerSeconds"] = Json(Summary.Of(times["peer"])),
            ["ingestPeakMb"] = Json(Summary.Of(peaks["ingest"])),
            ["runPeakMb"] = Json(Summary.Of(peaks["run"])),
            ["peerPeakMb"] = Json(Summary.Of(peaks["peer"])),
            ["peerOverIngest"] = Ratio("peer", "ingest"),
            ["ingestOverFloor"] = Ratio("ingest", "floor"),
            ["runOverIngest"] = Ratio("run", "ingest"),
        };
    }

    private (double Seconds, double PeakMb) SmallIngest(GeneratedSet set, string label)
    {
        var data = Fresh(label);
        CopyFiles(set, Path.Combine(data, "incoming"));
        var (seconds, exit, peak) = ProcessRun.Timed(Path.Combine(data, "ingest.out"), Path.Combine(data, "ingest.err"),
            "dotnet", Dll, "--config", Config, "--data", data, "ingest", Path.Combine(data, "incoming"));
        Expect(exit is 0 or 3, Inv($"ingest exited with {exit}; see {data}"));
        Expect(Processed(data) == set.Files, Inv($"ingest left files behind in {data}"));
        Directory.Delete(data, recursive: true);
        return (seconds, peak);
    }

    private (double Seconds, double PeakMb) SmallRun(GeneratedSet set, string label)
    {
        var data = Fresh(label);
        CopyFiles(set, Path.Combine(data, "inbox"));
        var drained = Drain(data, set.Files);
        Directory.Delete(data, recursive: true);
        return drained;
    }

    private (double Seconds, double PeakMb) SmallPeer(GeneratedSet set, string label)
    {
        var data = Fresh(label);
        CopyFiles(set, Path.Combine(data, "incoming"));
        var (seconds, exit, peak) = ProcessRun.Timed(Path.Combine(data, "peer.out"), Path.Combine(data, "peer.err"),
            Python, PeerScript, Path.Combine(data, "incoming"), "--processes", Path.Combine(Config, "processes"), "--data", data);
        Expect(exit is 0 or 3, Inv($"the peer script exited with {exit}; see {data}"));
        Expect(Processed(data) == set.Files, Inv($"the peer script left files behind in {data}"));
        var stored = Convert.ToInt64(Scalar(Path.Combine(data, "peer.db"), "SELECT COUNT(*) FROM file"), CultureInfo.InvariantCulture);
        Expect(stored == set.Files - set.Malformed, Inv($"the peer script stored {stored} files, expected {set.Files - set.Malformed}; see {data}"));
        Directory.Delete(data, recursive: true);
        return (seconds, peak);
    }
}
