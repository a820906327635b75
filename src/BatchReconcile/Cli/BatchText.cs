using System.Globalization;
using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Records;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Records.Exports;

namespace BatchReconcile.Cli;

/// <summary>The plain-text view of a reconciled batch, for <c>check</c> and <c>batches show</c>.</summary>
public static class BatchText
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    public static void Write(TextWriter o, BatchOutcome batch, DateOnly day)
    {
        Write(o, Header(batch.Batch.BatchId, batch.Batch.RecipeCode, batch.Batch.RecipeVersion, batch.Batch.RecipeVersionSource, day, null), batch.Batch.Warnings, batch.Steps.Select(s => (s, (IReadOnlyList<(Flag, long?)>)s.Flags.Select(f => (f, (long?)null)).ToList())));
        WriteRoute(o, batch.Route, batch.Links);
    }

    /// <summary>The batch's step links and route yield (docs/computation.md, "Steps of one batch").</summary>
    /// <param name="links">Null for a revision stored before links were kept.</param>
    public static void WriteRoute(TextWriter o, RouteYield route, IReadOnlyList<IntermediateLink>? links)
    {
        if (links is null)
        {
            o.WriteLine("  intermediates: not recorded (stored before step links were kept)");
        }
        else
        {
            foreach (var l in links)
            {
                var what = l.State switch
                {
                    "overdrawn" => string.Create(Inv, $"overdrawn by {l.ChargedKg - l.AvailableKg:F3} kg (flagged)"),
                    "held-back" => string.Create(Inv, $"held back {l.HeldBackKg:F3} kg (carried over, not flagged)"),
                    _ => "matched",
                };
                var available = l.AvailableKg < l.IsolatedKg ? string.Create(Inv, $" ({l.AvailableKg:F3} kg left)") : string.Empty;
                o.WriteLine(string.Create(Inv, $"  intermediate {l.Material}: {l.FromStep} isolated {l.IsolatedKg:F3} kg{available}, {l.ToStep} charged {l.ChargedKg:F3} kg: {what}"));
            }
        }

        o.WriteLine(route.YieldPct is { } y
            ? string.Create(Inv, $"  route yield {y:F2} % (theoretical {Kg(route.TheoreticalKg)} from the first step's limiting reactant)")
            : $"  route yield: not computable ({route.Reason})");
    }

    /// <param name="source">How the version was chosen; null when unknown (stored before it was recorded).</param>
    public static string Header(string batch, string recipe, int version, RecipeVersionSource? source, DateOnly day, string? revision) =>
        string.Create(Inv, $"batch {SafeText.Escape(batch)}: recipe {SafeText.Escape(recipe)} v{version}{revision}, production day {day:yyyy-MM-dd}; recipe version source: {source?.ToText() ?? "unknown"}");

    /// <param name="steps">Each step with its flags and their stored ids (null when not stored).</param>
    /// <param name="writeHeader">False leaves out the header line (<c>flags show</c> prints its own).</param>
    public static void Write(TextWriter o, string header, IEnumerable<string> notes, IEnumerable<(StepOutcome Step, IReadOnlyList<(Flag Flag, long? Id)> Flags)> steps, bool writeHeader = true)
    {
        if (writeHeader)
        {
            o.WriteLine(header);
        }

        foreach (var note in notes)
        {
            o.WriteLine($"  note: {SafeText.Escape(note)}");
        }

        foreach (var (s, flags) in steps)
        {
            o.WriteLine($"  step {SafeText.Escape(s.Step)}{(s.HasRows ? string.Empty : " (no rows)")}");
            o.WriteLine(string.Create(Inv, $"    limiting reactant {s.LimitingReactant ?? "-"}; theoretical {Kg(s.TheoreticalKg)}, actual {Kg(s.ActualKg)}, yield {Pct(s.YieldPct)}"));
            if (s.HasRows && s.LimitingReactant is null)
            {
                o.WriteLine($"    {Digest.Rendering.DigestText.NotComputable}");
            }

            o.WriteLine(string.Create(Inv, $"    atom economy {Pct(s.AtomEconomyPct)}, SF {Num(s.StoichiometricFactor)}, RME {Pct(s.RmePct)}, PMI {Num(s.Pmi)}, cEF {Num(s.CompleteEFactor)}, sEF {Num(s.SimpleEFactor)}"));
            o.WriteLine(string.Create(Inv, $"    mass in {Kg(s.MassInKg)}, out {Kg(s.MassOutKg)}, vented {Kg(s.VentedKg)}, gap {Kg(s.GapKg)}, closure {Pct(s.ClosurePct)} (U {Known(Kg(s.Limits.ExpandedUncertaintyKg))}, k {Known(Num(s.Limits.CoverageFactor))})"));
            o.WriteLine(Limits(s.Limits));
            foreach (var rung in s.Ladder)
            {
                o.WriteLine(string.Create(Inv, $"      {SafeText.Escape(rung.Label),-48} {rung.Kg,12:F3} kg {rung.PctOfCharged,8:F2} %"));
            }

            foreach (var (flag, flagId) in flags)
            {
                var id = flagId is { } n ? string.Create(Inv, $"#{n} ") : string.Empty;
                o.WriteLine($"    {id}{flag.Severity.ToText().ToUpperInvariant()} {flag.Code.ToText()}: {SafeText.Escape(flag.Message)}");
            }
        }
    }

    /// <summary>The limits the step was judged by, as stored: "unknown" where they were not kept, never 0.</summary>
    private static string Limits(StepLimits l)
    {
        var yield = l.YieldMinPct is null && l.YieldMaxPct is null ? "unknown" : $"{Limit(l.YieldMinPct)} to {Limit(l.YieldMaxPct)} %";
        var equivalents = l.EquivalentsRanges is not { } ranges ? "unknown"
            : ranges.Count == 0 ? "none"
            : string.Join(", ", ranges.OrderBy(e => e.Key, StringComparer.Ordinal).Select(e => string.Create(Inv, $"{e.Key} {e.Value.Min:0.0##} to {e.Value.Max:0.0##}")));
        return $"    limits: yield {yield}, balance tolerance {Limit(l.BalanceTolerancePct)}{(l.BalanceTolerancePct is null ? "" : " %")}, product in waste {Limit(l.ProductInWasteMaxPct)}{(l.ProductInWasteMaxPct is null ? "" : " %")}, equivalents {equivalents}";
    }

    private static string Limit(double? v) => v is { } x ? x.ToString("0.###", Inv) : "unknown";

    private static string Known(string text) => text == "-" ? "unknown" : text;

    private static string Kg(double? v) => v is { } x ? string.Create(Inv, $"{x:F3} kg") : "-";

    private static string Pct(double? v) => v is { } x ? string.Create(Inv, $"{x:F2} %") : "-";

    private static string Num(double? v) => v is { } x ? x.ToString("0.###", Inv) : "-";
}
