using BatchReconcile.Chemistry.Metrics;

namespace BatchReconcile.Chemistry.Tests.Metrics;

/// <summary>
/// Molar masses used by the metric tests, summed by hand from CIAAW 2021 abridged standard atomic
/// weights (H 1.008, C 12.011, N 14.007, O 15.999, S 32.06, Cl 35.45), and small builders.
/// </summary>
internal static class Chem
{
    public const double NitroToluene = 137.138; // C7H7NO2: 7*12.011 + 7*1.008 + 14.007 + 2*15.999 = 84.077 + 7.056 + 14.007 + 31.998
    public const double Hydrogen = 2.016;       // H2: 2*1.008
    public const double Toluidine = 107.156;    // C7H9N: 84.077 + 9.072 + 14.007
    public const double Water = 18.015;         // H2O: 2.016 + 15.999

    public const double BocBenzylamine = 207.273;   // C12H17NO2: 144.132 + 17.136 + 14.007 + 31.998
    public const double HydrogenChloride = 36.458;  // HCl: 1.008 + 35.45
    public const double BenzylamineHcl = 143.614;   // C7H10ClN: 84.077 + 10.080 + 35.45 + 14.007
    public const double CarbonDioxide = 44.009;     // CO2: 12.011 + 31.998
    public const double Isobutylene = 56.108;       // C4H8: 48.044 + 8.064

    public const double BenzoicAcid = 122.123;  // C7H6O2: 84.077 + 6.048 + 31.998
    public const double Ethanol = 46.069;       // C2H6O: 24.022 + 6.048 + 15.999
    public const double EthylBenzoate = 150.177; // C9H10O2: 108.099 + 10.080 + 31.998
    public const double SulfuricAcid = 98.072;  // H2SO4: 2.016 + 32.06 + 63.996

    public static ReactionTerm T(string code, double nu, double molarMass) => ReactionTerm.Create(code, nu, molarMass);

    /// <summary>Boc-benzylamine + HCl -> benzylamine·HCl + CO2 + isobutylene (CO2 and isobutylene vented).</summary>
    public static StepReaction BocDeprotection() => StepReaction.Create(
        [T("BOCBN", 1, BocBenzylamine), T("HCL", 1, HydrogenChloride)],
        T("BNAHCL", 1, BenzylamineHcl),
        [T("CO2", 1, CarbonDioxide), T("IBUT", 1, Isobutylene)]);

    /// <summary>4-nitrotoluene + 3 H2 -> p-toluidine + 2 H2O.</summary>
    public static StepReaction NitroReduction() => StepReaction.Create(
        [T("NT", 1, NitroToluene), T("H2", 3, Hydrogen)],
        T("TOL", 1, Toluidine));

    /// <summary>Benzoic acid + ethanol -> ethyl benzoate + water.</summary>
    public static StepReaction Esterification() => StepReaction.Create(
        [T("BZOH", 1, BenzoicAcid), T("ETOH", 1, Ethanol)],
        T("ETBZ", 1, EthylBenzoate));

    /// <summary>Tight balance settings so hand cases are judged by tolerance unless a test says otherwise.</summary>
    public static BalanceCheckSettings Balance(double tolerancePct = 1.0, double relative = 0.0005, double absoluteKg = 0.05) =>
        BalanceCheckSettings.Create(tolerancePct, relative, absoluteKg);

    public static void AssertClose(double expected, double? actual, double relativeTolerance, string what)
    {
        Assert.True(actual.HasValue, $"{what}: expected {expected}, got null");
        double scale = Math.Max(1.0, Math.Abs(expected));
        Assert.True(
            Math.Abs(actual!.Value - expected) <= relativeTolerance * scale,
            FormattableString.Invariant($"{what}: expected {expected}, got {actual.Value}"));
    }
}
