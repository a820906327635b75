using System.Globalization;
using System.Text.Json;
using System.Text.Json.Nodes;
using BatchReconcile.Analysis.Statistics;
using BatchReconcile.Analysis.Trends;
using BatchReconcile.Chemistry.Tests.Oracle;

namespace BatchReconcile.Analysis.Tests.Oracle;

/// <summary>
/// Cross-checks means, sample standard deviations, t quantiles, Student t intervals, Welch's test and I-MR
/// limits on 240 seeded random data sets against tests/oracle/statistics.js: npm simple-statistics 7.12.1
/// and jstat 1.9.6 (exact versions in tests/oracle/package-lock.json) for the sample statistics, and for
/// the t distribution a tanh-sinh quadrature of the tail started from jstat's quantile (jstat's own t
/// functions are good to about 1e-7 only; they are held to 1e-6 here). Agreement to 1e-9 relative.
/// </summary>
public class StatisticsOracleTests
{
    private const double Tolerance = 1e-9;
    private const double JstatTolerance = 1e-6;
    private const int Cases = 240;

    [Fact]
    public void Agrees_with_the_node_oracle_on_240_random_data_sets()
    {
        var random = new Random(20261211);
        var cases = Enumerable.Range(0, Cases).Select(i => MakeCase(random, i)).ToList();
        var input = new JsonObject
        {
            ["cases"] = new JsonArray(cases.Select(c => (JsonNode)new JsonObject
            {
                ["a"] = new JsonArray(c.A.Select(v => (JsonNode)v).ToArray()),
                ["b"] = new JsonArray(c.B.Select(v => (JsonNode)v).ToArray()),
                ["confidence"] = c.Confidence,
                ["baselineStart"] = c.BaselineStart,
                ["baselineCount"] = c.BaselineCount,
            }).ToArray()),
        };

        using var output = JsonDocument.Parse(NodeOracle.Run("statistics.js", "simple-statistics", input.ToJsonString()));
        var results = output.RootElement.EnumerateArray().ToList();
        Assert.Equal(Cases, results.Count);

        var failures = new List<string>();
        var checks = 0;
        for (var i = 0; i < Cases; i++)
        {
            var c = cases[i];
            var r = results[i];
            void Check(string name, double ours, double theirs, double scale, double tolerance = Tolerance)
            {
                checks++;
                double allowed = tolerance * Math.Max(Math.Abs(theirs), scale);
                if (!(Math.Abs(ours - theirs) <= allowed))
                {
                    failures.Add(string.Create(CultureInfo.InvariantCulture,
                        $"case {i} (n={c.A.Length}/{c.B.Length}, conf {c.Confidence}): {name} ours {ours:R}, oracle {theirs:R}"));
                }
            }

            double magnitude = c.A.Max(Math.Abs);
            var estimate = MeanEstimate.Of(c.A, c.Confidence);
            Check("mean (simple-statistics)", estimate.Mean, r.GetProperty("mean").GetDouble(), magnitude);
            Check("mean (jstat)", estimate.Mean, r.GetProperty("meanJstat").GetDouble(), magnitude);
            double sd = estimate.StandardDeviation!.Value;
            Check("sd (simple-statistics)", sd, r.GetProperty("sd").GetDouble(), 0);
            Check("sd (jstat)", sd, r.GetProperty("sdJstat").GetDouble(), 0);
            double tq = StudentT.Quantile((1 + c.Confidence) / 2, c.A.Length - 1);
            Check("t quantile", tq, r.GetProperty("tQuantile").GetDouble(), 0);
            Check("t quantile (jstat raw)", tq, r.GetProperty("tQuantileJstat").GetDouble(), 0, JstatTolerance);
            double half = tq * sd / Math.Sqrt(c.A.Length);
            Check("interval low", estimate.Low!.Value, r.GetProperty("low").GetDouble(), Math.Abs(estimate.Mean) + half);
            Check("interval high", estimate.High!.Value, r.GetProperty("high").GetDouble(), Math.Abs(estimate.Mean) + half);

            var welch = WelchTest.Compare(c.A, c.B, c.Confidence);
            var w = r.GetProperty("welch");
            Assert.Equal(w.ValueKind == JsonValueKind.Null, welch is null);
            if (welch is not null)
            {
                double level = Math.Abs(c.A.Average()) + Math.Abs(c.B.Average());
                Check("welch difference", welch.Difference, w.GetProperty("difference").GetDouble(), level);
                Check("welch standard error", welch.StandardError, w.GetProperty("standardError").GetDouble(), 0);
                Check("welch t", welch.T, w.GetProperty("t").GetDouble(), level / welch.StandardError);
                Check("welch df", welch.DegreesOfFreedom, w.GetProperty("df").GetDouble(), 0);
                Check("welch p", welch.PValue, w.GetProperty("p").GetDouble(), 0);
                double wHalf = (welch.High - welch.Low) / 2;
                Check("welch low", welch.Low, w.GetProperty("low").GetDouble(), level + wHalf);
                Check("welch high", welch.High, w.GetProperty("high").GetDouble(), level + wHalf);
                double pJstat = w.GetProperty("pJstat").GetDouble();
                if (welch.PValue > 1e-3) Check("welch p (jstat raw)", welch.PValue, pJstat, 0, JstatTolerance * 10);
            }

            var limits = IndividualsChart.Build(c.A, c.BaselineStart, c.BaselineCount).Limits;
            var chart = r.GetProperty("chart");
            Check("I-MR centre", limits.Mean, chart.GetProperty("mean").GetDouble(), magnitude);
            Check("I-MR MRbar", limits.MeanMovingRange, chart.GetProperty("mrBar").GetDouble(), 0);
            Check("I-MR sigma", limits.Sigma, chart.GetProperty("sigma").GetDouble(), 0);
            Check("I-MR UCL", limits.Ucl, chart.GetProperty("ucl").GetDouble(), magnitude);
            Check("I-MR LCL", limits.Lcl, chart.GetProperty("lcl").GetDouble(), magnitude);
            Check("MR UCL", limits.MovingRangeUcl, chart.GetProperty("mrUcl").GetDouble(), 0);
        }

        Assert.True(checks > 20 * Cases, $"only {checks} comparisons were made");
        Assert.True(failures.Count == 0, $"{failures.Count} of {checks} comparisons disagree:{Environment.NewLine}{string.Join(Environment.NewLine, failures.Take(40))}");
    }

    private sealed record Case(double[] A, double[] B, double Confidence, int BaselineStart, int BaselineCount);

    // Yields and figures of the kind the program charts: locations from 0 to 1e4, spreads from 0.01 to 10,
    // normal or uniform, sometimes rounded to one decimal (ties), with group b sometimes shifted. Data sets
    // whose values are all equal are drawn again (those cases are tested by hand).
    private static Case MakeCase(Random random, int index)
    {
        double[] locations = [0, 1, 87.5, 95, 1000, 1e4, -40];
        double[] spreads = [0.01, 0.1, 0.5, 2, 10];
        double location = locations[random.Next(locations.Length)];
        double spread = spreads[random.Next(spreads.Length)];
        if (location >= 1000) spread = Math.Max(spread, 0.5);
        bool round = random.Next(5) == 0 && spread >= 0.5;
        bool uniform = random.Next(3) == 0;
        double[] Draw(int n, double shift)
        {
            while (true)
            {
                var values = new double[n];
                for (var i = 0; i < n; i++)
                {
                    double z = uniform ? (random.NextDouble() - 0.5) * 3.4 : Normal(random);
                    double v = location + shift + spread * z;
                    values[i] = round ? Math.Round(v, 1) : v;
                }

                if (values.Distinct().Count() > 1) return values;
            }
        }

        int na = 2 + random.Next(index % 4 == 0 ? 5 : 45);
        int nb = 2 + random.Next(index % 5 == 0 ? 4 : 45);
        double shiftB = random.Next(3) switch { 0 => 0, 1 => spread * 0.5, _ => -spread * 2 };
        var a = Draw(na, 0);
        var b = Draw(nb, shiftB);
        double[] confidences = [0.9, 0.95, 0.99];
        int start = random.Next(Math.Max(1, na - 1));
        int count = 2 + random.Next(na - start - 1);
        return new Case(a, b, confidences[random.Next(confidences.Length)], start, count);
    }

    private static double Normal(Random random)
    {
        // Box-Muller.
        double u1 = 1 - random.NextDouble(), u2 = random.NextDouble();
        return Math.Sqrt(-2 * Math.Log(u1)) * Math.Cos(2 * Math.PI * u2);
    }
}
