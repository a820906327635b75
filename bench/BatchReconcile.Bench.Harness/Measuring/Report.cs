using System.Globalization;
using System.Text;
using System.Text.Json.Nodes;

namespace BatchReconcile.Bench.Harness.Measuring;

/// <summary>Turns a run's results into the Markdown tables of bench/README.md.</summary>
internal static class Report
{
    public const string Begin = "<!-- results:begin (written by bench/run) -->";
    public const string End = "<!-- results:end -->";

    public static string Markdown(JsonObject r)
    {
        var s = new StringBuilder();
        var m = r["machine"]!;
        s.AppendLine(Inv($"Measured {m["dateUtc"]} on commit `{m["commit"]}`{(m["srcDirty"]!.GetValue<bool>() ? " (with uncommitted changes in src/)" : "")}: {m["nproc"]} cores, {m["cpu"]}, {m["ramGb"]} GB RAM, {m["os"]}, .NET {m["dotnet"]}, sqlite3 {m["sqlite3"]}."));
        s.AppendLine();
        s.AppendLine(Inv($"Command: `{r["command"]}`. Program measured: {r["build"]}, run as `dotnet batchreconcile.dll`. Figures are medians [min-max] of the number of runs given; \"x floor\" is the program's time divided by the sqlite3 shell's `.import` of the same rows into one bare table in one transaction."));
        s.AppendLine();
        s.AppendLine("### Backlog (files already in the inbox)");
        s.AppendLine();
        s.AppendLine("| files | rows | MB | runs | floor (sqlite3 .import) | file handling alone | `ingest FOLDER` | files/s | rows/s | x floor | peak RSS | `run` until drained | files/s | rows/s | x floor | peak RSS | DB bytes / batch |");
        s.AppendLine("|---|---|---|---|---|---|---|---|---|---|---|---|---|---|---|---|---|");
        foreach (var b in r["backlog"]!.AsArray())
        {
            var i = b!["ingest"]!;
            var run = b["run"]!;
            s.AppendLine(Inv($"| {b["files"]} | {b["rows"]} | {b["megabytes"]} | {b["floorSeconds"]!["runs"]} | {S(b["floorSeconds"])} s | {S(b["fileHandlingSeconds"], 3)} s | {S(i["wallSeconds"])} s | {i["filesPerSecond"]} | {i["rowsPerSecond"]} | {i["timesFloor"]} | {S(i["peakResidentMb"], 0)} MB | {S(run["wallSeconds"])} s | {run["filesPerSecond"]} | {run["rowsPerSecond"]} | {run["timesFloor"]} | {S(run["peakResidentMb"], 0)} MB | {b["databaseBytesPerStoredBatch"]} |"));
        }

        if (r["smallFiles"] is { } sf)
        {
            s.AppendLine();
            SmallFiles(s, sf);
        }

        s.AppendLine();
        s.AppendLine("### Steady-state latency (rename into the inbox until the file leaves it, which is after its commit)");
        s.AppendLine();
        s.AppendLine("| settings | settle | files/run x runs | rate | p50 | p95 | max | pooled p50 / p95 / max |");
        s.AppendLine("|---|---|---|---|---|---|---|---|");
        foreach (var l in r["latency"]!.AsArray())
        {
            var p = l!["pooled"]!;
            s.AppendLine(Inv($"| {l["settings"]} | {l["settleSeconds"]} s | {l["filesPerRun"]} x {l["p50Seconds"]!["runs"]} | {l["ratePerSecond"]}/s | {S(l["p50Seconds"])} s | {S(l["p95Seconds"])} s | {S(l["maxSeconds"])} s | {p["p50"]} / {p["p95"]} / {p["max"]} s |"));
        }

        var h = r["bigFileAndHistory"]!;
        if (h["bigFile"] is { } big)
        {
            s.AppendLine();
            s.AppendLine("### One big file (`ingest` of one export holding many batches, into the large backlog's store)");
            s.AppendLine();
            s.AppendLine("| MB | batches | rows | exit | floor | ingest | rows/s | x floor | peak RSS |");
            s.AppendLine("|---|---|---|---|---|---|---|---|---|");
            s.AppendLine(Inv($"| {big["megabytes"]} | {big["batches"]} | {big["rows"]} | {big["exitCode"]} | {S(big["floorSeconds"])} s | {S(big["ingestSeconds"])} s | {big["rowsPerSecond"]} | {big["timesFloor"]} | {S(big["peakResidentMb"], 0)} MB |"));
        }

        s.AppendLine();
        s.AppendLine(Inv($"### History scale (day {h["day"]}, {h["batchesOnDay"]} batches that day; each figure is the whole process, start-up included)"));
        s.AppendLine();
        s.AppendLine("| stored batches | batches on the day | `digest --day` | `flags list --day --json` | `flags list` of an empty day | `chem mass H2O` (start-up) |");
        s.AppendLine("|---|---|---|---|---|---|");
        foreach (var key in new[] { "smallHistory", "largeHistory" })
        {
            if (h[key] is { } x)
            {
                s.AppendLine(Inv($"| {x["storedBatches"]} | {x["batchesOnDay"]} | {S(x["digestSeconds"])} s | {S(x["flagsListSeconds"])} s | {S(x["flagsListEmptyDaySeconds"])} s | {S(x["startupChemMassSeconds"])} s |"));
            }
        }

        s.AppendLine();
        s.AppendLine("Across batches (BZC-410, the year up to the last stored day; whole process, start-up included):");
        s.AppendLine();
        s.AppendLine("| stored batches | period | BZC-410 batches in it | `trend --step S1` | `losses` | `compare --versions 1,2` |");
        s.AppendLine("|---|---|---|---|---|---|");
        foreach (var key in new[] { "smallHistory", "largeHistory" })
        {
            if (h[key] is { } x && x["trendSeconds"] is not null)
            {
                s.AppendLine(Inv($"| {x["storedBatches"]} | {x["analysisPeriod"]} | {x["analysisRecipeBatches"]} | {S(x["trendSeconds"])} s | {S(x["lossesSeconds"])} s | {S(x["compareSeconds"])} s |"));
            }
        }

        if (r["kernels"] is { } k)
        {
            s.AppendLine();
            s.AppendLine(Inv($"### Chemistry kernels (BenchmarkDotNet, job {k["job"]})"));
            s.AppendLine();
            s.AppendLine("| benchmark | median | per second | allocated / op |");
            s.AppendLine("|---|---|---|---|");
            foreach (var b in k["results"]!.AsArray())
            {
                s.AppendLine(Inv($"| {b!["benchmark"]} | {b["medianNs"]} ns | {b["perSecond"]} | {b["allocatedBytesPerOp"]} B |"));
            }
        }

        s.AppendLine();
        s.AppendLine("### Targets");
        s.AppendLine();
        s.AppendLine("| target | measured (median) | met |");
        s.AppendLine("|---|---|---|");
        foreach (var t in r["targets"]!.AsArray())
        {
            var met = t!["met"]?.GetValue<bool>() switch { true => "yes", false => "**no**", null => "n/a" };
            var note = t["note"]!.GetValue<string>();
            s.AppendLine(Inv($"| {t["target"]} | {t["measured"]} {t["unit"]}{(note.Length > 0 ? " (" + note + ")" : "")} | {met} |"));
        }

        return s.ToString();
    }

    public const string PeerBegin = "<!-- peer:begin (written by bench/run peer) -->";
    public const string PeerEnd = "<!-- peer:end -->";

    /// <summary>The results of <c>bench/run peer</c>: machine, command, the small-file table and its targets.</summary>
    public static string PeerMarkdown(JsonObject r)
    {
        var s = new StringBuilder();
        var m = r["machine"]!;
        s.AppendLine(Inv($"Measured {m["dateUtc"]} on commit `{m["commit"]}`{(m["srcDirty"]!.GetValue<bool>() ? " (with uncommitted changes in src/)" : "")}: {m["nproc"]} cores, {m["cpu"]}, .NET {m["dotnet"]}, sqlite3 {m["sqlite3"]}; load average {m["loadAverage"]} at the start, {m["loadAverageAtEnd"]} at the end."));
        s.AppendLine();
        s.AppendLine(Inv($"Command: `{r["command"]}`. Program measured: {r["build"]}, run as `dotnet batchreconcile.dll`."));
        s.AppendLine();
        SmallFiles(s, r["smallFiles"]!);
        s.AppendLine();
        s.AppendLine("| target | measured (ratio of medians) | met |");
        s.AppendLine("|---|---|---|");
        foreach (var t in r["targets"]!.AsArray())
        {
            var met = t!["met"]?.GetValue<bool>() switch { true => "yes", false => "**no**", null => "n/a" };
            var note = t["note"]!.GetValue<string>();
            s.AppendLine(Inv($"| {t["target"]} | {t["measured"]}{(note.Length > 0 ? " (" + note + ")" : "")} | {met} |"));
        }

        return s.ToString();
    }

    private static void SmallFiles(StringBuilder s, JsonNode sf)
    {
        s.AppendLine(Inv($"### Small-file backlog against a short script (issue 12): {sf["files"]} one-batch files, {sf["rowsPerFile"]} rows a file"));
        s.AppendLine();
        s.AppendLine(Inv($"Side by side in one run, {sf["rounds"]} round(s), the order ({sf["order"]}). Peer: {sf["peer"]}. Times are wall time from process start, medians [min-max]; ratios are of the medians, with the spread of the same ratio within each round."));
        s.AppendLine();
        s.AppendLine("| files | rows | MB | floor (sqlite3 .import) | `ingest FOLDER` | `run` until drained | peer script | peer / ingest | ingest / floor | run / ingest | peak RSS ingest / run / peer |");
        s.AppendLine("|---|---|---|---|---|---|---|---|---|---|---|");
        string R(string key) => Inv($"{sf[key]!["ofMedians"]} [{sf[key]!["perRound"]!["min"]}-{sf[key]!["perRound"]!["max"]}]");
        s.AppendLine(Inv($"| {sf["files"]} | {sf["rows"]} | {sf["megabytes"]} | {S(sf["floorSeconds"])} s | {S(sf["ingestSeconds"])} s | {S(sf["runSeconds"])} s | {S(sf["peerSeconds"])} s | {R("peerOverIngest")} | {R("ingestOverFloor")} | {R("runOverIngest")} | {Med(sf["ingestPeakMb"])} / {Med(sf["runPeakMb"])} / {Med(sf["peerPeakMb"])} MB |"));
    }

    private static string Med(JsonNode? summary) =>
        summary?["median"]?.GetValue<double>().ToString("F0", CultureInfo.InvariantCulture) ?? "-";

    /// <summary>Replaces the results section of the README (everything else in it is hand-written).</summary>
    public static void WriteInto(string readme, string markdown, string begin = Begin, string end = End) =>
        Replace(readme, markdown, begin, end);

    private static void Replace(string readme, string markdown, string beginMarker, string endMarker)
    {
        var text = File.ReadAllText(readme);
        var begin = text.IndexOf(beginMarker, StringComparison.Ordinal);
        var end = text.IndexOf(endMarker, StringComparison.Ordinal);
        if (begin < 0 || end < begin)
        {
            throw new InvalidOperationException($"{readme} has no results markers");
        }

        File.WriteAllText(readme, text[..(begin + beginMarker.Length)] + "\n\n" + markdown + "\n" + text[end..]);
    }

    private static string S(JsonNode? summary, int decimals = 2)
    {
        if (summary is null)
        {
            return "-";
        }

        string F(string key) => summary[key]!.GetValue<double>().ToString("F" + decimals.ToString(CultureInfo.InvariantCulture), CultureInfo.InvariantCulture);
        return $"{F("median")} [{F("min")}-{F("max")}]";
    }

    private static string Inv(FormattableString text) => FormattableString.Invariant(text);
}
