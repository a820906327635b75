using System.Globalization;
using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Records;
using BatchReconcile.Records.Definitions;

namespace BatchReconcile.Cli;

/// <summary>The plain-text view of a reconciled batch, for <c>check</c> and <c>batches show</c>.</summary>
public static class BatchText
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    public static void Write(TextWriter o, BatchOutcome batch, DateOnly day) =>
        Write(o, Header(batch.Batch.BatchId, batch.Batch.RecipeCode, batch.Batch.RecipeVersion, day, null), batch.Batch.Warnings, batch.Steps.Select(s => (s, (IReadOnlyList<(Flag, long?)>)s.Flags.Select(f => (f, (long?)null)).ToList())));

    public static string Header(string batch, string recipe, int version, DateOnly day, string? revision) =>
        string.Create(Inv, $"batch {SafeText.Escape(batch)}: recipe {SafeText.Escape(recipe)} v{version}{revision}, production day {day:yyyy-MM-dd}");

    /// <param name="steps">Each step with its flags and their stored ids (null when not stored).</param>
    public static void Write(TextWriter o, string header, IEnumerable<string> notes, IEnumerable<(StepOutcome Step, IReadOnlyList<(Flag Flag, long? Id)> Flags)> steps)
    {
        o.WriteLine(header);
        foreach (var note in notes)
        {
            o.WriteLine($"  note: {SafeText.Escape(note)}");
        }

        foreach (var (s, flags) in steps)
        {
            o.WriteLine($"  step {SafeText.Escape(s.Step)}{(s.HasRows ? string.Empty : " (no rows)")}");
            o.WriteLine(string.Create(Inv, $"    limiting reactant {s.LimitingReactant ?? "-"}; theoretical {Kg(s.TheoreticalKg)}, actual {Kg(s.ActualKg)}, yield {Pct(s.YieldPct)}"));
            o.WriteLine(string.Create(Inv, $"    atom economy {Pct(s.AtomEconomyPct)}, SF {Num(s.StoichiometricFactor)}, RME {Pct(s.RmePct)}, PMI {Num(s.Pmi)}, cEF {Num(s.CompleteEFactor)}, sEF {Num(s.SimpleEFactor)}"));
            o.WriteLine(string.Create(Inv, $"    mass in {Kg(s.MassInKg)}, out {Kg(s.MassOutKg)}, vented {Kg(s.VentedKg)}, gap {Kg(s.GapKg)}, closure {Pct(s.ClosurePct)} (2u ≈ {Kg(2 * s.CombinedUncertaintyKg)})"));
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

    private static string Kg(double? v) => v is { } x ? string.Create(Inv, $"{x:F3} kg") : "-";

    private static string Pct(double? v) => v is { } x ? string.Create(Inv, $"{x:F2} %") : "-";

    private static string Num(double? v) => v is { } x ? x.ToString("0.###", Inv) : "-";
}
