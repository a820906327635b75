using System.CommandLine;
using System.Globalization;
using BatchReconcile.Digest.Rendering;
using BatchReconcile.Records;
using BatchReconcile.Storage;
using BatchReconcile.Storage.Queries;
using CsvHelper;
using Microsoft.Extensions.DependencyInjection;

namespace BatchReconcile.Cli;

/// <summary>
/// <c>export steps [--from D] [--to D] [--recipe CODE] --out FILE.csv</c>: every stored figure of every current batch step,
/// one row per batch step in production order, as CSV for a spreadsheet (docs/cli.md).
/// </summary>
/// <remarks>
/// Written with the digest CSV's writer options (<see cref="CsvExceptionList.Options"/>): RFC 4180, invariant culture, and a
/// text cell that starts with = + - @, a tab or a carriage return gets a leading apostrophe, so a spreadsheet shows it
/// as text. Numbers are written in full (shortest round-trip form), never rounded: the export is for further work.
/// The file is written beside its final name and renamed when complete, so a reader never sees half of it.
/// </remarks>
public static class ExportCommand
{
    public static IReadOnlyList<string> Columns { get; } =
    [
        "batch", "revision", "recipe", "recipe_version", "production_day", "last_output_at", "step", "step_order", "has_rows",
        "limiting_reactant", "extent_max_mol", "theoretical_kg", "actual_kg", "yield_pct", "atom_economy_pct", "stoichiometric_factor",
        "rme_pct", "mrp", "overall_rme_pct", "pmi", "complete_e_factor", "simple_e_factor", "mass_in_kg", "reactant_mass_kg",
        "stoichiometric_mass_kg", "recovered_kg", "mass_out_kg", "vented_kg", "vented_max_kg", "gap_kg", "closure_pct",
        "combined_uncertainty_kg", "solvent_in_kg", "water_in_kg", "equivalents", "ladder_kg", "yield_min_pct", "yield_max_pct", "balance_tolerance_pct", "coverage_factor",
        "expanded_uncertainty_kg", "equivalents_ranges", "product_in_waste_max_pct", "route_yield_pct", "route_yield_note", "flags", "open_flags",
    ];

    public static Command Create(GlobalOptions globals, TextWriter stdout)
    {
        var history = new HistoryOptions();
        var output = new Option<FileInfo>("--out") { Description = "The CSV file to write (replaced when it exists)", Required = true };
        var steps = new Command("steps", "Every stored step figure, one row per batch step of the current revisions, as CSV") { output };
        history.AddTo(steps);
        steps.SetAction(parse => HostedCommand.Run(parse, globals, service: false, host =>
        {
            var store = host.Services.GetRequiredService<BatchStore>();
            var (from, to) = history.Days(parse);
            var recipe = history.KnownRecipe(parse, store);
            var target = parse.GetRequiredValue(output);
            var folder = target.Directory ?? throw new UsageException($"--out '{SafeText.Escape(target.FullName)}' names no folder");
            if (!folder.Exists)
            {
                throw new UsageException($"--out '{SafeText.Escape(target.FullName)}': the folder {SafeText.Escape(folder.FullName)} does not exist");
            }

            if (Directory.Exists(target.FullName))
            {
                throw new UsageException($"--out '{SafeText.Escape(target.FullName)}' is a folder; give a file name");
            }

            var temporary = Path.Combine(folder.FullName, $".{target.Name}.{Guid.NewGuid():N}.tmp");
            long rows = 0;
            var batches = new HashSet<string>(StringComparer.Ordinal);
            try
            {
                using (var text = new StreamWriter(temporary, append: false, new System.Text.UTF8Encoding(encoderShouldEmitUTF8Identifier: false)))
                using (var csv = CsvWriter.Create(text, CsvExceptionList.Options, leaveOpen: true))
                {
                    csv.WriteHeader([.. Columns]);
                    store.ForEachStep(recipe, from, to, (stepRecipe, row) =>
                    {
                        Write(csv, stepRecipe, row);
                        rows++;
                        batches.Add(row.BatchId);
                    });
                    csv.Flush();
                }

                File.Move(temporary, target.FullName, overwrite: true);
            }
            finally
            {
                File.Delete(temporary);
            }

            stdout.WriteLine(rows == 0
                ? $"no batches{HistoryOptions.Describe(recipe, from, to)}: wrote the header line only to {target.FullName}"
                : string.Create(CultureInfo.InvariantCulture, $"{rows} step rows of {batches.Count} batch{(batches.Count == 1 ? "" : "es")}{HistoryOptions.Describe(recipe, from, to)} written to {target.FullName}"));
            return ExitCodes.Success;
        }, storeOnly: true));

        return new Command("export", "Export stored figures for further work") { steps };
    }

    private static void Write(CsvWriter csv, string recipe, RecipeStepRow row)
    {
        var s = row.Outcome;
        var l = s.Limits;
        csv.WriteField(row.BatchId);
        csv.WriteField(row.Revision, default);
        csv.WriteField(recipe);
        csv.WriteField(row.RecipeVersion, default);
        csv.WriteField(row.Day.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture));
        csv.WriteField(row.LastOutputAt?.UtcDateTime.ToString("yyyy-MM-dd'T'HH:mm:ss'Z'", CultureInfo.InvariantCulture));
        csv.WriteField(s.Step);
        csv.WriteField(row.StepOrder, default);
        csv.WriteField(s.HasRows ? "true" : "false");
        csv.WriteField(s.LimitingReactant);
        foreach (var value in new[]
        {
            s.ExtentMaxMol, s.TheoreticalKg, s.ActualKg, s.YieldPct, s.AtomEconomyPct, s.StoichiometricFactor, s.RmePct, s.Mrp, s.OverallRmePct,
            s.Pmi, s.CompleteEFactor, s.SimpleEFactor, s.MassInKg, s.ReactantMassKg, s.StoichiometricMassKg, s.RecoveredKg, s.MassOutKg,
            s.VentedKg, s.VentedMaxKg, s.GapKg, s.ClosurePct, s.CombinedUncertaintyKg, s.SolventInKg, s.WaterInKg,
        })
        {
            csv.WriteField(value, default);
        }

        // Pairs in code order, numbers in full: "ETOH=10.19;H2SO4=0.1"; the ladder as "rung=kg" in ladder order.
        csv.WriteField(string.Join(";", s.Equivalents.OrderBy(e => e.Key, StringComparer.Ordinal).Select(e => e.Key + "=" + e.Value.ToString("R", CultureInfo.InvariantCulture))));
        csv.WriteField(string.Join(";", s.Ladder.Select(r => r.Key + "=" + r.Kg.ToString("R", CultureInfo.InvariantCulture))));
        foreach (var value in new[] { l.YieldMinPct, l.YieldMaxPct, l.BalanceTolerancePct, l.CoverageFactor, l.ExpandedUncertaintyKg })
        {
            csv.WriteField(value, default);
        }

        // Unknown (stored before limits were kept) is an empty cell, never 0; "none" is a step without ranges.
        csv.WriteField(l.EquivalentsRanges is not { } ranges ? null
            : ranges.Count == 0 ? "none"
            : string.Join(";", ranges.OrderBy(e => e.Key, StringComparer.Ordinal).Select(e => string.Create(CultureInfo.InvariantCulture, $"{e.Key}={e.Value.Min:R}..{e.Value.Max:R}"))));
        csv.WriteField(l.ProductInWasteMaxPct, default);
        csv.WriteField(row.Route.YieldPct, default);
        csv.WriteField(row.Route.YieldPct is null ? row.Route.Reason : null);
        csv.WriteField(row.FlagCount, default);
        csv.WriteField(row.OpenFlags, default);
        csv.EndRecord();
    }
}
