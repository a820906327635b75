using System.CommandLine;
using BatchReconcile.Hosting;
using BatchReconcile.Pipeline;
using BatchReconcile.Storage;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Options;

namespace BatchReconcile.Cli;

/// <summary>
/// Runs a command inside the application host. Settings, process definitions and the database are
/// checked first; anything wrong there is bad input (exit 2) with one line naming the file and setting.
/// </summary>
public static class HostedCommand
{
    /// <param name="storeOnly">A command that works on the store alone (lists, shows, reviews, verifies) does not load
    /// the process definitions: they play no part in its answer, and loading them was a quarter of its start-up time.</param>
    public static int Run(ParseResult parse, GlobalOptions globals, bool service, Func<IHost, int> body, bool storeOnly = false)
    {
        var context = AppContextOptions.From(parse.GetValue(globals.Config), parse.GetValue(globals.Data));
        using var host = Start(context, service, storeOnly: storeOnly);
        return body(host);
    }

    public static IHost Start(AppContextOptions context, bool service, bool quietConsole = false, bool storeOnly = false)
    {
        IHost? host = null;
        try
        {
            host = AppHost.Build(context, service, quietConsole);
            AppHost.Validate(host.Services, definitions: !storeOnly);
            return host;
        }
        catch (Exception e) when (Describe(e, context) is { } reason)
        {
            host?.Dispose();
            throw new UsageException(reason);
        }
    }

    private static string? Describe(Exception e, AppContextOptions context) => e switch
    {
        OptionsValidationException o => $"settings in {Path.Combine(context.ConfigDirectory, "appsettings.json")} refused: {string.Join("; ", o.Failures)}",
        DefinitionsException d => d.Message,
        ConfigurationException c => c.Message,
        StoreException s => $"database: {s.Message}",
        InvalidDataException i => $"settings in {Path.Combine(context.ConfigDirectory, "appsettings.json")}: {i.Message}",
        InvalidOperationException { InnerException: FormatException f } => $"settings in {Path.Combine(context.ConfigDirectory, "appsettings.json")}: {f.Message}",
        _ => null,
    };
}
