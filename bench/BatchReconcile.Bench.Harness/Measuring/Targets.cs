using System.Globalization;
using System.Text.Json.Nodes;

namespace BatchReconcile.Bench.Harness.Measuring;

/// <summary>The issue's initial targets, judged on the medians of a run (reported, never asserted in CI).</summary>
internal static class Targets
{
    public static JsonArray Evaluate(JsonObject r)
    {
        var list = new JsonArray();
        var quick = r["quick"]?.GetValue<bool>() ?? false;
        void Add(string target, double? measured, string unit, bool? met, string note = "")
        {
            list.Add(new JsonObject
            {
                ["target"] = target,
                ["measured"] = measured is null || double.IsNaN(measured.Value) ? null : Math.Round(measured.Value, 3),
                ["unit"] = unit,
                // A quick run is too small and too short to judge anything by.
                ["met"] = quick ? null : met,
                ["note"] = note,
            });
        }

        var large = r["backlog"]?[1];
        if (large is not null)
        {
            var files = large["files"]!.GetValue<int>().ToString(CultureInfo.InvariantCulture);
            var run = large["run"]!["timesFloor"]!.GetValue<double>();
            var ingest = large["ingest"]!["timesFloor"]!.GetValue<double>();
            Add($"{files}-file backlog, run draining it, <= 4x floor", run, "x floor", run <= 4);
            Add($"{files}-file backlog, ingest FOLDER, <= 4x floor", ingest, "x floor", ingest <= 4);
            var runPeak = Median(large["run"]!["peakResidentMb"]);
            var ingestPeak = Median(large["ingest"]!["peakResidentMb"]);
            Add($"{files}-file backlog peak memory (run) < 250 MB", runPeak, "MB", runPeak < 250);
            Add($"{files}-file backlog peak memory (ingest) < 250 MB", ingestPeak, "MB", ingestPeak < 250);
        }

        if (r["smallFiles"] is { } sf)
        {
            var shape = Inv($"{sf["files"]}-file backlog of {sf["rowsPerFile"]} rows a file");
            var peer = sf["peerOverIngest"]!["ofMedians"]!.GetValue<double>();
            var floor = sf["ingestOverFloor"]!["ofMedians"]!.GetValue<double>();
            var runs = sf["runOverIngest"]!["ofMedians"]!.GetValue<double>();
            string Spread(string key) => Inv($"per round {sf[key]!["perRound"]!["min"]}-{sf[key]!["perRound"]!["max"]}, {sf["rounds"]} round{(sf["rounds"]!.GetValue<int>() == 1 ? "" : "s")}");
            Add($"{shape}: peer script / ingest FOLDER >= 4", peer, "ratio", peer >= 4, Spread("peerOverIngest"));
            Add($"{shape}: ingest FOLDER / sqlite3 floor <= 4", floor, "ratio", floor <= 4, Spread("ingestOverFloor"));
            Add($"{shape}: run draining it / ingest FOLDER <= 1.2", runs, "ratio", runs <= 1.2, Spread("runOverIngest"));
        }

        foreach (var latency in r["latency"]?.AsArray() ?? [])
        {
            if (latency!["settings"]!.GetValue<string>() == "default")
            {
                var p95 = Median(latency["p95Seconds"]);
                Add("steady-state p95 latency, default settings, < 1.5 s", p95, "s", p95 < 1.5,
                    Inv($"settle interval {latency["settleSeconds"]} s, counted from the file's last write: these files were written before they were renamed in"));
            }
        }

        var big = r["bigFileAndHistory"];
        if (big?["bigFile"] is { } bigFile)
        {
            var peak = Median(bigFile["peakResidentMb"]);
            Add(Inv($"peak memory, one {bigFile["megabytes"]} MB file, < 250 MB"), peak, "MB", peak < 250);
        }

        if (big?["smallHistory"] is { } small && big["largeHistory"] is { } largeHistory)
        {
            var sizes = Inv($"{largeHistory["storedBatches"]} vs {small["storedBatches"]} batches");
            foreach (var (key, label) in new[]
            {
                ("digestSeconds", "digest --day"), ("flagsListSeconds", "flags list --day --json"),
                ("trendSeconds", "trend of one step over a year"), ("lossesSeconds", "losses over a year"),
                ("compareSeconds", "compare of two versions over a year"),
            })
            {
                var at = Median(largeHistory[key]);
                var ratio = at / Median(small[key]);
                Add($"{label} at large history < 0.5 s", at, "s", at < 0.5, sizes);
                Add($"{label} large / small history <= 2", ratio, "ratio", ratio <= 2, sizes);
            }
        }

        foreach (var kernel in r["kernels"]?["results"]?.AsArray() ?? [])
        {
            var name = kernel!["benchmark"]!.GetValue<string>();
            var ns = kernel["medianNs"]!.GetValue<double>();
            var allocated = kernel["allocatedBytesPerOp"]?.GetValue<double>();
            if (name.StartsWith("FormulaBenchmarks.TryGetMolarMass", StringComparison.Ordinal))
            {
                Add("formula parse + molar mass >= 2 M/s", 1e9 / ns, "per s", 1e9 / ns >= 2e6);
                Add("formula parse + molar mass allocation-free", allocated, "B/op", allocated == 0);
            }
            else if (name.StartsWith("BalancerBenchmarks.", StringComparison.Ordinal))
            {
                Add($"balancing a 9-species redox < 50 us ({name})", ns / 1000, "us", ns < 50_000);
            }
        }

        return list;
    }

    private static double Median(JsonNode? summary) => summary?["median"]?.GetValue<double>() ?? double.NaN;

    private static string Inv(FormattableString text) => FormattableString.Invariant(text);
}
