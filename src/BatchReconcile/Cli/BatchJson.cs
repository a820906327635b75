using BatchReconcile.Chemistry.Metrics;
using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Records.Exports;
using BatchReconcile.Storage.Queries;

namespace BatchReconcile.Cli;

/// <summary>The JSON shapes of <c>batches show</c> and <c>check</c> (docs/cli.md).</summary>
public static class BatchJson
{
    public sealed record FlagJson(long? Id, string Code, string Severity, string Message, double? Measured, double? Limit, string Unit, string? Subject);

    public sealed record StepJson(
        string Step,
        string? LimitingReactant,
        double? TheoreticalKg,
        double ActualKg,
        double? YieldPct,
        double AtomEconomyPct,
        double? StoichiometricFactor,
        double? RmePct,
        double? Pmi,
        double? CompleteEFactor,
        double? SimpleEFactor,
        double MassInKg,
        double MassOutKg,
        double VentedKg,
        double GapKg,
        double? ClosurePct,
        double CombinedUncertaintyKg,
        IReadOnlyDictionary<string, double> Equivalents,
        IReadOnlyList<LadderJson> Ladder,
        IReadOnlyList<FlagJson> Flags,
        LimitsJson Limits,
        double? SolventInKg,
        double? WaterInKg);

    /// <summary>The limits and settings that decided the step's flags, as stored with it; null is unknown (never 0).</summary>
    public sealed record LimitsJson(
        double? YieldMinPct,
        double? YieldMaxPct,
        double? BalanceTolerancePct,
        double? CoverageFactor,
        double? ExpandedUncertaintyKg,
        IReadOnlyDictionary<string, RangeJson>? EquivalentsRanges,
        double? ProductInWasteMaxPct);

    public sealed record RangeJson(double Min, double Max);

    /// <summary>One problem of an export file, as <c>ingest --json</c> and <c>check --json</c> print it.</summary>
    public sealed record ErrorJson(int Line, string Column, string Value, string Message)
    {
        public static ErrorJson From(ExportError e) => new(e.Line, e.Column, e.Value, e.Reason);
    }

    /// <param name="Parts">Per material where the rung is tied to materials; empty otherwise and for rungs stored before parts were kept.</param>
    public sealed record LadderJson(string Rung, string Label, double Kg, double PctOfCharged, IReadOnlyList<LadderPart> Parts);

    public sealed record BatchShowJson(
        string Batch,
        int Revision,
        string Recipe,
        int RecipeVersion,
        string? RecipeVersionSource,
        string ProductionDay,
        bool Current,
        int Revisions,
        string SourceFile,
        IReadOnlyList<FlagJson> Flags,
        IReadOnlyList<StepJson> Steps,
        double? RouteYieldPct,
        double? RouteTheoreticalKg,
        string? RouteYieldNote,
        IReadOnlyList<LinkJson>? Intermediates);

    /// <summary>A later step charging an earlier step's product; state "overdrawn", "held-back" or "matched".</summary>
    public sealed record LinkJson(string Material, string FromStep, string ToStep, double IsolatedKg, double AvailableKg, double ChargedKg, double HeldBackKg, double TolerancePct, string State);

    public static LinkJson Link(IntermediateLink l) => new(
        l.Material, l.FromStep, l.ToStep, Round(l.IsolatedKg), Round(l.AvailableKg), Round(l.ChargedKg), Round(l.HeldBackKg), Round(l.TolerancePct), l.State);

    public static double? RoundPct(double? value) => Round(value);

    public static BatchShowJson From(BatchView view)
    {
        var steps = view.Steps.Select(s => Step(s.Outcome, s.Flags.Select(f => Flag(f.Flag, f.Id)).ToList())).ToList();
        return new BatchShowJson(
            view.BatchId,
            view.Revision,
            view.Recipe,
            view.RecipeVersion,
            view.RecipeVersionSource?.ToText(),
            view.ProductionDay.ToString("yyyy-MM-dd", System.Globalization.CultureInfo.InvariantCulture),
            view.IsCurrent,
            view.RevisionCount,
            view.SourceFile,
            steps.SelectMany(s => s.Flags).ToList(),
            steps,
            Round(view.Route.YieldPct),
            Round(view.Route.TheoreticalKg),
            view.Route.Reason,
            view.Links?.Select(Link).ToList());
    }

    public static FlagJson Flag(Flag flag, long? id) =>
        new(id, flag.Code.ToText(), flag.Severity.ToText(), flag.Message, Round(flag.Measured), Round(flag.Limit), flag.Unit, flag.Subject);

    public static StepJson Step(StepOutcome s, IReadOnlyList<FlagJson> flags) => new(
        s.Step,
        s.LimitingReactant,
        Round(s.TheoreticalKg),
        Round(s.ActualKg),
        Round(s.YieldPct),
        Round(s.AtomEconomyPct),
        Round(s.StoichiometricFactor, 4),
        Round(s.RmePct),
        Round(s.Pmi, 4),
        Round(s.CompleteEFactor, 4),
        Round(s.SimpleEFactor, 4),
        Round(s.MassInKg),
        Round(s.MassOutKg),
        Round(s.VentedKg),
        Round(s.GapKg),
        Round(s.ClosurePct),
        Round(s.CombinedUncertaintyKg, 4),
        s.Equivalents.ToDictionary(e => e.Key, e => Round(e.Value, 4)),
        s.Ladder.Select(r => new LadderJson(r.Key, r.Label, Round(r.Kg), Round(r.PctOfCharged), r.Parts.Select(p => p with { Kg = Round(p.Kg) }).ToList())).ToList(),
        flags,
        new LimitsJson(
            s.Limits.YieldMinPct,
            s.Limits.YieldMaxPct,
            s.Limits.BalanceTolerancePct,
            s.Limits.CoverageFactor,
            Round(s.Limits.ExpandedUncertaintyKg, 4),
            s.Limits.EquivalentsRanges?.OrderBy(e => e.Key, StringComparer.Ordinal).ToDictionary(e => e.Key, e => new RangeJson(e.Value.Min, e.Value.Max)),
            s.Limits.ProductInWasteMaxPct),
        Round(s.SolventInKg),
        Round(s.WaterInKg));

    /// <summary>Masses to 0.001 kg and percentages to 0.001 %: enough for a balance read to 1 g, without binary noise.</summary>
    private static double Round(double value, int digits = 3) => Rounding.To(value, digits);

    private static double? Round(double? value, int digits = 3) => value is { } v ? Round(v, digits) : null;
}
