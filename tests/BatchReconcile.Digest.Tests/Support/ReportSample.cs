using BatchReconcile.Digest.Model.Report;

namespace BatchReconcile.Digest.Tests.Support;

/// <summary>
/// A report of an invented three-step recipe for the renderer and browser tests. The limits are worked out here from the
/// values (x̄ and MR̄/1.128 over the baseline); the signals are set by hand on the points that break a rule, since the
/// renderer draws what it is given and judges nothing.
/// </summary>
public static class ReportSample
{
    public const string Recipe = "TST-300";

    public static ReportData Create(string siteName = "Kestrel Bay Fine Chemicals, Building 3")
    {
        // S1: 30 batches, v1 then v2 from the 21st; the last batch drops far below (rule-1).
        double[] s1 = [92.1, 91.4, 92.8, 91.9, 92.5, 90.9, 92.2, 91.7, 92.9, 91.5, 92.0, 91.2, 92.6, 91.8, 92.3, 91.1, 92.7, 91.6, 92.4, 91.9,
                       92.2, 91.8, 92.5, 92.0, 91.7, 92.3, 91.9, 92.1, 91.6, 85.0];
        var s1Signals = new Dictionary<int, string[]> { [29] = ["rule-1"] };
        // S2: a run above the centre line at the end (nine in a row: rule-2 on the 9th and after).
        double[] s2 = [88.0, 87.1, 88.6, 87.4, 88.2, 87.0, 88.4, 87.6, 88.1, 87.3, 88.5, 87.2, 88.3, 87.5, 87.9, 87.7, 88.0, 87.4,
                       88.6, 88.7, 88.5, 88.9, 88.4, 88.8, 88.6, 88.5, 89.0, 88.7];
        var s2Signals = new Dictionary<int, string[]>
        {
            [26] = ["rule-2"],
            [27] = ["rule-2", "rule-5"],
        };

        var trends = new List<StepTrend>
        {
            Trend("S1", "esterification", s1, s1Signals, 20, 85.0, 98.0) with { Context = "1st of the last 5 batches below the centre line" },
            Trend("S2", "hydrazinolysis", s2, s2Signals, 20, 80.0, 95.0),
            new("S3", "cyclisation", "yield", "%", [Point(0, 90.0, null, 1)], null, "step S3: not enough points for a control chart (1 value; the baseline needs at least 2)"),
        };

        var losses = new LossSummary(30, 52_000, Shares(
        [
            ("S1", "auxiliaries-not-recovered", "solvents, catalysts and work-up not recovered", null, 21_000.0),
            ("S2", "auxiliaries-not-recovered", "solvents, catalysts and work-up not recovered", null, 9_000.0),
            ("S1", "co-products", "co-products of the equation (atom-economy loss)", null, 2_400.0),
            ("S2", "excess-reactants", "reactants charged in excess", null, 1_800.0),
            ("S2", "yield-loss-unexplained", "yield loss: not accounted for", null, 950.0),
            ("S1", "yield-loss-product-in-waste", "yield loss: product found in waste streams", null, 410.0),
            ("S3", "yield-loss-unexplained", "yield loss: not accounted for", null, -12.0),
        ]))
        {
            Parts =
            [
                new("S1", "auxiliaries-not-recovered", "ETOH", 15_000, 100.0 * 15_000 / 52_000, 100.0 * 15_000 / 21_000),
                new("S1", "auxiliaries-not-recovered", "TOL", 6_000, 100.0 * 6_000 / 52_000, 100.0 * 6_000 / 21_000),
                new("S2", "excess-reactants", "N2H4H2O", 1_800, 100.0 * 1_800 / 52_000, 100),
            ],
        };

        var comparison = new VersionComparison(1, 2,
        [
            new("S1", "esterification",
                new VersionFigures(1, 20, 91.98, 91.63, 92.33, 84.3, 71.2, 5.41, 4.41, 0.42, 61.0, 5.0),
                new VersionFigures(2, 10, 91.30, 89.88, 92.72, 84.3, 70.6, 5.38, 4.38, 0.43, null, 10.0),
                new YieldDifference(-0.68, -2.13, 0.77, -1.04, 9.6, 0.32),
                "no difference shown at the 5 % level (p = 0.32)"),
            new("route", "whole route",
                new VersionFigures(1, 20, 73.4, 72.0, 74.8, null, null, 18.2, 17.2, null, null, 5.0),
                new VersionFigures(2, 2, 71.0, null, null, null, null, 18.9, 17.9, null, null, 0.0),
                null,
                "too few batches to conclude (n < 3)"),
        ]);

        return new ReportData(siteName, Recipe, new DateOnly(2026, 10, 1), new DateOnly(2026, 11, 30), new DateTimeOffset(2026, 12, 1, 7, 30, 0, TimeSpan.FromHours(1)), trends, losses, comparison)
        {
            RuleDescriptions = new Dictionary<string, string>(StringComparer.Ordinal)
            {
                ["rule-1"] = "one point more than 3 sigma from the centre line",
                ["rule-2"] = "nine points in a row on the same side of the centre line",
                ["rule-5"] = "two of three points in a row more than 2 sigma from the centre line, on the same side",
            },
        };
    }

    private static StepTrend Trend(string step, string name, double[] values, Dictionary<int, string[]> signals, int baseline, double specMin, double specMax)
    {
        var points = values.Select((v, i) => Point(i, v, i == 0 ? null : Math.Abs(v - values[i - 1]), i < 20 ? 1 : 2, signals.GetValueOrDefault(i) ?? [])).ToList();
        var mean = values.Take(baseline).Average();
        var mrBar = Enumerable.Range(1, baseline - 1).Average(i => Math.Abs(values[i] - values[i - 1]));
        var sigma = mrBar / 1.128;
        var limits = new TrendLimits(mean, sigma, mean + (3 * sigma), mean - (3 * sigma), mrBar, 3.267 * mrBar, 0, baseline);
        return new StepTrend(step, name, "yield", "%", points, limits, null) { SpecMin = specMin, SpecMax = specMax };
    }

    private static TrendPoint Point(int i, double value, double? mr, int version, string[]? signals = null) =>
        new($"KB3-TS-{101 + i}", new DateOnly(2026, 10, 1).AddDays(i * 2), version, value, mr, signals ?? []);

    private static List<LossRow> Shares(IEnumerable<(string Step, string Key, string Label, string? Material, double Kg)> rows)
    {
        var list = rows.ToList();
        var total = list.Where(r => r.Kg > 0).Sum(r => r.Kg);
        var cumulative = 0.0;
        return list.Select(r =>
        {
            var share = r.Kg > 0 ? 100 * r.Kg / total : 0;
            cumulative += share;
            return new LossRow(r.Step, r.Key, r.Label, r.Material, r.Kg, 100 * r.Kg / 52_000, share, r.Kg > 0 ? cumulative : 0);
        }).ToList();
    }
}
