using BatchReconcile.Chemistry.Metrics;

namespace BatchReconcile.Chemistry.Tests.Metrics;

/// <summary>
/// Per-material parts of the two ladder rungs tied to materials, and the solvent and water charged, hand-worked.
/// Definitions: docs/computation.md (project spec); molar masses: <see cref="Chem"/> (CIAAW 2021 abridged, summed by hand).
/// Parts must add up to their rung within 1e-9 of m_in (floating-point rounding only; the figures are kg read to 1 g).
/// </summary>
public class LadderPartsTests
{
    private const double Benzylamine = 107.156; // C7H9N: 84.077 + 9.072 + 14.007

    private static StepReaction SaltFormation() => StepReaction.Create(
        [Chem.T("BNA", 1, Benzylamine), Chem.T("HCL", 1, Chem.HydrogenChloride)], Chem.T("BNAHCL", 1, Chem.BenzylamineHcl));

    /// <summary>
    /// The esterification of <see cref="EsterificationTests"/> with the recovered stream named as ethanol.
    /// Auxiliaries per material, in order of first charge:
    ///   BZOH  250.0 × (1 − 0.995) = 1.25 kg (non-assay part of a reactant row)
    ///   ETOH  470.0 × (1 − 0.998) = 0.94 kg, less 250.0 kg recovered = −249.06 kg (recovered excess reactant)
    ///   H2SO4 10.0 kg (a plain auxiliary row counts whole)
    ///   WATER 300.0 kg
    ///   sum 1.25 − 249.06 + 10.0 + 300.0 = 62.19 kg = m_aux − m_rec = (1030 − 717.81) − 250.
    /// Excess reactants, ξ_max = 248.75 / 122.123 = 2.036881 kmol:
    ///   BZOH 248.75 − 2.036881 × 122.123 = 0 (limiting)
    ///   ETOH 469.06 − 2.036881 × 46.069 = 469.06 − 93.8371 = 375.2229 kg; sum 375.2229 = m_react − m_stoich.
    /// Solvent charged: 0 (ethanol is a reactant here, whatever its role); water charged: 300.0 kg.
    /// </summary>
    private static StepResult Esterification() => StepMetrics.Compute(StepInput.Create(
        Chem.Esterification(),
        [
            ChargeRow.Create("BZOH", 250.0, 99.5),
            ChargeRow.Create("ETOH", 470.0, 99.8, AuxiliaryRole.Solvent),
            ChargeRow.Create("H2SO4", 10.0, 96.0),
            ChargeRow.Create("WATER", 300.0, role: AuxiliaryRole.Water),
        ],
        [
            OutputRow.Product(290.0, 99.0),
            OutputRow.Recovered(250.0, AuxiliaryRole.Other, "ETOH"),
            OutputRow.Waste(470.0, productKg: 8.0),
        ],
        Chem.Balance()));

    /// <summary>
    /// Benzylamine + HCl from 36 % hydrochloric acid, a propan-2-ol wash, part of the propan-2-ol recovered.
    /// Charges: BNA 95.0 kg (100 %); HCL36 100.0 kg = HCL 36.0 + WATER 64.0; IPA 40.0 kg (solvent). m_in = 235.0 kg,
    /// m_react = 95.0 + 36.0 = 131.0 kg, m_aux = 104.0 kg; recovered IPA 30.0 kg.
    /// Auxiliaries: WATER 64.0 (the acid's water; its HCl is a reactant and the acid has no rest); IPA 40.0 − 30.0 = 10.0;
    ///   sum 74.0 = 104.0 − 30.0. BNA at 100 % puts nothing in.
    /// Excess reactants, ξ_max = 95.0 / 107.156 = 0.886558 kmol: BNA 0; HCL 36.0 − 0.886558 × 36.458 = 36.0 − 32.3221 = 3.6779 kg.
    /// Solvent charged 40.0 kg (IPA); water charged 64.0 kg (the acid's water).
    /// </summary>
    private static StepResult SaltFromSolution() => StepMetrics.Compute(StepInput.Create(
        SaltFormation(),
        [
            ChargeRow.Create("BNA", 95.0),
            ChargeRow.Solution("HCL36", 100.0, [new ChargeContent("HCL", 36.0, AuxiliaryRole.Other), new ChargeContent("WATER", 64.0, AuxiliaryRole.Water)]),
            ChargeRow.Create("IPA", 40.0, role: AuxiliaryRole.Solvent),
        ],
        [OutputRow.Product(120.0), OutputRow.Recovered(30.0, AuxiliaryRole.Solvent, "IPA"), OutputRow.Waste(84.0)],
        Chem.Balance(2.0)));

    /// <summary>
    /// As <see cref="SaltFromSolution"/> without the wash, benzylamine at 98.0 % and an acid whose components leave 1.0 kg
    /// unaccounted for (HCL 35.0 + WATER 64.0 of 100.0 kg). m_in = 195.0; m_react = 93.1 + 35.0 = 128.1; m_aux = 66.9.
    /// Auxiliaries: BNA 95.0 × 0.02 = 1.9; WATER 64.0; HCL36 (the rest, under the solution's code) 1.0; sum 66.9.
    /// Excess: ξ_max = 93.1 / 107.156 = 0.868827 kmol; HCL 35.0 − 0.868827 × 36.458 = 35.0 − 31.6757 = 3.3243 kg.
    /// </summary>
    private static StepResult SaltWithRest() => StepMetrics.Compute(StepInput.Create(
        SaltFormation(),
        [
            ChargeRow.Create("BNA", 95.0, 98.0),
            ChargeRow.Solution("HCL36", 100.0, [new ChargeContent("HCL", 35.0, AuxiliaryRole.Other), new ChargeContent("WATER", 64.0, AuxiliaryRole.Water)]),
        ],
        [OutputRow.Product(118.0), OutputRow.Waste(76.0)],
        Chem.Balance(2.0)));

    private const double XiEster = 248.75 / Chem.BenzoicAcid;
    private const double XiSalt = 95.0 / Benzylamine;
    private const double XiRest = 93.1 / Benzylamine;

    public static TheoryData<string, string, string, double> Parts => new()
    {
        { "esterification", "AuxiliariesNotRecovered", "BZOH", 250.0 - 248.75 },              // 1.25
        { "esterification", "AuxiliariesNotRecovered", "ETOH", 470.0 - 469.06 - 250.0 },       // -249.06
        { "esterification", "AuxiliariesNotRecovered", "H2SO4", 10.0 },
        { "esterification", "AuxiliariesNotRecovered", "WATER", 300.0 },
        { "esterification", "ExcessReactants", "BZOH", 0.0 },
        { "esterification", "ExcessReactants", "ETOH", 469.06 - (XiEster * Chem.Ethanol) },    // 375.2229
        { "salt", "AuxiliariesNotRecovered", "WATER", 64.0 },
        { "salt", "AuxiliariesNotRecovered", "IPA", 40.0 - 30.0 },                            // 10.0
        { "salt", "ExcessReactants", "BNA", 0.0 },
        { "salt", "ExcessReactants", "HCL", 36.0 - (XiSalt * Chem.HydrogenChloride) },       // 3.6779
        { "rest", "AuxiliariesNotRecovered", "BNA", 95.0 - 93.1 },                            // 1.9
        { "rest", "AuxiliariesNotRecovered", "WATER", 64.0 },
        { "rest", "AuxiliariesNotRecovered", "HCL36", 100.0 - 35.0 - 64.0 },                  // 1.0
        { "rest", "ExcessReactants", "HCL", 35.0 - (XiRest * Chem.HydrogenChloride) },       // 3.3243
    };

    [Theory]
    [MemberData(nameof(Parts))]
    public void Hand_worked_part_matches(string step, string rung, string material, double expectedKg)
    {
        var r = Case(step);
        var part = Assert.Single(r.Ladder![Enum.Parse<LossRungKind>(rung)].Parts, p => p.Material == material);
        Chem.AssertClose(expectedKg, part.Kg, 1e-12, $"{step} {rung} {material}");
    }

    [Theory]
    [InlineData("esterification", "BZOH,ETOH,H2SO4,WATER", "BZOH,ETOH")]
    [InlineData("salt", "WATER,IPA", "BNA,HCL")]
    [InlineData("rest", "BNA,WATER,HCL36", "BNA,HCL")]
    public void Parts_come_in_order_of_first_charge_and_add_up_to_their_rung(string step, string auxiliaries, string reactants)
    {
        var r = Case(step);
        var aux = r.Ladder![LossRungKind.AuxiliariesNotRecovered];
        var excess = r.Ladder[LossRungKind.ExcessReactants];
        Assert.Equal(auxiliaries.Split(','), aux.Parts.Select(p => p.Material));
        Assert.Equal(reactants.Split(','), excess.Parts.Select(p => p.Material));
        Assert.True(Math.Abs(aux.Parts.Sum(p => p.Kg) - aux.Kg) <= 1e-9 * r.InputKg);
        Assert.True(Math.Abs(excess.Parts.Sum(p => p.Kg) - excess.Kg) <= 1e-9 * r.InputKg);
        Assert.All(r.Ladder.Rungs.Where(g => g.Kind is not (LossRungKind.AuxiliariesNotRecovered or LossRungKind.ExcessReactants)), g => Assert.Empty(g.Parts));
    }

    [Theory]
    [InlineData("esterification", 0.0, 300.0)]  // ethanol is a reactant, never solvent; the work-up water
    [InlineData("salt", 40.0, 64.0)]            // the IPA wash; the water of the 36 % acid
    [InlineData("rest", 0.0, 64.0)]
    public void Solvent_and_water_charged_are_counted_apart(string step, double solventKg, double waterKg)
    {
        var r = Case(step);
        Chem.AssertClose(solventKg, r.SolventChargedKg, 1e-12, "solvent");
        Chem.AssertClose(waterKg, r.WaterChargedKg, 1e-12, "water");
        Chem.AssertClose(r.SolventAndWaterChargedKg, r.SolventChargedKg + r.WaterChargedKg, 1e-12, "together");
    }

    [Fact]
    public void A_recovered_row_without_its_material_leaves_the_auxiliaries_rung_without_parts()
    {
        // EsterificationTests.Input: the recovered 250 kg names no material, so no split could add up.
        var r = StepMetrics.Compute(EsterificationTests.Input());
        Assert.Empty(r.Ladder![LossRungKind.AuxiliariesNotRecovered].Parts);
        Assert.Equal(2, r.Ladder[LossRungKind.ExcessReactants].Parts.Count);
    }

    [Fact]
    public void A_reactant_in_a_solution_is_not_solvent_or_water()
    {
        // Water as a reactant (a hydration) supplied by the acid: its 64.0 kg are m_react, not water charged.
        var hydration = StepReaction.Create([Chem.T("BNA", 1, Benzylamine), Chem.T("WATER", 1, Chem.Water)], Chem.T("P", 1, Benzylamine + Chem.Water));
        var r = StepMetrics.Compute(StepInput.Create(
            hydration,
            [
                ChargeRow.Create("BNA", 95.0),
                ChargeRow.Solution("HCL36", 100.0, [new ChargeContent("HCL", 36.0, AuxiliaryRole.Other), new ChargeContent("WATER", 64.0, AuxiliaryRole.Water)]),
            ],
            [OutputRow.Product(100.0)],
            Chem.Balance(2.0)));
        Assert.Equal(0.0, r.WaterChargedKg);
        Assert.Equal(0.0, r.SolventChargedKg);
        // The acid's HCl (36.0 kg) is its only auxiliary: m_aux = 195.0 − 95.0 − 64.0.
        var part = Assert.Single(r.Ladder![LossRungKind.AuxiliariesNotRecovered].Parts);
        Assert.Equal(("HCL", 36.0), (part.Material, part.Kg));
    }

    private static StepResult Case(string step) => step switch
    {
        "esterification" => Esterification(),
        "salt" => SaltFromSolution(),
        "rest" => SaltWithRest(),
        _ => throw new ArgumentOutOfRangeException(nameof(step), step, null),
    };
}
