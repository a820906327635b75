using System.Text.Json;
using BatchReconcile.Cli.Tests.Support;

namespace BatchReconcile.Cli.Tests.Chem;

/// <summary>The <c>chem</c> commands, run as the real program, against docs/cli.md.</summary>
public class ChemCommandTests
{
    [Fact]
    public async Task Mass_json_is_the_documented_document_for_copper_sulfate_pentahydrate()
    {
        // 249.68 g/mol: CRC Handbook of Chemistry and Physics (97th ed.), "Physical Constants of
        // Inorganic Compounds", copper(II) sulfate pentahydrate 249.685; the interface spec example.
        var result = await ProgramRunner.RunAsync("chem", "mass", "CuSO4·5H2O", "--json");

        Assert.Equal(0, result.ExitCode);
        using var doc = JsonDocument.Parse(result.Stdout);
        var root = doc.RootElement;
        Assert.Equal("CuSO4·5H2O", root.GetProperty("formula").GetString());
        Assert.Equal("CuH10O9S", root.GetProperty("hill").GetString());
        Assert.Equal(249.68, root.GetProperty("molarMass").GetDouble());
        Assert.Equal(0, root.GetProperty("charge").GetInt32());
        var elements = root.GetProperty("elements").EnumerateObject().Select(p => (p.Name, p.Value.GetInt32())).ToArray();
        Assert.Equal(new[] { ("Cu", 1), ("H", 10), ("O", 9), ("S", 1) }, elements);
        Assert.Equal(
            new[] { "formula", "hill", "molarMass", "elements", "charge" },
            root.EnumerateObject().Select(p => p.Name).ToArray());
    }

    [Theory]
    // Charges written with a caret after the formula (docs/process-definitions.md).
    [InlineData("SO4^2-", -2, "O4S^2-")]
    [InlineData("Fe^3+", 3, "Fe^3+")]
    [InlineData("NH4^+", 1, "H4N^+")]
    public async Task Mass_json_reports_the_charge_of_an_ion(string formula, int charge, string hill)
    {
        var result = await ProgramRunner.RunAsync("chem", "mass", formula, "--json");

        Assert.Equal(0, result.ExitCode);
        using var doc = JsonDocument.Parse(result.Stdout);
        Assert.Equal(charge, doc.RootElement.GetProperty("charge").GetInt32());
        Assert.Equal(hill, doc.RootElement.GetProperty("hill").GetString());
    }

    [Fact]
    public async Task Mass_text_gives_the_molar_mass_and_the_composition()
    {
        // Caffeine C8H10N4O2, 194.19 g/mol: NIST Chemistry WebBook (CAS 58-08-2), 194.1906.
        var result = await ProgramRunner.RunAsync("chem", "mass", "C8H10N4O2");

        Assert.Equal(0, result.ExitCode);
        Assert.Contains("194.19 g/mol", result.Stdout);
        Assert.Contains("C8H10N4O2", result.Stdout);
        Assert.Equal(string.Empty, result.Stderr);
    }

    [Theory]
    [InlineData("CuSO4·5Xq2", "unknown element 'Xq' at")]
    [InlineData("Ca3(PO4", "'(' at 4 is never closed")]
    public async Task Mass_of_a_bad_formula_exits_2_with_one_line_naming_the_position(string formula, string expected)
    {
        var result = await ProgramRunner.RunAsync("chem", "mass", formula, "--json");

        Assert.Equal(2, result.ExitCode);
        Assert.Equal(string.Empty, result.Stdout);
        Assert.Contains(expected, result.Stderr);
        Assert.Single(result.Stderr.TrimEnd().Split('\n'));
    }

    [Fact]
    public async Task Balance_json_gives_the_smallest_whole_numbers_in_the_order_written()
    {
        // Permanganate oxidation of hydrochloric acid: 2, 16, 2, 2, 5, 8 (interface spec example;
        // the same in e.g. Atkins & Jones, Chemical Principles, redox chapter — from memory).
        var result = await ProgramRunner.RunAsync("chem", "balance", "KMnO4 + HCl -> KCl + MnCl2 + Cl2 + H2O", "--json");

        Assert.Equal(0, result.ExitCode);
        using var doc = JsonDocument.Parse(result.Stdout);
        Assert.Equal("2 KMnO4 + 16 HCl -> 2 KCl + 2 MnCl2 + 5 Cl2 + 8 H2O", doc.RootElement.GetProperty("equation").GetString());
        Assert.Equal(new[] { 2, 16, 2, 2, 5, 8 }, doc.RootElement.GetProperty("coefficients").EnumerateArray().Select(e => e.GetInt32()).ToArray());
    }

    [Fact]
    public async Task Balance_text_prints_the_balanced_equation()
    {
        // Permanganate and iron(II) in acid: MnO4^- + 5 Fe^2+ + 8 H^+ -> Mn^2+ + 5 Fe^3+ + 4 H2O
        // (Harris, Quantitative Chemical Analysis, permanganate titrations — from memory).
        var result = await ProgramRunner.RunAsync("chem", "balance", "MnO4^- + Fe^2+ + H^+ -> Mn^2+ + Fe^3+ + H2O");

        Assert.Equal(0, result.ExitCode);
        Assert.Contains("MnO4^- + 5 Fe^2+ + 8 H^+ -> Mn^2+ + 5 Fe^3+ + 4 H2O", result.Stdout);
    }

    [Theory]
    [InlineData("H2 -> O2", "no solution")]
    // Carbon burning to both oxides: two independent reactions (common practice).
    [InlineData("C + O2 -> CO + CO2", "2 independent reactions")]
    public async Task Balance_that_cannot_be_done_exits_2_saying_which(string equation, string expected)
    {
        var result = await ProgramRunner.RunAsync("chem", "balance", equation, "--json");

        Assert.Equal(2, result.ExitCode);
        Assert.Equal(string.Empty, result.Stdout);
        Assert.Contains(expected, result.Stderr);
    }

    [Fact]
    public async Task Economy_json_matches_the_published_atom_economy_of_the_three_step_ibuprofen_route()
    {
        // Ibuprofen, BHC (three-step) route, overall: isobutylbenzene + acetic anhydride + H2 + CO
        // -> ibuprofen + acetic acid; atom economy 77.4 % (Cann & Connelly, Real-World Cases in
        // Green Chemistry, ACS 2000); the interface spec gives 77.45 with these atomic weights.
        var result = await ProgramRunner.RunAsync(
            "chem", "economy", "C10H14 + C4H6O3 + H2 + CO -> C13H18O2 + C2H4O2", "--product", "C13H18O2", "--json");

        Assert.Equal(0, result.ExitCode);
        using var doc = JsonDocument.Parse(result.Stdout);
        var root = doc.RootElement;
        Assert.Equal(77.45, root.GetProperty("atomEconomyPct").GetDouble());
        Assert.Equal(206.28, root.GetProperty("productMolarMass").GetDouble());
        Assert.Equal(266.34, root.GetProperty("reactantMolarMassSum").GetDouble());
        Assert.Equal("C10H14 + C4H6O3 + H2 + CO -> C13H18O2 + C2H4O2", root.GetProperty("equation").GetString());
    }

    [Fact]
    public async Task Economy_balances_an_equation_written_without_coefficients()
    {
        // Ethylene oxide by direct oxidation, 2 C2H4 + O2 -> 2 C2H4O: an addition, so 100 %
        // atom economy (common practice).
        var result = await ProgramRunner.RunAsync("chem", "economy", "C2H4 + O2 -> C2H4O", "--product", "C2H4O", "--json");

        Assert.Equal(0, result.ExitCode);
        using var doc = JsonDocument.Parse(result.Stdout);
        Assert.Equal(100.0, doc.RootElement.GetProperty("atomEconomyPct").GetDouble());
        Assert.Equal("2 C2H4 + O2 -> 2 C2H4O", doc.RootElement.GetProperty("equation").GetString());
    }

    [Fact]
    public async Task Economy_of_a_species_that_is_not_a_product_exits_2()
    {
        var result = await ProgramRunner.RunAsync("chem", "economy", "C2H4 + O2 -> C2H4O", "--product", "CO2");

        Assert.Equal(2, result.ExitCode);
        Assert.Contains("CO2", result.Stderr);
    }

    [Theory]
    [InlineData("chem", "weigh", "H2O")]
    [InlineData("chem", "mass")]
    [InlineData("chem", "economy", "C2H4 + O2 -> C2H4O")]
    public async Task Usage_errors_exit_2_with_one_line(params string[] args)
    {
        var result = await ProgramRunner.RunAsync(args);

        Assert.Equal(2, result.ExitCode);
        Assert.Single(result.Stderr.TrimEnd().Split('\n'));
    }
}
