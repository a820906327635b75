using System.CommandLine;
using System.Globalization;
using System.Text.Json;
using System.Text.RegularExpressions;
using BatchReconcile.Hosting;
using BatchReconcile.Pipeline;
using BatchReconcile.Records;
using BatchReconcile.Storage;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Options;

namespace BatchReconcile.Cli;

/// <summary>
/// Runs a command inside the application host. Settings, process definitions and the database are
/// checked first; anything wrong there is bad input (exit 2) with one line naming the file and setting.
/// </summary>
public static partial class HostedCommand
{
    /// <param name="storeOnly">A command that works on the store alone (lists, shows, reviews, verifies) does not load
    /// the process definitions: they play no part in its answer, and loading them was a quarter of its start-up time.</param>
    /// <param name="acrossSites">The command reads every site with <c>--site all</c> (through <see cref="Sites"/>); any other
    /// command refuses it, since it works on one site's records.</param>
    /// <param name="openStore">Open the store the settings name before <paramref name="body"/> runs (false: the body opens what it needs).</param>
    public static int Run(ParseResult parse, GlobalOptions globals, bool service, Func<IHost, int> body, bool storeOnly = false, bool acrossSites = false, bool openStore = true)
    {
        var context = AppContextOptions.From(parse.GetValue(globals.Config), parse.GetValue(globals.Data), parse.GetValue(globals.Site));
        if (context.SiteOverride is { } site && !context.IsAllSites && !BatchStore.IsValidSiteCode(site))
        {
            throw new UsageException($"--site '{SafeText.Escape(site)}' is not a site code (a letter, then letters, digits, '-' or '_') or 'all'");
        }

        if (context.IsAllSites && !acrossSites)
        {
            throw new UsageException("--site all is for batches list; give one site's code for this command");
        }

        using var host = Start(context, service, storeOnly: storeOnly, openStore: openStore);
        return body(host);
    }

    /// <summary>
    /// The stores a command reads: the site of the settings (or of <c>--site CODE</c>), or with <c>--site all</c> every
    /// site of a shared PostgreSQL store, in order of their codes (an SQLite store holds one site).
    /// The caller disposes the stores it is given beyond the host's own.
    /// </summary>
    public static IReadOnlyList<(string Site, BatchStore Store, bool Owned)> Sites(IHost host)
    {
        var context = host.Services.GetRequiredService<AppContextOptions>();
        var site = host.Services.GetRequiredService<IOptions<SiteOptions>>().Value.Code;
        var own = host.Services.GetRequiredService<BatchStore>();
        var settings = host.Services.GetRequiredService<IOptions<StoreSettings>>().Value;
        if (!context.IsAllSites || settings.Provider != StoreProvider.Postgresql)
        {
            return [(site, own, false)];
        }

        var time = host.Services.GetRequiredService<TimeProvider>();
        return BatchStore.PostgresSites(settings)
            .Select(code => string.Equals(code, site, StringComparison.OrdinalIgnoreCase)
                ? (code, own, false)
                : (code, BatchStore.OpenPostgres(settings.ConnectionString!, code, settings, time), true))
            .ToList();
    }

    public static IHost Start(AppContextOptions context, bool service, bool quietConsole = false, bool storeOnly = false, bool openStore = true)
    {
        IHost? host = null;
        try
        {
            host = AppHost.Build(context, service, quietConsole);
            AppHost.Validate(host.Services, definitions: !storeOnly, store: openStore);
            return host;
        }
        catch (Exception e) when (Describe(e, context) is { } reason)
        {
            host?.Dispose();
            throw new UsageException(reason);
        }
    }

    private static string? Describe(Exception e, AppContextOptions context)
    {
        var settings = Path.Combine(context.ConfigDirectory, "appsettings.json");
        return e switch
        {
            OptionsValidationException o => $"settings in {settings} refused: {string.Join("; ", o.Failures)}",
            DefinitionsException d => d.Message,
            ConfigurationException c => c.Message,
            StoreException s => $"database: {s.Message}",
            InvalidDataException i when Inner<JsonException>(i) is { } j => $"settings in {settings} are not valid JSON{JsonPosition(j)}: {JsonReason(j)}",
            InvalidDataException i => $"settings in {settings}: {i.Message}",
            InvalidOperationException i when BinderFailure().Match(i.Message) is { Success: true } m =>
                $"settings in {settings} refused: {m.Groups["path"].Value} = '{SafeText.Escape(SafeText.Prefix(m.Groups["value"].Value, 80))}' is not {Expected(m.Groups["type"].Value)}",
            // The logging settings (section Serilog) are read by Serilog.Settings.Configuration, whose messages name the value.
            InvalidOperationException or ArgumentException or FormatException when e.Source == "Serilog.Settings.Configuration" =>
                $"settings in {settings} refused: Serilog: {SafeText.Escape(e.Message)}",
            InvalidOperationException { InnerException: FormatException f } => $"settings in {settings}: {f.Message}",
            _ => null,
        };
    }

    private static T? Inner<T>(Exception e)
        where T : Exception
    {
        for (var inner = e.InnerException; inner is not null; inner = inner.InnerException)
        {
            if (inner is T found)
            {
                return found;
            }
        }

        return null;
    }

    // "Failed to convert configuration value 'abc' at 'Intake:SettleSeconds' to type 'System.Double'." (Microsoft.Extensions.Configuration.Binder)
    [GeneratedRegex(@"^Failed to convert configuration value '(?<value>.*)' at '(?<path>[^']*)' to type '(?<type>[^']*)'", RegexOptions.Singleline | RegexOptions.CultureInvariant)]
    private static partial Regex BinderFailure();

    private static string Expected(string type) => type switch
    {
        "System.Double" or "System.Decimal" or "System.Single" => "a number (write it like 2.5, with '.' as the decimal separator)",
        "System.Int32" or "System.Int64" => "a whole number",
        "System.Boolean" => "true or false",
        "System.TimeSpan" => "a time span such as 00:05:00",
        _ => $"a valid {type.Split('.')[^1]}",
    };

    // Line and position are 0-based in JsonException; people count from 1.
    private static string JsonPosition(JsonException j) =>
        j.LineNumber is { } line
            ? string.Create(CultureInfo.InvariantCulture, $" at line {line + 1}, position {(j.BytePositionInLine ?? 0) + 1}")
            : "";

    private static string JsonReason(JsonException j)
    {
        var reason = j.Message;
        var cut = reason.IndexOf(" LineNumber:", StringComparison.Ordinal);
        return (cut >= 0 ? reason[..cut] : reason).Trim().TrimEnd('.');
    }
}
