using System.Globalization;

namespace BatchReconcile.Tests.Support;

/// <summary>
/// A three-step route of an invented plant for the analysis tests: lidocaine hydrochloride from 2,6-dimethylaniline.
/// S1 acylation with chloroacetyl chloride (triethylamine takes up the HCl) in toluene, S2 amination with diethylamine
/// (two equivalents: one is the base) in toluene, S3 salt formation with 36 % hydrochloric acid in acetone. Version 2 runs
/// S2 in less toluene. Every batch charges the whole of the previous step's product and its waste closes the balance.
/// Chloroacetyl chloride and hydrochloric acid are corrosive and toluene, acetone and diethylamine flammable: the figures
/// support, not replace, the site's procedures and qualified review.
/// </summary>
public static class LidocaineRoute
{
    public const string Recipe = "LID-300";

    public const string Definitions = """
        {
          "materials": [
            { "code": "DMA",    "name": "2,6-dimethylaniline",                      "formula": "C8H11N" },
            { "code": "CAC",    "name": "chloroacetyl chloride",                    "formula": "C2H2Cl2O" },
            { "code": "TEA",    "name": "triethylamine",                            "formula": "C6H15N", "role": "reagent" },
            { "code": "TOL",    "name": "toluene",                                  "formula": "C7H8", "role": "solvent" },
            { "code": "CDMA",   "name": "2-chloro-N-(2,6-dimethylphenyl)acetamide", "formula": "C10H12ClNO" },
            { "code": "TEAHCL", "name": "triethylamine hydrochloride",              "formula": "C6H16ClN" },
            { "code": "DEA",    "name": "diethylamine",                             "formula": "C4H11N" },
            { "code": "DEAHCL", "name": "diethylamine hydrochloride",               "formula": "C4H12ClN" },
            { "code": "LID",    "name": "lidocaine",                                "formula": "C14H22N2O" },
            { "code": "HCL",    "name": "hydrogen chloride",                        "formula": "HCl", "role": "reagent" },
            { "code": "WATER",  "name": "water",                                    "formula": "H2O", "role": "water" },
            { "code": "ACE",    "name": "acetone",                                  "formula": "C3H6O", "role": "solvent" },
            { "code": "LIDHCL", "name": "lidocaine hydrochloride",                  "formula": "C14H23ClN2O" },
            { "code": "HCL36",  "name": "hydrochloric acid 36 %",                   "composition": { "HCL": 36, "WATER": 64 } }
          ],
          "recipes": [
            {
              "code": "LID-300", "version": 1, "name": "lidocaine hydrochloride from 2,6-dimethylaniline",
              "steps": [
                { "code": "S1", "name": "acylation", "reaction": "DMA + CAC + TEA -> CDMA + TEAHCL", "product": "CDMA",
                  "yieldPct": { "min": 80, "max": 98 }, "balanceTolerancePct": 2.0 },
                { "code": "S2", "name": "amination", "reaction": "CDMA + 2 DEA -> LID + DEAHCL", "product": "LID",
                  "yieldPct": { "min": 75, "max": 95 }, "balanceTolerancePct": 2.0 },
                { "code": "S3", "name": "salt formation", "reaction": "LID + HCL -> LIDHCL", "product": "LIDHCL",
                  "yieldPct": { "min": 85, "max": 99 }, "balanceTolerancePct": 2.0 }
              ]
            },
            {
              "code": "LID-300", "version": 2, "name": "lidocaine hydrochloride from 2,6-dimethylaniline, amination in less toluene",
              "steps": [
                { "code": "S1", "name": "acylation", "reaction": "DMA + CAC + TEA -> CDMA + TEAHCL", "product": "CDMA",
                  "yieldPct": { "min": 80, "max": 98 }, "balanceTolerancePct": 2.0 },
                { "code": "S2", "name": "amination", "reaction": "CDMA + 2 DEA -> LID + DEAHCL", "product": "LID",
                  "yieldPct": { "min": 75, "max": 95 }, "balanceTolerancePct": 2.0 },
                { "code": "S3", "name": "salt formation", "reaction": "LID + HCL -> LIDHCL", "product": "LIDHCL",
                  "yieldPct": { "min": 85, "max": 99 }, "balanceTolerancePct": 2.0 }
              ]
            }
          ]
        }
        """;

    private const string Header = "batch,recipe,recipe_version,step,entry,material,stream,quantity,unit,assay_pct,lot,recorded_at";

    /// <summary>Charges of S1 (kg): DMA, CAC, TEA, TOL. m_in = 577.0 kg.</summary>
    public const double DmaKg = 60.0, CacKg = 62.0, TeaKg = 55.0, TolueneS1Kg = 400.0;

    /// <summary>Charges of S2 besides the intermediate: DEA, and toluene by version (v1 300 kg, v2 220 kg).</summary>
    public const double DeaKg = 80.0;

    /// <summary>Charges of S3 besides the intermediate: HCL36 (16.2 kg HCl, 28.8 kg water) and acetone.</summary>
    public const double Hcl36Kg = 45.0, AcetoneKg = 250.0;

    public static double TolueneS2Kg(int version) => version == 1 ? 300.0 : 220.0;

    /// <summary>
    /// One batch's export: S1 isolates <paramref name="cdmaKg"/>, S2 <paramref name="lidKg"/>, S3 <paramref name="saltKg"/>; each later
    /// step charges all of the previous product unless <paramref name="s2ChargeKg"/> or <paramref name="s3ChargeKg"/> say otherwise.
    /// All rows fall on <paramref name="day"/> between 07:00 and 20:00 plant time (UTC+01:00 from November).
    /// </summary>
    public static string Export(string batch, int version, DateOnly day, double cdmaKg, double lidKg, double saltKg, double? s2ChargeKg = null, double? s3ChargeKg = null)
    {
        var c2 = s2ChargeKg ?? cdmaKg;
        var c3 = s3ChargeKg ?? lidKg;
        var in1 = DmaKg + CacKg + TeaKg + TolueneS1Kg;
        var in2 = c2 + DeaKg + TolueneS2Kg(version);
        var in3 = c3 + Hcl36Kg + AcetoneKg;
        var d = day.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture);
        string At(string time) => $"{d}T{time}:00+01:00";
        string P(double v) => v.ToString("0.0##", CultureInfo.InvariantCulture);
        var v = version.ToString(CultureInfo.InvariantCulture);
        string[] rows =
        [
            $"{batch},{Recipe},{v},S1,charge,DMA,,{P(DmaKg)},kg,,,{At("07:00")}",
            $"{batch},{Recipe},{v},S1,charge,CAC,,{P(CacKg)},kg,,,{At("07:10")}",
            $"{batch},{Recipe},{v},S1,charge,TEA,,{P(TeaKg)},kg,,,{At("07:20")}",
            $"{batch},{Recipe},{v},S1,charge,TOL,,{P(TolueneS1Kg)},kg,,,{At("07:30")}",
            $"{batch},{Recipe},{v},S1,product,CDMA,,{P(cdmaKg)},kg,,,{At("10:00")}",
            $"{batch},{Recipe},{v},S1,waste,,filtrate,{P(in1 - cdmaKg)},kg,,,{At("10:10")}",
            $"{batch},{Recipe},{v},S2,charge,CDMA,,{P(c2)},kg,,,{At("11:00")}",
            $"{batch},{Recipe},{v},S2,charge,DEA,,{P(DeaKg)},kg,,,{At("11:10")}",
            $"{batch},{Recipe},{v},S2,charge,TOL,,{P(TolueneS2Kg(version))},kg,,,{At("11:20")}",
            $"{batch},{Recipe},{v},S2,product,LID,,{P(lidKg)},kg,,,{At("15:00")}",
            $"{batch},{Recipe},{v},S2,waste,,aqueous and organic,{P(in2 - lidKg)},kg,,,{At("15:10")}",
            $"{batch},{Recipe},{v},S3,charge,LID,,{P(c3)},kg,,,{At("16:00")}",
            $"{batch},{Recipe},{v},S3,charge,HCL36,,{P(Hcl36Kg)},kg,,,{At("16:10")}",
            $"{batch},{Recipe},{v},S3,charge,ACE,,{P(AcetoneKg)},kg,,,{At("16:20")}",
            $"{batch},{Recipe},{v},S3,product,LIDHCL,,{P(saltKg)},kg,,,{At("19:50")}",
            $"{batch},{Recipe},{v},S3,waste,,mother liquor,{P(in3 - saltKg)},kg,,,{At("20:00")}",
        ];
        return Header + "\n" + string.Join("\n", rows) + "\n";
    }
}
