using System.Globalization;
using System.Security.Cryptography;
using System.Text;
using BatchReconcile.Chemistry.Metrics;
using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Records.Exports;
using BatchReconcile.Storage.Ingest;

namespace BatchReconcile.Storage.Tests.Support;

/// <summary>
/// Builds records, outcomes and files for the store's tests. The figures are invented: the store
/// must give back exactly what it was given, and no chemistry is checked here. The rows follow the
/// demo plant's two-step benzocaine recipe (esterification, then nitro reduction).
/// </summary>
internal static class Build
{
    public const string Recipe = "BZC-410";

    public static readonly DateOnly Day1 = new(2026, 11, 23);
    public static readonly DateOnly Day2 = new(2026, 11, 24);
    public static readonly DateTimeOffset ReceivedAt = new(2026, 11, 24, 8, 0, 0, TimeSpan.Zero);
    public static readonly DateTimeOffset ProcessedAt = new(2026, 11, 24, 8, 0, 5, TimeSpan.Zero);

    private static readonly string[] Header = ["batch", "recipe", "step", "entry", "material", "stream", "quantity", "unit", "recorded_at"];

    public static RecordRow Row(
        int line, string batch, string step, EntryKind entry, string? material, double quantity,
        string? stream = null, DateTimeOffset? recordedAt = null, string? quantityText = null, string recipe = Recipe)
    {
        var values = new[]
        {
            batch, recipe, step, entry.ToString().ToLowerInvariant(), material ?? string.Empty, stream ?? string.Empty,
            quantityText ?? quantity.ToString(CultureInfo.InvariantCulture), "kg",
            recordedAt?.ToString("yyyy-MM-dd'T'HH:mm:sszzz", CultureInfo.InvariantCulture) ?? string.Empty,
        };
        var raw = Header.Zip(values, (h, v) => new KeyValuePair<string, string>(h, v)).ToList();
        return new RecordRow(line, batch, recipe, null, step, entry, material, stream, quantity, quantity, MassUnit.Kilogram, null, null, recordedAt, raw);
    }

    /// <summary>A two-step batch; <paramref name="productKg"/> changes step 1's product row (a re-export with a correction).</summary>
    public static BatchRecord Batch(string batchId, double productKg = 95.0, int firstLine = 2, int recipeVersion = 1)
    {
        var finished = new DateTimeOffset(2026, 11, 23, 16, 30, 0, TimeSpan.FromHours(1));
        var line = firstLine;
        RecordRow[] rows =
        [
            Row(line++, batchId, "S1", EntryKind.Charge, "NBA", 100.0),
            Row(line++, batchId, "S1", EntryKind.Charge, "ETOH", 400.0),
            Row(line++, batchId, "S1", EntryKind.Charge, "H2SO4", 5.0),
            Row(line++, batchId, "S1", EntryKind.Product, "ENB", productKg, recordedAt: finished.AddHours(-4)),
            Row(line++, batchId, "S1", EntryKind.Waste, null, 390.0, stream: "mother liquor"),
            Row(line++, batchId, "S2", EntryKind.Charge, "ENB", 90.0),
            Row(line++, batchId, "S2", EntryKind.Charge, "H2", 2.8),
            Row(line++, batchId, "S2", EntryKind.Charge, "PDC", 1.0),
            Row(line++, batchId, "S2", EntryKind.Product, "BZC", 70.0, recordedAt: finished),
            Row(line, batchId, "S2", EntryKind.Recovered, "ETOH", 280.0),
        ];
        return new BatchRecord(batchId, Recipe, recipeVersion, RecipeVersionSource.Export, null, rows, []);
    }

    public static Flag Flag(
        string step, FlagCode code = FlagCode.YieldLow, FlagSeverity severity = FlagSeverity.Major,
        double? measured = 81.5, double? limit = 88.0, string unit = "%", string? subject = null) =>
        new(code, severity, step, measured, limit, unit, $"{code.ToText()} on {step}: check the record.", subject);

    /// <summary>A step outcome whose every figure is distinct (derived from <paramref name="seed"/>), so a column mix-up shows.</summary>
    public static StepOutcome Step(string step, double seed, IReadOnlyList<Flag> flags, bool nulls = false) => new(
        Step: step,
        HasRows: !nulls,
        LimitingReactant: nulls ? null : "NBA",
        ExtentMaxMol: nulls ? null : seed + 0.01,
        TheoreticalKg: nulls ? null : seed + 0.02,
        ActualKg: seed + 0.03,
        YieldPct: nulls ? null : seed + 0.04,
        AtomEconomyPct: seed + 0.05,
        StoichiometricFactor: nulls ? null : seed + 0.06,
        RmePct: nulls ? null : seed + 0.07,
        Mrp: nulls ? null : seed + 0.08,
        OverallRmePct: nulls ? null : seed + 0.09,
        Pmi: nulls ? null : seed + 0.10,
        CompleteEFactor: nulls ? null : seed + 0.11,
        SimpleEFactor: nulls ? null : seed + 0.12,
        MassInKg: seed + 0.13,
        ReactantMassKg: seed + 0.14,
        StoichiometricMassKg: nulls ? null : seed + 0.15,
        RecoveredKg: seed + 0.16,
        MassOutKg: seed + 0.17,
        VentedKg: seed + 0.18,
        VentedMaxKg: seed + 0.19,
        GapKg: -(seed + 0.20),
        ClosurePct: nulls ? null : seed + 0.21,
        CombinedUncertaintyKg: seed + 0.22,
        Equivalents: nulls ? new Dictionary<string, double>() : new Dictionary<string, double> { ["ETOH"] = seed + 0.23, ["H2SO4"] = 0.1 / 3 },
        Ladder:
        [
            new LadderRung("auxiliaries-not-recovered", "auxiliaries not recovered", seed + 0.24, 1.0 / 7)
            {
                Parts = nulls ? [] : [new LadderPart("ETOH", seed + 0.20), new LadderPart("WATER", 0.04)],
            },
            new LadderRung("yield-loss-unexplained", "yield loss, unexplained", -(seed + 0.25), -0.5),
        ],
        Flags: flags,
        Limits: nulls ? StepLimits.Unknown : new StepLimits(
            seed + 0.26, seed + 0.27, seed + 0.28, seed + 0.29, seed + 0.30,
            new Dictionary<string, ValueRange> { ["ETOH"] = new(seed + 0.31, seed + 0.32) }, seed + 0.33),
        SolventInKg: nulls ? null : seed + 0.34,
        WaterInKg: nulls ? null : seed + 0.35);

    /// <summary>The batch reconciled: steps S1 and S2, each flag on the step it names.</summary>
    public static BatchOutcome Outcome(BatchRecord batch, params Flag[] flags) => new(
        batch,
        [
            Step("S1", 94.0, flags.Where(f => f.Step == "S1").ToList()),
            Step("S2", 77.0, flags.Where(f => f.Step == "S2").ToList()),
        ],
        new DateTimeOffset(2026, 11, 23, 15, 30, 0, TimeSpan.Zero));

    public static BatchIngest Ingest(BatchRecord batch, DateOnly day, params Flag[] flags) => new(Outcome(batch, flags), day);

    public static FileIngest File(string name, params BatchIngest[] batches) =>
        FileIngest.Accepted(name, Sha(name), ReceivedAt, batches);

    public static FileIngest Quarantined(string name, int errors)
    {
        var list = Enumerable.Range(1, errors)
            .Select(i => new ExportError(name, i + 1, "quantity", "1,5", "a decimal comma is not allowed; write 1.5"))
            .ToList();
        return FileIngest.Quarantined(name, Sha(name), ReceivedAt, list, string.Join("\n", list));
    }

    /// <summary>A stand-in for a file's SHA-256: the digest of its name (test files have distinct names).</summary>
    public static string Sha(string text) => Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(text)));
}
