using BatchReconcile.Reconciliation.Settings;
using BatchReconcile.Reconciliation.Tests.Support;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Records.Exports;

namespace BatchReconcile.Reconciliation.Tests;

/// <summary>
/// Published worked example: benzyl alcohol + p-toluenesulfonyl chloride -> benzyl p-toluenesulfonate + HCl, with
/// triethylamine in toluene: 10.81 g benzyl alcohol, 21.9 g tosyl chloride, 15.0 g triethylamine, 500 g toluene;
/// 23.6 g of product. Constable, Curzons and Cunningham, "Metrics to 'green' chemistry — which are the best?",
/// Green Chem. 2002, 4, 521–527 (the worked example of the metrics figure). FROM MEMORY: the masses and the published
/// yield (90 %), atom economy (87.8 %) and reaction mass efficiency (about 72 %) are recalled, not read from the paper
/// here, so the published checks carry a 0.5-point tolerance; the hand arithmetic below is exact.
/// </summary>
public class PublishedExampleTests
{
    private static readonly ProcessCatalog Catalog = new(
        [
            Plant.M("BNOH", "benzyl alcohol", "C7H8O"),
            Plant.M("TSCL", "4-toluenesulfonyl chloride", "C7H7ClO2S"),
            Plant.M("BNOTS", "benzyl 4-toluenesulfonate", "C14H14O3S"),
            Plant.M("HCL", "hydrogen chloride", "HCl"),
            Plant.M("TEA", "triethylamine", "C6H15N", MaterialRole.Reagent),
            Plant.M("TOL", "toluene", "C7H8", MaterialRole.Solvent),
        ],
        []);

    private static Outcomes.StepOutcome Reconcile()
    {
        var step = Plant.Step("S1", "tosylation", Plant.Reaction([(1, "BNOH"), (1, "TSCL")], [(1, "BNOTS"), (1, "HCL")]), "BNOTS", 85, 95, 2.0);
        var batch = new BatchBuilder("LIT-1", "LIT")
            .Charge("S1", "BNOH", 10.81, MassUnit.Gram)
            .Charge("S1", "TSCL", 21.9, MassUnit.Gram)
            .Charge("S1", "TEA", 15.0, MassUnit.Gram)
            .Charge("S1", "TOL", 500.0, MassUnit.Gram)
            .Product("S1", "BNOTS", 23.6, MassUnit.Gram)
            .Build();
        return BatchReconciler.Reconcile(batch, Plant.Recipe("LIT", step), Catalog, new ReconciliationSettings()).Steps.Single();
    }

    // Hand: n_BnOH = 10.81 / 108.140 = 0.099963 mol; n_TsCl = 21.9 / 190.641 = 0.114876 mol -> L = benzyl alcohol.
    // m_theo = 0.099963 × 262.323 = 26.2226 g; Y = 23.6 / 26.2226 = 89.998 %.
    // AE = 262.323 / (108.140 + 190.641) = 87.798 %. RME = 23.6 / (10.81 + 21.9) = 72.149 %.
    // SF = 32.71 / (0.099963 × 298.781) = 1.09516. PMI = (10.81 + 21.9 + 15.0 + 500) / 23.6 = 23.208.
    // TsCl 1.1492 equiv, Et3N 15.0 / 101.193 / 0.099963 = 1.4829 equiv.
    private const double Xi = 10.81 / Mw.BenzylAlcohol / 1000; // kmol (masses in kg in the engine)

    public static TheoryData<string, double> HandFigures => new()
    {
        { "YieldPct", 100 * 0.0236 / (Xi * Mw.BenzylTosylate) },
        { "AtomEconomyPct", 100 * Mw.BenzylTosylate / (Mw.BenzylAlcohol + Mw.TosylChloride) },
        { "RmePct", 100 * 23.6 / (10.81 + 21.9) },
        { "StoichiometricFactor", 0.03271 / (Xi * (Mw.BenzylAlcohol + Mw.TosylChloride)) },
        { "Pmi", (10.81 + 21.9 + 15.0 + 500.0) / 23.6 },
        { "CompleteEFactor", (10.81 + 21.9 + 15.0 + 500.0 - 23.6) / 23.6 },
        { "SimpleEFactor", (10.81 + 21.9 + 15.0 - 23.6) / 23.6 },
        { "Equiv:TSCL", 0.0219 / Mw.TosylChloride / Xi },
        { "Equiv:TEA", 0.015 / Mw.Triethylamine / Xi },
    };

    [Theory]
    [MemberData(nameof(HandFigures))]
    public void Hand_figures(string figure, double expected) =>
        Close.Equal(expected, HydrogenationFiguresTests.Figure(Reconcile(), figure), figure);

    [Theory]
    [InlineData("YieldPct", 90.0)]       // from memory (Constable et al., Green Chem. 2002)
    [InlineData("AtomEconomyPct", 87.8)] // from memory (Constable et al., Green Chem. 2002)
    [InlineData("RmePct", 72.0)]         // from memory (Constable et al., Green Chem. 2002)
    public void Published_figures_from_memory(string figure, double published)
    {
        double? value = HydrogenationFiguresTests.Figure(Reconcile(), figure);
        Assert.NotNull(value);
        Assert.InRange(value.Value, published - 0.5, published + 0.5);
    }
}
