using System.Diagnostics;
using System.Globalization;
using System.Runtime.InteropServices;
using System.Text.Json.Nodes;
using BatchReconcile.Bench.Harness.Generation;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Bench.Harness.Measuring;

/// <summary>
/// The kill -9 soak (<c>bench/run soak</c>; not in CI): the published program runs <c>run</c> over a backlog and is
/// killed with SIGKILL at random moments, again and again; then it runs to the end and the store is checked: every
/// generated batch stored exactly once (one revision), every file archived once, nothing left in the inbox, and
/// <c>audit verify</c> passing.
/// </summary>
internal sealed class KillSoak(string repo, string work, int kills, int filesPerRound, int seed)
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    public int Run()
    {
        var root = Path.Combine(work, "soak");
        if (Directory.Exists(root))
        {
            Directory.Delete(root, recursive: true);
        }

        Directory.CreateDirectory(root);
        var app = Path.Combine(root, "app");
        Log($"publishing the program (Release, ReadyToRun) into {app}");
        var (_, exit, _) = ProcessRun.Timed(Path.Combine(root, "publish.out"), Path.Combine(root, "publish.err"),
            "dotnet", "publish", Path.Combine(repo, "src", "BatchReconcile", "BatchReconcile.csproj"), "-c", "Release",
            "-r", RuntimeInformation.RuntimeIdentifier, "--self-contained", "false", "-p:PublishReadyToRun=true", "-o", app, "-nologo", "-v", "q");
        if (exit != 0)
        {
            throw new InvalidOperationException("the program did not publish; see " + Path.Combine(root, "publish.out"));
        }

        var dll = Path.Combine(app, "batchreconcile.dll");
        var stage = Path.Combine(root, "stage");
        var total = kills * filesPerRound;
        var set = new BatchGenerator(new GeneratorOptions { OutputFolder = stage, Batches = total, Seed = seed, FaultShare = 0 }, Path.Combine(repo, "sample-data", "inbox")).Write();
        var staged = Directory.GetFiles(stage).Order(StringComparer.Ordinal).ToList();
        var expected = staged.SelectMany(BatchIds).ToHashSet(StringComparer.Ordinal);
        Log(Inv, $"{set.Files} files, {expected.Count} batches staged; {kills} kills, {filesPerRound} files handed in per round");

        var config = Config(root);
        var data = Path.Combine(root, "data");
        var inbox = Path.Combine(data, "inbox");
        Directory.CreateDirectory(inbox);
        var random = new Random(seed);
        var next = 0;
        var midBacklog = 0;
        for (var k = 1; k <= kills; k++)
        {
            foreach (var file in staged.Skip(next).Take(filesPerRound))
            {
                File.Move(file, Path.Combine(inbox, Path.GetFileName(file)));
            }

            next += filesPerRound;
            using var service = ProcessRun.Start(Path.Combine(root, "run.out"), Path.Combine(root, $"run.err"), "dotnet", dll, "run", "--config", config, "--data", data);
            Thread.Sleep(TimeSpan.FromMilliseconds(random.Next(300, 2500)));
            // Counted before the kill: a kill with files still waiting can land inside a group commit or a move.
            if (Directory.EnumerateFiles(inbox).Any(f => !Path.GetFileName(f).StartsWith('.')))
            {
                midBacklog++;
            }

            service.Kill();
            service.WaitForExit();
            if (k % 10 == 0)
            {
                Log(Inv, $"{k} kills, {Directory.GetFiles(inbox).Length} files waiting");
            }
        }

        foreach (var file in staged.Skip(next))
        {
            File.Move(file, Path.Combine(inbox, Path.GetFileName(file)));
        }

        // The last run goes to the end: until the inbox is empty, then stopped as systemd would.
        using (var last = ProcessRun.Start(Path.Combine(root, "run.out"), Path.Combine(root, "run-last.err"), "dotnet", dll, "run", "--config", config, "--data", data))
        {
            var until = Stopwatch.StartNew();
            while (Directory.EnumerateFiles(inbox).Any(f => !Path.GetFileName(f).StartsWith('.')) && until.Elapsed < TimeSpan.FromMinutes(10))
            {
                Thread.Sleep(500);
            }

            Thread.Sleep(1000);
            ProcessRun.Terminate(last, TimeSpan.FromSeconds(60));
        }

        var verify = ProcessRun.Start(Path.Combine(root, "verify.out"), Path.Combine(root, "verify.err"), "dotnet", dll, "audit", "verify", "--config", config, "--data", data);
        verify.WaitForExit();
        var auditIntact = verify.ExitCode == 0;

        using var connection = new SqliteConnection(new SqliteConnectionStringBuilder { DataSource = Path.Combine(data, "batchreconcile.db"), Mode = SqliteOpenMode.ReadOnly }.ToString());
        connection.Open();
        var stored = Strings(connection, "SELECT batch_id FROM batch").ToHashSet(StringComparer.Ordinal);
        var lost = expected.Count(b => !stored.Contains(b));
        var extra = stored.Count(b => !expected.Contains(b));
        var twice = Long(connection, "SELECT count(*) FROM (SELECT batch_ref FROM batch_revision GROUP BY batch_ref HAVING count(*) > 1)");
        var filesTakenTwice = Long(connection, "SELECT count(*) FROM (SELECT sha256 FROM ingest_log WHERE outcome <> 'duplicate' GROUP BY sha256 HAVING count(*) > 1)");
        var archived = Directory.Exists(Path.Combine(data, "archive")) ? Directory.GetFiles(Path.Combine(data, "archive"), "*", SearchOption.AllDirectories).Length : 0;
        var quarantined = Directory.Exists(Path.Combine(data, "quarantine")) ? Directory.GetFiles(Path.Combine(data, "quarantine")).Length : 0;
        var waiting = Directory.EnumerateFiles(inbox).Count(f => !Path.GetFileName(f).StartsWith('.'));
        var duplicated = twice + filesTakenTwice + Math.Max(0, archived - set.Files);
        var summary = string.Create(Inv,
            $"kills {kills}, batches {stored.Count - extra} stored once, {lost} lost, {duplicated} duplicated, audit {(auditIntact ? "intact" : "BROKEN")}" +
            $" ({midBacklog} kills with files still waiting; files {set.Files}: {archived} archived, {quarantined} quarantined, {waiting} still in the inbox)");
        Console.WriteLine(summary);
        var result = new JsonObject
        {
            ["kills"] = kills, ["killsWithFilesWaiting"] = midBacklog, ["files"] = set.Files, ["batches"] = expected.Count, ["stored"] = stored.Count, ["lost"] = lost,
            ["duplicated"] = duplicated, ["archived"] = archived, ["quarantined"] = quarantined, ["waiting"] = waiting, ["auditIntact"] = auditIntact,
            ["at"] = DateTimeOffset.UtcNow.ToString("yyyy-MM-dd'T'HH:mm'Z'", Inv), ["summary"] = summary,
        };
        File.WriteAllText(Path.Combine(work, "soak-result.json"), result.ToJsonString() + "\n");
        return lost == 0 && duplicated == 0 && auditIntact && waiting == 0 && extra == 0 ? 0 : 1;
    }

    private string Config(string root)
    {
        var folder = Path.Combine(root, "config");
        Directory.CreateDirectory(Path.Combine(folder, "processes"));
        foreach (var file in Directory.GetFiles(Path.Combine(repo, "config", "processes"), "*.json"))
        {
            File.Copy(file, Path.Combine(folder, "processes", Path.GetFileName(file)));
        }

        var settings = JsonNode.Parse(File.ReadAllText(Path.Combine(repo, "config", "appsettings.json")))!.AsObject();
        settings["Intake"]!["SettleSeconds"] = 0.2;
        settings["Intake"]!["RescanSeconds"] = 1.0;
        File.WriteAllText(Path.Combine(folder, "appsettings.json"), settings.ToJsonString());
        return folder;
    }

    private static IEnumerable<string> BatchIds(string file)
    {
        var lines = File.ReadLines(file).ToList();
        var column = Array.FindIndex(lines[0].Split(','), h => string.Equals(h.Trim(), "batch", StringComparison.OrdinalIgnoreCase));
        return lines.Skip(1).Where(l => l.Length > 0).Select(l => l.Split(',')[column]).Distinct(StringComparer.Ordinal);
    }

    private static List<string> Strings(SqliteConnection connection, string sql)
    {
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        using var reader = command.ExecuteReader();
        var list = new List<string>();
        while (reader.Read())
        {
            list.Add(reader.GetString(0));
        }

        return list;
    }

    private static long Long(SqliteConnection connection, string sql)
    {
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        return Convert.ToInt64(command.ExecuteScalar(), Inv);
    }

    private static void Log(string message) => Console.Error.WriteLine("soak: " + message);

    private static void Log(IFormatProvider provider, FormattableString message) => Log(message.ToString(provider));
}
