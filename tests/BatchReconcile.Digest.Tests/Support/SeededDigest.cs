using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Digest.Model;
using BatchReconcile.Records.Definitions;

namespace BatchReconcile.Digest.Tests.Support;

/// <summary>
/// One seeded production day: 4 batches, 9 steps, 7 flags (2 critical, 3 major, 2 minor) on 3 steps, 3 older flags
/// still open (counted 4, listed 3), and yield histories for 2 recipe steps. Made-up figures for the tests only.
/// </summary>
internal static class SeededDigest
{
    public static readonly DateOnly Day = new(2026, 11, 25);

    // The expected order of the exception list: severity, batch (digits as numbers), step, code.
    public static readonly long[] ExpectedOrder = [107, 103, 101, 105, 102, 106, 104];

    public static DigestData Create(string batchPrefix = "B-26-", string siteName = "North Plant", string? nastyText = null)
    {
        string B(int n) => batchPrefix + n.ToString(System.Globalization.CultureInfo.InvariantCulture);
        var day = new DigestDay(Day, "Europe/Berlin",
            new DateTimeOffset(2026, 11, 25, 6, 0, 0, TimeSpan.FromHours(1)),
            new DateTimeOffset(2026, 11, 26, 6, 0, 0, TimeSpan.FromHours(1)));

        var exceptions = new List<DigestException>
        {
            new(101, FlagSeverity.Major, B(9), 1, "PX-204", "S2", FlagCode.YieldLow, 81.4, 88.0, "%",
                nastyText ?? "Yield 81.4 % is below the step's minimum of 88.0 %; check the isolation and the weighing of the product.", ReviewStatus.Open),
            new(102, FlagSeverity.Major, B(10), 1, "PX-204", "S10", FlagCode.BalanceGap, 42.5, 18.0, "kg",
                "42.5 kg of the charged mass is not accounted for, beyond the 2.0 % tolerance and 2u.", ReviewStatus.InReview),
            new(103, FlagSeverity.Critical, B(10), 1, "PX-204", "S2", FlagCode.YieldOverTheory, 103.2, 100.0, "%",
                "Yield 103.2 % is above theory: the product may be wet or impure, or a weighing is wrong.", ReviewStatus.Open),
            new(104, FlagSeverity.Minor, B(10), 1, "PX-204", "S2", FlagCode.ProductInWaste, 2.6, 2.0, "%",
                "2.6 % of theoretical product was found in the mother liquor.", ReviewStatus.Closed(CloseOutcome.Explained)),
            new(105, FlagSeverity.Major, B(10), 1, "PX-204", "S2", FlagCode.BalanceGap, 12.1, 9.0, "kg",
                "12.1 kg is unaccounted for after allowing the vented CO2 and isobutylene.", ReviewStatus.Open),
            new(106, FlagSeverity.Minor, B(9), 1, "PX-204", "S2", FlagCode.EquivalentsOutOfRange, 1.32, 1.2, "equiv",
                "Coupling reagent charged at 1.32 equiv, above the allowed 1.20.", ReviewStatus.Open, Subject: "HATU"),
            new(107, FlagSeverity.Critical, B(9), 2, "PX-204", "S1", FlagCode.BalanceSurplus, -6.3, 4.0, "kg",
                "Outputs exceed inputs by 6.3 kg; a charge may be missing from the record.", ReviewStatus.Open),
        };

        var flagged = new List<FlaggedStep>
        {
            new(B(10), 1, "PX-204", Steps.Outcome("S2", massIn: 1250, reactant: 310, recovered: 640, stoich: 290, theory: 205, actual: 211.6,
                inWaste: 5.3, inSamples: 0.4, massOut: 1201.2, vented: 36.7, ventedMax: 37.5, u: 1.9, k: 2.0, tolerance: 2.0)),
            new(B(9), 1, "PX-204", Steps.Outcome("S2", massIn: 48.25, reactant: 12.5, recovered: 20.1, stoich: 11.2, theory: 8.4, actual: 6.84,
                inWaste: 0.3, inSamples: 0.05, massOut: 47.9, vented: 0, ventedMax: 0, u: 0.07, k: 2.0, tolerance: 1.5)),
            new(B(9), 2, "PX-204", Steps.Outcome("S1", massIn: 820, reactant: 240, recovered: 300, stoich: 226, theory: 180, actual: 168,
                inWaste: 2, inSamples: 0.5, massOut: 826.3, vented: 0, ventedMax: 0, u: 1.2, k: 2.0, tolerance: 0.5)),
        };

        var open = new List<OpenFlagItem>
        {
            new(61, B(3), "S2", FlagCode.YieldLow, FlagSeverity.Major, new DateOnly(2026, 11, 20), 5, ReviewStatus.InReview),
            new(48, B(1), "S1", FlagCode.StepMissing, FlagSeverity.Major, new DateOnly(2026, 11, 13), 12, ReviewStatus.Open),
            new(77, B(5), "S10", FlagCode.ReactantMissing, FlagSeverity.Critical, new DateOnly(2026, 11, 24), 1, ReviewStatus.Open),
        };

        var yields = new List<RecipeStepYields>
        {
            new("PX-204", "S2", "Boc removal and isolation", 88.0, 98.0, History(B, 28, [92.1, 90.4, 95.0, 89.9, 93.3], [81.4, 103.2])),
            new("PX-204", "S1", "Amide coupling", 85.0, 96.0, History(B, 12, [90.0, 91.2, 88.7], [93.3])),
        };

        return new DigestData(siteName, day, new DateTimeOffset(2026, 11, 26, 7, 30, 0, TimeSpan.FromHours(1)),
            BatchesCompleted: 4, StepsReconciled: 9, OpenEarlierCount: 4, open, exceptions, flagged, yields);
    }

    public static DigestDay DayOf(DateOnly day, DateTimeOffset start, DateTimeOffset end) => new(day, "Europe/Berlin", start, end);

    private static List<YieldPoint> History(Func<int, string> batch, int earlier, double[] pattern, double[] today)
    {
        var points = new List<YieldPoint>();
        for (var i = 0; i < earlier; i++)
        {
            // One batch without a computable yield, to check the line breaks there.
            double? yield = i == 4 ? null : pattern[i % pattern.Length];
            points.Add(new YieldPoint(batch(100 + i), Day.AddDays(-earlier + i), yield, false));
        }

        points.AddRange(today.Select((y, i) => new YieldPoint(batch(9 + i), Day, y, true)));
        return points;
    }
}
