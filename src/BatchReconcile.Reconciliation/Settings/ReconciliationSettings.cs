using System.ComponentModel.DataAnnotations;
using BatchReconcile.Records.Definitions;

namespace BatchReconcile.Reconciliation.Settings;

/// <summary>The site's settings for reconciliation (section <c>Reconciliation</c> of appsettings.json).</summary>
public sealed class ReconciliationSettings
{
    /// <summary>Relative standard uncertainty of a weighing, e.g. 0.001 for 0.1 % of the reading.</summary>
    [Range(0.0, 0.5)]
    public double BalanceRelativeUncertainty { get; set; } = 0.001;

    /// <summary>Absolute standard uncertainty of a weighing in kg (readability, tare).</summary>
    [Range(0.0, 1000.0)]
    public double BalanceAbsoluteUncertaintyKg { get; set; } = 0.05;

    /// <summary>Coverage factor for the balance decision (k = 2: about 95 %, GUM).</summary>
    [Range(1.0, 5.0)]
    public double CoverageFactor { get; set; } = 2.0;

    /// <summary>Product found in waste streams, as % of theoretical, above which a flag is raised.</summary>
    [Range(0.0, 100.0)]
    public double ProductInWasteMaxPct { get; set; } = 2.0;

    /// <summary>Severity of each flag code at this site; codes not listed keep the defaults.</summary>
    public Dictionary<string, string> Severities { get; set; } = new(StringComparer.OrdinalIgnoreCase);

    /// <summary>The default severities (docs/computation.md).</summary>
    public static FlagSeverity DefaultSeverity(FlagCode code) => code switch
    {
        FlagCode.YieldOverTheory or FlagCode.BalanceSurplus or FlagCode.ReactantMissing => FlagSeverity.Critical,
        FlagCode.EquivalentsOutOfRange or FlagCode.ProductInWaste => FlagSeverity.Minor,
        FlagCode.RecipeVersionUnstated => FlagSeverity.Major,
        _ => FlagSeverity.Major,
    };
}
