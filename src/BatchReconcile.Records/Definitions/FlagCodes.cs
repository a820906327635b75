using System.Diagnostics.CodeAnalysis;

namespace BatchReconcile.Records.Definitions;

/// <summary>Text forms of <see cref="FlagCode"/> and <see cref="FlagSeverity"/> (kebab-case, lower-case).</summary>
public static class FlagCodes
{
    private static readonly (FlagCode Code, string Text)[] Codes =
    [
        (FlagCode.YieldLow, "yield-low"),
        (FlagCode.YieldHigh, "yield-high"),
        (FlagCode.YieldOverTheory, "yield-over-theory"),
        (FlagCode.BalanceGap, "balance-gap"),
        (FlagCode.BalanceSurplus, "balance-surplus"),
        (FlagCode.EquivalentsOutOfRange, "equivalents-out-of-range"),
        (FlagCode.ReactantMissing, "reactant-missing"),
        (FlagCode.StepMissing, "step-missing"),
        (FlagCode.ProductInWaste, "product-in-waste"),
        (FlagCode.IntermediateOverdrawn, "intermediate-overdrawn"),
        (FlagCode.RecipeVersionUnstated, "recipe-version-unstated"),
    ];

    public static IEnumerable<FlagCode> All => Codes.Select(c => c.Code);

    public static string ToText(this FlagCode code) => Codes.First(c => c.Code == code).Text;

    public static bool TryParse(string? text, out FlagCode code)
    {
        foreach (var (c, t) in Codes)
        {
            if (string.Equals(t, text?.Trim(), StringComparison.OrdinalIgnoreCase))
            {
                code = c;
                return true;
            }
        }

        code = default;
        return false;
    }

    public static string ToText(this FlagSeverity severity) => severity switch
    {
        FlagSeverity.Critical => "critical",
        FlagSeverity.Major => "major",
        FlagSeverity.Minor => "minor",
        _ => throw new ArgumentOutOfRangeException(nameof(severity), severity, null),
    };

    public static bool TryParseSeverity(string? text, [NotNullWhen(true)] out FlagSeverity? severity)
    {
        severity = text?.Trim().ToLowerInvariant() switch
        {
            "critical" => FlagSeverity.Critical,
            "major" => FlagSeverity.Major,
            "minor" => FlagSeverity.Minor,
            _ => null,
        };
        return severity is not null;
    }
}
