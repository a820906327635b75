using System.Globalization;
using BatchReconcile.Chemistry.Metrics;
using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Reconciliation.Route;
using BatchReconcile.Reconciliation.Settings;
using BatchReconcile.Reconciliation.Steps;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Records.Exports;

namespace BatchReconcile.Reconciliation;

/// <summary>Reconciles a batch record step by step against its recipe (docs/computation.md). Pure: no I/O, no logging.</summary>
/// <remarks>
/// The figures support investigations under the site's own procedures; vented-gas masses are stoichiometric
/// estimates, and reactive steps, vented gases and solvents remain matters for site safety practice, local codes
/// and qualified review.
/// </remarks>
public static class BatchReconciler
{
    /// <summary>One <see cref="StepOutcome"/> per recipe step, in recipe order, with its flags.</summary>
    /// <exception cref="ArgumentException">
    /// The batch is not of this recipe, has rows of a step the recipe lacks, or the settings name an unknown flag
    /// code or severity. All are checked before reconciliation (export validation, options validation at start),
    /// so reaching here with them is a bug.
    /// </exception>
    public static BatchOutcome Reconcile(BatchRecord batch, Recipe recipe, ProcessCatalog catalog, ReconciliationSettings settings)
    {
        ArgumentNullException.ThrowIfNull(batch);
        ArgumentNullException.ThrowIfNull(recipe);
        ArgumentNullException.ThrowIfNull(catalog);
        ArgumentNullException.ThrowIfNull(settings);
        if (!string.Equals(batch.RecipeCode, recipe.Code, StringComparison.OrdinalIgnoreCase) || batch.RecipeVersion != recipe.Version)
        {
            throw new ArgumentException($"Batch {batch.BatchId} is of recipe {batch.RecipeCode} v{batch.RecipeVersion}, not {recipe.Code} v{recipe.Version}.", nameof(recipe));
        }

        var stray = batch.Rows.FirstOrDefault(r => recipe.FindStep(r.Step) is null);
        if (stray is not null)
        {
            throw new ArgumentException($"Batch {batch.BatchId}, line {stray.Line}: step '{stray.Step}' is not a step of recipe {recipe.Code} v{recipe.Version}.", nameof(batch));
        }

        var severities = SeverityTable.FromSettings(settings);
        var materials = new MaterialLookup(catalog);
        var computed = recipe.Steps.Select(step => Compute(batch, step, materials, settings)).ToArray();
        var links = StepLinks.Find(computed, materials);
        var versionFlags = VersionFlags(batch, recipe, catalog, severities);
        var steps = computed
            .Select((c, i) => StepOutcomeMapper.Map(
                c.Step, c.HasRows, c.Result,
                [.. i == 0 ? versionFlags : [], .. Flags(batch, c, links, recipe, materials, settings, severities)],
                c.Step.ProductInWasteMaxPct ?? settings.ProductInWasteMaxPct))
            .ToArray();
        return new BatchOutcome(batch, steps, LastOutputAt(batch))
        {
            Links = links,
            Route = StepLinks.Yield(computed, materials),
        };
    }

    /// <summary>
    /// recipe-version-unstated when neither the export nor an effective date chose the version. Flags are
    /// stored per step, and this one concerns the whole batch, so it goes with the recipe's first step.
    /// </summary>
    private static IReadOnlyList<Flag> VersionFlags(BatchRecord batch, Recipe recipe, ProcessCatalog catalog, SeverityTable severities)
    {
        if (batch.RecipeVersionSource != RecipeVersionSource.Newest)
        {
            return [];
        }

        var first = recipe.Steps[0];
        var dated = catalog.Recipes
            .Where(r => string.Equals(r.Code, recipe.Code, StringComparison.OrdinalIgnoreCase) && r.EffectiveFrom is not null)
            .Select(r => r.EffectiveFrom!.Value)
            .ToList();
        var why = batch.FirstRecordedDate is not { } date ? "none of its rows has a recorded_at"
            : dated.Count == 0 ? $"no version of recipe {recipe.Code} has an effectiveFrom date"
            : string.Create(CultureInfo.InvariantCulture, $"its first recorded time ({date:yyyy-MM-dd}, local date) is before the earliest effectiveFrom of recipe {recipe.Code} ({dated.Min():yyyy-MM-dd})");
        return
        [
            new Flag(
                FlagCode.RecipeVersionUnstated,
                severities.For(FlagCode.RecipeVersionUnstated, first),
                first.Code,
                null,
                null,
                string.Empty,
                string.Create(CultureInfo.InvariantCulture, $"The export of batch {batch.BatchId} gives no recipe_version and {why}, so the batch was reconciled against the newest version, {recipe.Code} v{recipe.Version}; confirm the version from the batch record and, if it was another, have the export sent again with recipe_version filled in (or give the versions effectiveFrom dates).")),
        ];
    }

    /// <summary>The latest recorded time among output rows (by instant, not by line order); null when none has one.</summary>
    private static DateTimeOffset? LastOutputAt(BatchRecord batch) => batch.Rows
        .Where(r => r.Entry is EntryKind.Product or EntryKind.Waste or EntryKind.Recovered or EntryKind.Sample)
        .Select(r => r.RecordedAt)
        .Where(t => t.HasValue)
        .Max();

    private static ComputedStep Compute(BatchRecord batch, RecipeStep step, MaterialLookup materials, ReconciliationSettings settings)
    {
        var rows = batch.RowsOfStep(step.Code).ToArray();

        // A step with no rows still gets its figures from empty inputs (zeros, nulls, the atom economy), so a
        // missing step looks like every other step to storage and reports; only its flag differs.
        var input = StepInputBuilder.Build(step, rows, materials, settings);
        return new ComputedStep(step, rows.Length > 0, input, StepMetrics.Compute(input));
    }

    private static IReadOnlyList<Flag> Flags(
        BatchRecord batch,
        ComputedStep c,
        IReadOnlyList<IntermediateLink> links,
        Recipe recipe,
        MaterialLookup materials,
        ReconciliationSettings settings,
        SeverityTable severities)
    {
        if (!c.HasRows)
        {
            return FlagRules.StepMissing(c.Step, batch.BatchId, severities);
        }

        var flags = FlagRules.Evaluate(c.Step, c.Result, materials, severities, c.Step.ProductInWasteMaxPct ?? settings.ProductInWasteMaxPct).ToList();
        foreach (var link in links.Where(l => l.ToStep == c.Step.Code && l.State == "overdrawn"))
        {
            flags.Add(FlagRules.IntermediateOverdrawn(link, recipe.FindStep(link.FromStep)!, c.Step, severities));
        }

        return flags;
    }
}
