using System.CommandLine;
using System.Globalization;
using BatchReconcile.Hosting;
using BatchReconcile.Storage;
using BatchReconcile.Storage.Audit;
using BatchReconcile.Storage.Copy;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Logging;
using Microsoft.Extensions.Options;

namespace BatchReconcile.Cli;

/// <summary>
/// <c>store copy --to postgresql [--connection-string-env NAME] [--json]</c>: copies the SQLite store of the data folder, every row
/// with its id, into the empty schema of the site (<c>Site:Code</c>) in the PostgreSQL database of <c>Storage:ConnectionString</c>,
/// then verifies the copy's audit trail.
/// </summary>
public static class StoreCommand
{
    public const string DefaultConnectionStringVariable = "Storage__ConnectionString";

    public static Command Create(GlobalOptions globals, TextWriter stdout, TextWriter stderr)
    {
        var to = new Option<string>("--to") { Description = "Where to copy the store: postgresql", Required = true };
        var variable = new Option<string?>("--connection-string-env")
        {
            Description = "Read the PostgreSQL connection string from this environment variable (default: Storage:ConnectionString, e.g. Storage__ConnectionString)",
        };
        var json = new Option<bool>("--json") { Description = "Print one JSON document on stdout" };
        var copy = new Command(
            "copy",
            "Copy the SQLite store of the data folder, every row with its id, into the empty PostgreSQL schema of the site (Site:Code), then verify the copy's audit trail; the SQLite file is only read")
        {
            to, variable, json,
        };
        copy.SetAction(parse =>
        {
            var kind = parse.GetRequiredValue(to).Trim();
            if (!string.Equals(kind, "postgresql", StringComparison.OrdinalIgnoreCase))
            {
                throw new UsageException($"--to '{SafeText(kind)}': a store can be copied only to postgresql");
            }

            var name = parse.GetValue(variable)?.Trim();
            if (name is { Length: 0 })
            {
                throw new UsageException("--connection-string-env names no variable");
            }

            return HostedCommand.Run(parse, globals, service: false, host => Copy(host.Services, name, parse.GetValue(json), stdout, stderr), storeOnly: true, openStore: false);
        });
        return new Command("store", "The store itself: copy a SQLite store into PostgreSQL") { copy };
    }

    private static int Copy(IServiceProvider services, string? variable, bool json, TextWriter stdout, TextWriter stderr)
    {
        var settings = services.GetRequiredService<IOptions<StoreSettings>>().Value;
        var site = services.GetRequiredService<IOptions<SiteOptions>>().Value;
        var context = services.GetRequiredService<AppContextOptions>();
        var time = services.GetRequiredService<TimeProvider>();
        var log = services.GetRequiredService<ILogger<StoreCopyResult>>();
        var connectionString = ConnectionString(settings, variable);
        var database = DataFolders.From(site, context.DataOverride).Database;
        if (!File.Exists(database))
        {
            throw new UsageException($"no SQLite store to copy: {database} does not exist (give the data folder with --data)");
        }

        // The source as SQLite whatever Storage:Provider says; the target from the connection string and the site's code.
        var sqliteSettings = settings with { Provider = StoreProvider.Sqlite, ConnectionString = null };
        using var source = Opened(() => BatchStore.Open(database, sqliteSettings, time));
        using var target = Opened(() => BatchStore.OpenPostgres(connectionString, site.Code, settings with { Provider = StoreProvider.Postgresql }, time));

        StoreCopyResult result;
        try
        {
            result = source.CopyTo(target);
        }
        catch (StoreException e) when (e.Refused)
        {
            throw new UsageException("store copy refused: " + e.Message);
        }

        log.LogInformation("Copied {Rows} rows of {Source} into {Target} in {Seconds:0.0} s", result.Rows, result.Source, result.Target, result.Elapsed.TotalSeconds);
        var verification = target.VerifyAudit();
        if (json)
        {
            JsonOutput.Write(stdout, new StoreCopyJson(
                result.Source,
                result.Target,
                result.Tables.Select(t => new TableJson(t.Table, t.Rows, Math.Round(t.Elapsed.TotalSeconds, 3))).ToList(),
                result.Rows,
                Math.Round(result.Elapsed.TotalSeconds, 3),
                result.AuditHighWater,
                result.TriggersSkipped,
                new VerificationJson(verification.Intact, verification.EntriesChecked, verification.LastHash, verification.Problem?.ToString(), verification.Message)));
        }
        else
        {
            stdout.WriteLine($"copied {result.Source}");
            stdout.WriteLine($"  into {result.Target}");
            var width = result.Tables.Max(t => t.Table.Length);
            foreach (var table in result.Tables)
            {
                stdout.WriteLine(string.Create(CultureInfo.InvariantCulture, $"  {table.Table.PadRight(width)}  {table.Rows,10} rows  {table.Elapsed.TotalSeconds,6:0.0} s"));
            }

            if (!result.TriggersSkipped)
            {
                stdout.WriteLine("  (the role does not own the site's tables: the copy ran with their per-row triggers on, which is slower on a large store)");
            }

            stdout.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"{result.Rows} rows in {result.Tables.Count} tables copied in {result.Elapsed.TotalSeconds:0.0} s, in one transaction"));
        }

        if (verification.Intact)
        {
            if (!json)
            {
                stdout.WriteLine(string.Create(CultureInfo.InvariantCulture, $"audit trail of the copy intact: {verification.EntriesChecked} entries, last hash {verification.LastHash}"));
            }

            return ExitCodes.Success;
        }

        stderr.WriteLine($"batchreconcile: the copy was stored, but its audit trail does not verify: {verification.Message}");
        foreach (var difference in verification.Differences)
        {
            stderr.WriteLine("  " + difference.Message);
        }

        return ExitCodes.UnexpectedFailure;
    }

    /// <summary>The target's connection string: from the named variable, else from the settings (Storage:ConnectionString). Never printed.</summary>
    private static string ConnectionString(StoreSettings settings, string? variable)
    {
        if (variable is not null)
        {
            return Environment.GetEnvironmentVariable(variable) is { Length: > 0 } value && !string.IsNullOrWhiteSpace(value)
                ? Checked(value, $"the connection string in {variable}")
                : throw new UsageException($"--connection-string-env {SafeText(variable)}: that environment variable is not set or empty");
        }

        return string.IsNullOrWhiteSpace(settings.ConnectionString)
            ? throw new UsageException(
                $"no PostgreSQL connection string to copy into: set Storage:ConnectionString (as the environment variable {DefaultConnectionStringVariable}) or name a variable with --connection-string-env")
            : Checked(settings.ConnectionString, "Storage:ConnectionString");
    }

    private static string Checked(string connectionString, string what)
    {
        // The settings' own check: Npgsql's message names a keyword it does not know, never the values.
        var problems = new StoreSettings { Provider = StoreProvider.Postgresql, ConnectionString = connectionString }.Validate();
        return problems.Count == 0
            ? connectionString
            : throw new UsageException($"{what} {string.Join(" ", problems).Replace("Storage:ConnectionString ", string.Empty, StringComparison.Ordinal)}");
    }

    /// <summary>A store that cannot be opened (missing server, refused login, newer schema) is bad input, as at any command's start.</summary>
    private static BatchStore Opened(Func<BatchStore> open)
    {
        try
        {
            return open();
        }
        catch (StoreException e)
        {
            throw new UsageException("database: " + e.Message);
        }
    }

    private static string SafeText(string text) => Records.SafeText.Escape(Records.SafeText.Prefix(text, 80));

    private sealed record StoreCopyJson(
        string Source, string Target, IReadOnlyList<TableJson> Tables, long Rows, double Seconds, long? AuditHighWater, bool TriggersSkipped,
        VerificationJson Verification);

    private sealed record TableJson(string Table, long Rows, double Seconds);

    private sealed record VerificationJson(bool Intact, long Entries, string LastHash, string? Problem, string Message);
}
