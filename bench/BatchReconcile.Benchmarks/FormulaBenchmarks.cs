using BatchReconcile.Chemistry.Formulas;
using BenchmarkDotNet.Attributes;

namespace BatchReconcile.Benchmarks;

/// <summary>Parsing plus molar mass for typical 10-30 character formulas; results are per formula.</summary>
[MemoryDiagnoser]
[MedianColumn]
public class FormulaBenchmarks
{
    private static readonly string[] Formulas =
    [
        "C8H10N4O2",
        "C13H18O2",
        "CuSO4·5H2O",
        "K4[Fe(CN)6]·3H2O",
        "[Cu(NH3)4]SO4·H2O",
        "Na2CO3.10H2O",
        "Ca3(PO4)2",
        "Al2(SO4)3·18H2O",
        "C6H5CH2CH(NH2)COOH",
        "{[Co(NH3)4Cl2]}Cl",
        "La0.7Sr0.3MnO3",
        "(CH3)3CO2CCH2CH2COOH",
        "CH3CH2OC(O)CH2C(O)CH3",
        "MgSO4·7H2O",
        "C17H19NO3·HCl·3H2O",
        "Fe2(SO4)3^2-",
    ];

    [Benchmark(OperationsPerInvoke = 16)]
    public double TryGetMolarMass()
    {
        double sum = 0;
        foreach (var formula in Formulas)
        {
            Formula.TryGetMolarMass(formula, out double mass);
            sum += mass;
        }

        return sum;
    }

    [Benchmark(OperationsPerInvoke = 16)]
    public double Parse()
    {
        double sum = 0;
        foreach (var formula in Formulas) sum += Formula.Parse(formula).MolarMass;
        return sum;
    }
}
