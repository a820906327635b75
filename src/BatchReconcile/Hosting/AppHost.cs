using BatchReconcile.Digests;
using BatchReconcile.Intake.Archive;
using BatchReconcile.Pipeline;
using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Reconciliation.ProductionDays;
using BatchReconcile.Reconciliation.Settings;
using BatchReconcile.Storage;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Logging;
using Microsoft.Extensions.Options;
using Serilog;
using Serilog.Settings.Configuration;

namespace BatchReconcile.Hosting;

/// <summary>
/// Builds the generic host shared by every command that needs settings, the store or the pipeline:
/// configuration from the config folder, validated options, Serilog, and the services.
/// </summary>
public static class AppHost
{
    /// <summary>The sinks the settings may name (<c>Serilog:WriteTo</c>): console and rolling file.</summary>
    private static readonly ConfigurationReaderOptions SinkAssemblies = new(
        typeof(ConsoleLoggerConfigurationExtensions).Assembly,
        typeof(FileLoggerConfigurationExtensions).Assembly);

    /// <summary>A temporary of ours not written for this long belongs to no write in progress.</summary>
    private static readonly TimeSpan StaleTemporaryAge = TimeSpan.FromMinutes(1);

    /// <param name="service">True for <c>run</c>: the inbox service is added and console logging is at the configured level.
    /// One-shot commands log warnings and above to the console (stderr) and everything to the log file.</param>
    /// <param name="quietConsole">Keep the console to errors (the demo prints its own summary).</param>
    /// <param name="time">The clock; tests pass a fake one.</param>
    public static IHost Build(AppContextOptions context, bool service, bool quietConsole = false, TimeProvider? time = null)
    {
        var settingsFile = Path.Combine(context.ConfigDirectory, "appsettings.json");
        if (!File.Exists(settingsFile))
        {
            throw new ConfigurationException($"{settingsFile} not found (give the config folder with --config)");
        }

        var builder = Host.CreateApplicationBuilder(new HostApplicationBuilderSettings
        {
            DisableDefaults = true,
            ContentRootPath = context.ConfigDirectory,
        });
        builder.Configuration.AddJsonFile(settingsFile, optional: false, reloadOnChange: false);
        // The generic host's convention (Storage__ConnectionString), then the program's own prefix, which wins.
        builder.Configuration.AddEnvironmentVariables();
        builder.Configuration.AddEnvironmentVariables("BATCHRECONCILE_");
        if (context.SiteOverride is { } siteCode && !context.IsAllSites)
        {
            builder.Configuration.AddInMemoryCollection([new KeyValuePair<string, string?>("Site:Code", siteCode)]);
        }

        var site = builder.Configuration.GetSection(SiteOptions.Section).Get<SiteOptions>() ?? new SiteOptions();
        var folders = DataFolders.From(site, context.DataOverride);
        builder.Configuration.AddInMemoryCollection(LoggingOverrides(builder.Configuration, folders, service ? null : quietConsole ? "Error" : "Warning"));

        builder.Services.AddSingleton(context);
        builder.Services.AddSingleton(time ?? TimeProvider.System);
        builder.Services.AddOptions<SiteOptions>().BindConfiguration(SiteOptions.Section).ValidateDataAnnotations().ValidateOnStart();
        builder.Services.AddOptions<IntakeOptions>().BindConfiguration(IntakeOptions.Section).ValidateDataAnnotations().ValidateOnStart();
        builder.Services.AddOptions<StoreSettings>().BindConfiguration("Storage").ValidateOnStart();
        builder.Services.AddOptions<ReconciliationSettings>().BindConfiguration("Reconciliation").ValidateDataAnnotations().ValidateOnStart();
        builder.Services.AddSingleton<IValidateOptions<StoreSettings>, StoreSettingsValidation>();
        builder.Services.AddSingleton<IValidateOptions<ReconciliationSettings>, SeveritiesValidation>();

        builder.Services.AddSingleton(sp =>
        {
            var folders = DataFolders.From(sp.GetRequiredService<IOptions<SiteOptions>>().Value, context.DataOverride);
            folders.Create();
            return folders;
        });
        builder.Services.AddSingleton(sp =>
        {
            var s = sp.GetRequiredService<IOptions<SiteOptions>>().Value;
            return new ProductionDayCalendar(s.GetZone(), s.GetDayStart());
        });
        builder.Services.AddSingleton(sp => new CatalogSource(context.ProcessesDirectory, sp.GetRequiredService<ILogger<CatalogSource>>()));
        builder.Services.AddSingleton(sp => BatchStore.Open(
            sp.GetRequiredService<IOptions<StoreSettings>>().Value,
            sp.GetRequiredService<DataFolders>().Database,
            sp.GetRequiredService<IOptions<SiteOptions>>().Value.Code,
            sp.GetRequiredService<TimeProvider>()));
        builder.Services.AddSingleton(sp =>
        {
            var f = sp.GetRequiredService<DataFolders>();
            var zone = sp.GetRequiredService<IOptions<SiteOptions>>().Value.GetZone();
            var mover = new FileMover(new ArchiveLayout(f.Archive, zone), f.Quarantine, sp.GetRequiredService<TimeProvider>());

            // What a killed run left behind (hidden .NAME.GUID.tmp files, probe folders); see docs/storage.md.
            var log = sp.GetRequiredService<ILogger<FileMover>>();
            foreach (var stale in mover.RemoveStaleTemporaries(f.Inbox, StaleTemporaryAge, f.Digests))
            {
                log.LogInformation("Removed {Temporary}, a temporary file left by an interrupted run", stale);
            }

            return mover;
        });
        builder.Services.AddSingleton(sp => sp.GetRequiredService<IOptions<ReconciliationSettings>>().Value);
        builder.Services.AddSingleton<IngestPipeline>();
        builder.Services.AddSingleton(sp =>
        {
            var s = sp.GetRequiredService<IOptions<SiteOptions>>().Value;
            return new DigestSchedule(sp.GetRequiredService<ProductionDayCalendar>(), s.GetDigestTime(), s.DigestCatchUpDays);
        });
        builder.Services.AddSingleton<DigestWriter>();

        // The sink assemblies are named rather than found: finding them reads the dependency manifest and
        // scans the program's folder, a noticeable part of every one-shot command's start-up.
        // Values from files reach log lines escaped (EscapingEnricher): no forged lines, no terminal control.
        builder.Services.AddSerilog((_, logger) => logger.ReadFrom.Configuration(builder.Configuration, SinkAssemblies).Enrich.With<EscapingEnricher>());
        if (service)
        {
            builder.Services.AddSystemd();
            builder.Services.AddHostedService<InboxService>();
            builder.Services.AddSingleton<DigestService>();
            builder.Services.AddHostedService(sp => sp.GetRequiredService<DigestService>());
            builder.Services.Configure<HostOptions>(o => o.ShutdownTimeout = TimeSpan.FromSeconds(60));
        }

        return builder.Build();
    }

    /// <summary>
    /// Resolves every service that start-up must check (options, definitions, database), so that a bad
    /// setting or definition stops the command before any file is touched.
    /// </summary>
    /// <param name="definitions">Also load and check the process definitions (every command that reads exports or renders them).</param>
    /// <param name="store">Also open the store the settings name (every command but <c>store copy</c>, which opens both stores itself).</param>
    public static void Validate(IServiceProvider services, bool definitions = true, bool store = true)
    {
        _ = services.GetRequiredService<IOptions<SiteOptions>>().Value;
        _ = services.GetRequiredService<IOptions<IntakeOptions>>().Value;
        _ = services.GetRequiredService<IOptions<StoreSettings>>().Value;
        _ = services.GetRequiredService<IOptions<ReconciliationSettings>>().Value;
        if (definitions)
        {
            _ = services.GetRequiredService<CatalogSource>();
        }

        if (store)
        {
            _ = services.GetRequiredService<BatchStore>();
        }
    }

    /// <summary>
    /// The log file goes under the data root's logs/ folder (a relative path in the Serilog settings is
    /// taken from there), and one-shot commands keep the console to warnings.
    /// </summary>
    private static Dictionary<string, string?> LoggingOverrides(IConfiguration configuration, DataFolders folders, string? consoleMinimum)
    {
        var overrides = new Dictionary<string, string?>();
        foreach (var sink in configuration.GetSection("Serilog:WriteTo").GetChildren())
        {
            var name = sink["Name"];
            if (string.Equals(name, "File", StringComparison.OrdinalIgnoreCase) && sink["Args:path"] is { } path && !Path.IsPathRooted(path))
            {
                overrides[$"{sink.Path}:Args:path"] = Path.Combine(folders.Root, path);
            }

            if (consoleMinimum is not null && string.Equals(name, "Console", StringComparison.OrdinalIgnoreCase))
            {
                overrides[$"{sink.Path}:Args:restrictedToMinimumLevel"] = consoleMinimum;
            }
        }

        return overrides;
    }

    private sealed class StoreSettingsValidation : IValidateOptions<StoreSettings>
    {
        public ValidateOptionsResult Validate(string? name, StoreSettings options)
        {
            var errors = options.Validate();
            return errors.Count == 0 ? ValidateOptionsResult.Success : ValidateOptionsResult.Fail(errors);
        }
    }

    private sealed class SeveritiesValidation : IValidateOptions<ReconciliationSettings>
    {
        public ValidateOptionsResult Validate(string? name, ReconciliationSettings options) =>
            SeverityTable.TryCreate(options.Severities, out _, out var errors)
                ? ValidateOptionsResult.Success
                : ValidateOptionsResult.Fail(errors);
    }
}
