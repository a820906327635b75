using BatchReconcile.Chemistry.Equations;
using BenchmarkDotNet.Attributes;

namespace BatchReconcile.Benchmarks;

/// <summary>Exact balancing of a nine-species redox equation, from text and from an already parsed equation.</summary>
[MemoryDiagnoser]
[MedianColumn]
public class BalancerBenchmarks
{
    private const string Ferrocyanide =
        "K4[Fe(CN)6] + KMnO4 + H2SO4 -> KHSO4 + Fe2(SO4)3 + MnSO4 + HNO3 + CO2 + H2O";

    private ChemicalEquation _parsed = null!;

    [GlobalSetup]
    public void Setup() => _parsed = ChemicalEquation.Parse(Ferrocyanide);

    [Benchmark]
    public BalanceResult FromText() => EquationBalancer.Balance(Ferrocyanide);

    [Benchmark(Baseline = true)]
    public BalanceResult FromParsedEquation() => EquationBalancer.Balance(_parsed);
}
