using System.Text.Json;
using BatchReconcile.Cli;
using BatchReconcile.Tests.Support;

namespace BatchReconcile.Tests.Cli;

/// <summary>
/// Issue 9, points 5 and 6 through the command line, in process: <c>check</c>, <c>ingest</c>, <c>batches show</c>
/// (text and JSON) and the digest, on an invented plant's three-step route, benzylamine hydrochloride from benzyl
/// cyanide, with 36 % hydrochloric acid, 12.5 % sodium hypochlorite and 50 % sodium hydroxide bought as solutions
/// (commercial strengths, common practice). The figures are hand-worked in the Reconciliation tests (SolutionChargeTests,
/// RouteTests); here they are followed to the outputs. Hypochlorite with acid gives chlorine: the figures support, not
/// replace, the site's procedures and qualified review.
/// </summary>
public sealed class RouteAndSolutionCliTests : IDisposable
{
    private const string Definitions = """
        {
          "materials": [
            { "code": "BCN",     "name": "benzyl cyanide",               "formula": "C8H7N" },
            { "code": "WATER",   "name": "water",                        "formula": "H2O", "role": "water" },
            { "code": "HCL",     "name": "hydrogen chloride",            "formula": "HCl", "role": "reagent" },
            { "code": "PAA",     "name": "phenylacetamide",              "formula": "C8H9NO" },
            { "code": "NAOCL",   "name": "sodium hypochlorite",          "formula": "NaClO", "role": "reagent" },
            { "code": "NAOH",    "name": "sodium hydroxide",             "formula": "NaOH", "role": "reagent" },
            { "code": "BNA",     "name": "benzylamine",                  "formula": "C7H9N" },
            { "code": "NA2CO3",  "name": "sodium carbonate",             "formula": "Na2CO3" },
            { "code": "NACL",    "name": "sodium chloride",              "formula": "NaCl" },
            { "code": "BNAHCL",  "name": "benzylamine hydrochloride",    "formula": "C7H10ClN" },
            { "code": "HCL36",   "name": "hydrochloric acid 36 %",       "composition": { "HCL": 36, "WATER": 64 } },
            { "code": "NAOCL13", "name": "sodium hypochlorite 12.5 %",   "composition": { "NAOCL": 12.5, "NAOH": 1.0, "WATER": 86.5 } },
            { "code": "NAOH50",  "name": "sodium hydroxide 50 %",        "composition": { "NAOH": 50, "WATER": 50 } }
          ],
          "recipes": [
            {
              "code": "BNA-300", "version": 1, "name": "benzylamine hydrochloride from benzyl cyanide",
              "steps": [
                { "code": "S1", "name": "nitrile hydration", "reaction": "BCN + WATER -> PAA", "product": "PAA",
                  "yieldPct": { "min": 80, "max": 95 }, "balanceTolerancePct": 2.0,
                  "equivalents": { "HCL": { "min": 4.0, "max": 5.5 } } },
                { "code": "S2", "name": "Hofmann rearrangement", "reaction": "PAA + NAOCL + 2 NAOH -> BNA + NA2CO3 + NACL + WATER", "product": "BNA",
                  "yieldPct": { "min": 75, "max": 90 }, "balanceTolerancePct": 3.0 },
                { "code": "S3", "name": "salt formation", "reaction": "BNA + HCL -> BNAHCL", "product": "BNAHCL",
                  "yieldPct": { "min": 90, "max": 99 }, "balanceTolerancePct": 2.0,
                  "equivalents": { "HCL": { "min": 1.05, "max": 1.2 } } }
              ]
            }
          ]
        }
        """;

    private const string Header = "batch,recipe,recipe_version,step,entry,material,stream,quantity,unit,assay_pct,lot,recorded_at";

    private readonly HostSandbox _sandbox = new(TimeProvider.System);
    private readonly string _config;

    public RouteAndSolutionCliTests()
    {
        _config = Path.Combine(_sandbox.Root, "config");
        Directory.CreateDirectory(Path.Combine(_config, "processes"));
        File.Copy(Path.Combine(HostSandbox.RepositoryRoot, "config", "appsettings.json"), Path.Combine(_config, "appsettings.json"));
        File.WriteAllText(Path.Combine(_config, "processes", "amine-route.json"), Definitions);
    }

    /// <summary>
    /// One batch (see AmineRoute in the Reconciliation tests): S1 isolates 147.0 kg of PAA, S2 charges <paramref name="paaKg"/>
    /// of it; S3 isolates 120.0 kg of the salt. <paramref name="withWater"/> false leaves S1 without any water.
    /// </summary>
    private static string Export(string batch, double paaKg, bool withWater = true)
    {
        string P(double v) => v.ToString("0.0##", System.Globalization.CultureInfo.InvariantCulture);
        string[] rows =
        [
            $"{batch},BNA-300,1,S1,charge,BCN,,150.0,kg,99.0,,2026-11-24T06:30:00+01:00",
            withWater ? $"{batch},BNA-300,1,S1,charge,HCL36,,600.0,kg,,,2026-11-24T06:45:00+01:00" : $"{batch},BNA-300,1,S1,charge,HCL,,216.0,kg,,,2026-11-24T06:45:00+01:00",
            $"{batch},BNA-300,1,S1,product,PAA,,147.0,kg,,,2026-11-24T12:00:00+01:00",
            $"{batch},BNA-300,1,S1,waste,,mother liquor,{(withWater ? "600.0" : "216.0")},kg,,,2026-11-24T12:10:00+01:00",
            $"{batch},BNA-300,1,S2,charge,PAA,,{P(paaKg)},kg,,,2026-11-24T13:00:00+01:00",
            $"{batch},BNA-300,1,S2,charge,NAOCL13,,750.0,kg,,,2026-11-24T13:10:00+01:00",
            $"{batch},BNA-300,1,S2,charge,NAOH50,,200.0,kg,,,2026-11-24T13:20:00+01:00",
            $"{batch},BNA-300,1,S2,product,BNA,,95.0,kg,,,2026-11-24T18:00:00+01:00",
            $"{batch},BNA-300,1,S2,waste,,aqueous,995.0,kg,,,2026-11-24T18:10:00+01:00",
            $"{batch},BNA-300,1,S3,charge,BNA,,95.0,kg,,,2026-11-24T19:00:00+01:00",
            $"{batch},BNA-300,1,S3,charge,HCL36,,100.0,kg,,,2026-11-24T19:10:00+01:00",
            $"{batch},BNA-300,1,S3,product,BNAHCL,,120.0,kg,,,2026-11-24T23:00:00+01:00",
            $"{batch},BNA-300,1,S3,waste,,filtrate,74.0,kg,,,2026-11-24T23:10:00+01:00",
        ];
        return Header + "\n" + string.Join("\n", rows) + "\n";
    }

    private (int Exit, string Out, string Err) Run(params string[] args)
    {
        using var stdout = new StringWriter();
        using var stderr = new StringWriter();
        var exit = CommandLine.Run([.. args, "--config", _config, "--data", Path.Combine(_sandbox.Root, "data")], stdout, stderr);
        return (exit, stdout.ToString(), stderr.ToString());
    }

    private string WriteFile(string name, string text)
    {
        var folder = Path.Combine(_sandbox.Root, "drop");
        Directory.CreateDirectory(folder);
        var path = Path.Combine(folder, name);
        File.WriteAllText(path, text);
        return path;
    }

    [Fact]
    public void Check_shows_links_route_yield_and_the_overdrawn_flag_in_text_and_json()
    {
        var file = WriteFile("overdrawn.csv", Export("BNA-2611-031", 190.0));

        var text = Run("check", file);
        var json = Run("check", file, "--json");

        Assert.True(text.Exit == 0, text.Err);
        Assert.Contains("  intermediate PAA: S1 isolated 147.000 kg, S2 charged 190.000 kg: overdrawn by 43.000 kg (flagged)", text.Out, StringComparison.Ordinal);
        Assert.Contains("MAJOR intermediate-overdrawn: Step S2 (Hofmann rearrangement) charged 190 kg of PAA, but step S1 (nitrile hydration) isolated only 147 kg", text.Out, StringComparison.Ordinal);
        Assert.Contains("  route yield: not computable (step S2 was limited by NAOCL, not by the intermediate PAA", text.Out, StringComparison.Ordinal);

        Assert.Equal(0, json.Exit);
        using var doc = JsonDocument.Parse(json.Out);
        var batch = Assert.Single(doc.RootElement.GetProperty("batches").EnumerateArray());
        Assert.Equal(JsonValueKind.Null, batch.GetProperty("routeYieldPct").ValueKind);
        Assert.StartsWith("step S2 was limited by NAOCL", batch.GetProperty("routeYieldNote").GetString(), StringComparison.Ordinal);
        var link = batch.GetProperty("intermediates").EnumerateArray().First();
        Assert.Equal(("PAA", "S1", "S2", 147.0, 190.0, "overdrawn"), (
            link.GetProperty("material").GetString(), link.GetProperty("fromStep").GetString(), link.GetProperty("toStep").GetString(),
            link.GetProperty("isolatedKg").GetDouble(), link.GetProperty("chargedKg").GetDouble(), link.GetProperty("state").GetString()));
        var s2Flags = batch.GetProperty("steps")[1].GetProperty("flags").EnumerateArray().Select(f => f.GetProperty("code").GetString()).ToList();
        Assert.Contains("intermediate-overdrawn", s2Flags);
    }

    [Fact]
    public void Batches_show_json_gives_solvent_water_and_the_per_material_parts_of_the_ladder()
    {
        var inbox = Path.Combine(_sandbox.Root, "in-parts");
        Directory.CreateDirectory(inbox);
        File.WriteAllText(Path.Combine(inbox, "good.csv"), Export("BNA-2611-034", 145.0));
        Assert.Equal(0, Run("ingest", inbox).Exit);

        using var doc = JsonDocument.Parse(Run("batches", "show", "BNA-2611-034", "--json").Out);
        var steps = doc.RootElement.GetProperty("steps");

        // Hand-worked (kg, JSON rounds to 0.001). M(BCN, C8H7N) = 96.088 + 7.056 + 14.007 = 117.151; M(BNA) = 107.156;
        // M(HCl) = 36.458; M(H2O) = 18.015 (CIAAW 2021 abridged).
        // S1, BCN + WATER -> PAA: BCN 150.0 kg @ 99 % = 148.5 kg (limiting, 1.267595 kmol); HCL36 600.0 kg = HCl 216.0 + water 384.0.
        //   The water is a reactant: water charged 0, no solvent. Auxiliaries: BCN 1.5 (non-assay), HCL 216.0.
        //   Excess: BCN 0; WATER 384.0 - 1.267595 x 18.015 = 384.0 - 22.836 = 361.164.
        // S2: NAOCL13 750.0 kg = NaOCl 93.75 + NaOH 7.5 + water 648.75; NAOH50 200.0 kg = NaOH 100.0 + water 100.0: water 748.75.
        // S3, BNA + HCL -> BNAHCL: BNA 95.0 kg (limiting, 0.886558 kmol); HCL36 100.0 kg = HCl 36.0 + water 64.0.
        //   Water charged 64.0; auxiliaries: WATER 64.0; excess: BNA 0, HCL 36.0 - 0.886558 x 36.458 = 3.678.
        double xi1 = 148.5 / 117.151;
        double xi3 = 95.0 / 107.156;
        var expected = new (int Step, double Solvent, double Water, (string, double)[] Auxiliaries, (string, double)[] Excess)[]
        {
            (0, 0.0, 0.0, [("BCN", 1.5), ("HCL", 216.0)], [("BCN", 0.0), ("WATER", 384.0 - (xi1 * 18.015))]),
            (1, 0.0, 748.75, [], []),
            (2, 0.0, 64.0, [("WATER", 64.0)], [("BNA", 0.0), ("HCL", 36.0 - (xi3 * 36.458))]),
        };
        foreach (var (i, solvent, water, auxiliaries, excess) in expected)
        {
            var step = steps[i];
            Assert.Equal(solvent, step.GetProperty("solventInKg").GetDouble(), 0.0011);
            Assert.Equal(water, step.GetProperty("waterInKg").GetDouble(), 0.0011);
            var ladder = step.GetProperty("ladder").EnumerateArray().ToDictionary(r => r.GetProperty("rung").GetString()!);
            if (auxiliaries.Length == 0)
            {
                continue; // S2 is checked for its water only
            }

            foreach (var (rung, parts) in new[] { ("auxiliaries-not-recovered", auxiliaries), ("excess-reactants", excess) })
            {
                var got = ladder[rung].GetProperty("parts").EnumerateArray()
                    .Select(p => (p.GetProperty("material").GetString()!, p.GetProperty("kg").GetDouble())).ToList();
                Assert.Equal(parts.Select(p => p.Item1), got.Select(p => p.Item1));
                Assert.All(parts.Zip(got), pair => Assert.Equal(pair.First.Item2, pair.Second.Item2, 0.0011));
                // Rounded parts add up to the rounded rung within half a gram per part.
                Assert.Equal(ladder[rung].GetProperty("kg").GetDouble(), got.Sum(p => p.Item2), 0.0005 * (got.Count + 1));
            }

            Assert.Empty(ladder["co-products"].GetProperty("parts").EnumerateArray());
        }
    }

    [Fact]
    public void Batches_show_and_the_digest_show_the_route_yield_and_a_held_back_intermediate()
    {
        var inbox = Path.Combine(_sandbox.Root, "in");
        Directory.CreateDirectory(inbox);
        File.WriteAllText(Path.Combine(inbox, "good.csv"), Export("BNA-2611-030", 145.0));
        File.WriteAllText(Path.Combine(inbox, "dry.csv"), Export("BNA-2611-032", 145.0, withWater: false));
        var ingest = Run("ingest", inbox);
        Assert.True(ingest.Exit == 0, ingest.Out + ingest.Err);

        // Route yield 65.918 % (hand calculation: RouteTests.Route_yield_against_a_hand_calculation).
        var text = Run("batches", "show", "BNA-2611-030");
        Assert.True(text.Exit == 0, text.Err);
        Assert.Contains("  intermediate PAA: S1 isolated 147.000 kg, S2 charged 145.000 kg: held back 2.000 kg (carried over, not flagged)", text.Out, StringComparison.Ordinal);
        Assert.Contains("  intermediate BNA: S2 isolated 95.000 kg, S3 charged 95.000 kg: matched", text.Out, StringComparison.Ordinal);
        Assert.Contains("  route yield 65.92 % (theoretical 182.044 kg from the first step's limiting reactant)", text.Out, StringComparison.Ordinal);
        Assert.DoesNotContain("#", text.Out, StringComparison.Ordinal); // no flag at all

        var json = Run("batches", "show", "BNA-2611-030", "--json");
        using (var doc = JsonDocument.Parse(json.Out))
        {
            Assert.Equal(65.918, doc.RootElement.GetProperty("routeYieldPct").GetDouble());
            Assert.Equal(182.044, doc.RootElement.GetProperty("routeTheoreticalKg").GetDouble());
            Assert.Equal(JsonValueKind.Null, doc.RootElement.GetProperty("routeYieldNote").ValueKind);
            var held = doc.RootElement.GetProperty("intermediates")[0];
            Assert.Equal(("held-back", 2.0), (held.GetProperty("state").GetString(), held.GetProperty("heldBackKg").GetDouble()));
            Assert.Empty(doc.RootElement.GetProperty("flags").EnumerateArray());
        }

        var digest = Run("digest", "--day", "2026-11-24", "--json");
        Assert.True(digest.Exit == 0, digest.Err);
        string md;
        string html;
        using (var doc = JsonDocument.Parse(digest.Out))
        {
            var files = doc.RootElement.GetProperty("files").EnumerateArray().Select(f => f.GetString()!).ToList();
            md = File.ReadAllText(files.Single(f => f.EndsWith(".md", StringComparison.Ordinal)));
            html = File.ReadAllText(files.Single(f => f.EndsWith(".html", StringComparison.Ordinal)));
        }

        Assert.Contains("| BNA-2611-030 rev 1 | BNA-300 | 65.9 % |", md, StringComparison.Ordinal);
        Assert.Contains("| BNA-2611-032 rev 1 | BNA-300 | n/a (step S1 has no limiting reactant (a reactant of its equation was not charged)) |", md, StringComparison.Ordinal);
        Assert.Contains("<h2>Route yields</h2>", html, StringComparison.Ordinal);
        Assert.Contains(">65.9 %<", html, StringComparison.Ordinal);
    }

    [Fact]
    public void A_reactant_missing_step_prints_no_yield_based_number_in_text_json_or_digest()
    {
        // S1 charged with hydrogen chloride instead of the acid: no water, so reactant-missing.
        var inbox = Path.Combine(_sandbox.Root, "in-dry");
        Directory.CreateDirectory(inbox);
        File.WriteAllText(Path.Combine(inbox, "dry.csv"), Export("BNA-2611-033", 145.0, withWater: false));
        Assert.Equal(0, Run("ingest", inbox).Exit);

        var text = Run("batches", "show", "BNA-2611-033").Out;
        var s1 = text[text.IndexOf("  step S1", StringComparison.Ordinal)..text.IndexOf("  step S2", StringComparison.Ordinal)];
        Assert.Contains("limiting reactant -; theoretical -, actual 147.000 kg, yield -", s1, StringComparison.Ordinal);
        Assert.Contains(", SF -, RME -, PMI -, cEF -, sEF -", s1, StringComparison.Ordinal);
        Assert.Contains("yield, theoretical, SF, RME, PMI and E-factors are not computable (a reactant of the equation was not charged)", s1, StringComparison.Ordinal);
        Assert.Contains("CRITICAL reactant-missing", s1, StringComparison.Ordinal);

        using (var doc = JsonDocument.Parse(Run("batches", "show", "BNA-2611-033", "--json").Out))
        {
            var step = doc.RootElement.GetProperty("steps")[0];
            foreach (var figure in new[] { "theoreticalKg", "yieldPct", "stoichiometricFactor", "rmePct", "pmi", "completeEFactor", "simpleEFactor" })
            {
                Assert.True(step.GetProperty(figure).ValueKind == JsonValueKind.Null, figure);
            }
        }

        var digest = Run("digest", "--day", "2026-11-24", "--json");
        Assert.True(digest.Exit == 0, digest.Err);
        using var files = JsonDocument.Parse(digest.Out);
        var md = File.ReadAllText(files.RootElement.GetProperty("files").EnumerateArray().Select(f => f.GetString()!).Single(f => f.EndsWith(".md", StringComparison.Ordinal)));
        var section = md[md.IndexOf("### Batch BNA-2611-033 rev 1, recipe BNA-300", StringComparison.Ordinal)..];
        section = section[..section.IndexOf("\n## ", StringComparison.Ordinal)];
        Assert.Contains("Yield-based figures n/a: yield, theoretical, SF, RME, PMI and E-factors are not computable", section, StringComparison.Ordinal);
        Assert.DoesNotContain("yield loss", section, StringComparison.Ordinal); // no ladder built on the theoretical
        Assert.Contains("| BNA-2611-033 rev 1 | BNA-300 | n/a (step S1 has no limiting reactant", md, StringComparison.Ordinal);
        Assert.Contains("BNA-2611-033 n/a", md, StringComparison.Ordinal); // the yield history shows no number either
    }

    public void Dispose() => _sandbox.Dispose();
}
