using System.CommandLine;
using BatchReconcile.Digest.Rendering.Report;
using BatchReconcile.Hosting;
using BatchReconcile.Intake.Archive;
using BatchReconcile.Pipeline;
using BatchReconcile.Reconciliation.ProductionDays;
using BatchReconcile.RecipeAnalysis;
using BatchReconcile.Records;
using BatchReconcile.Storage;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Options;

namespace BatchReconcile.Cli;

/// <summary><c>report --recipe CODE [--from D] [--to D] --out FILE.html</c>: trends, losses and the version comparison on one page.</summary>
public static class ReportCommand
{
    public static Command Create(GlobalOptions globals, TextWriter stdout)
    {
        var shared = new AnalysisOptions();
        var output = new Option<string>("--out") { Description = "The HTML file to write (its folder must exist)", Required = true };
        var command = new Command("report", "One self-contained HTML page for a recipe: the control chart of every step, the loss Pareto and the version comparison");
        shared.AddTo(command, json: false);
        command.Options.Add(output);
        command.SetAction(parse =>
        {
            var recipe = shared.RecipeCode(parse);
            var (from, to) = shared.Period(parse);
            var path = OutPath(parse.GetRequiredValue(output));
            return HostedCommand.Run(parse, globals, service: false, host =>
            {
                var written = Write(host.Services, recipe, from, to, path);
                stdout.WriteLine(written);
                return ExitCodes.Success;
            });
        });
        return command;
    }

    /// <summary>Gathers, renders and writes the report (whole, then renamed into place); returns the full path.</summary>
    public static string Write(IServiceProvider services, string recipe, DateOnly? from, DateOnly? to, string path)
    {
        var zone = services.GetRequiredService<ProductionDayCalendar>().Zone;
        var now = TimeZoneInfo.ConvertTime(services.GetRequiredService<TimeProvider>().GetUtcNow(), zone);
        var data = ReportBuilder.Build(
            services.GetRequiredService<BatchStore>(), services.GetRequiredService<CatalogSource>(),
            services.GetRequiredService<IOptions<SiteOptions>>().Value.Name, now, recipe, from, to);
        FileMover.WriteAtomically(path, HtmlReportRenderer.Render(data));
        return path;
    }

    /// <summary>A recipe code reduced to letters, digits and hyphens, for a file name the demo chooses.</summary>
    public static string FileSafe(string code) =>
        new string([.. code.Select(c => char.IsAsciiLetterOrDigit(c) || c == '-' ? char.ToLowerInvariant(c) : '-')]).Trim('-') is { Length: > 0 } name ? name : "recipe";

    /// <summary>The full path of --out; a folder that does not exist, or a path that is a folder, is bad input.</summary>
    public static string OutPath(string text)
    {
        var shown = SafeText.Escape(SafeText.Prefix(text, 200));
        string full;
        try
        {
            full = Path.GetFullPath(text);
        }
        catch (Exception e) when (e is ArgumentException or NotSupportedException or PathTooLongException)
        {
            throw new UsageException($"--out '{shown}' is not a file path: {e.Message}");
        }

        if (Directory.Exists(full) || text.EndsWith('/') || text.EndsWith(Path.DirectorySeparatorChar))
        {
            throw new UsageException($"--out '{shown}' is a folder: give a file name, e.g. report.html");
        }

        var folder = Path.GetDirectoryName(full);
        return folder is not null && Directory.Exists(folder)
            ? full
            : throw new UsageException($"--out '{shown}': the folder {SafeText.Escape(folder ?? "")} does not exist");
    }
}
