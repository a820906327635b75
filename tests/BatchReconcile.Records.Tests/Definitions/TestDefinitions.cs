namespace BatchReconcile.Records.Tests.Definitions;

/// <summary>Definition files used by several tests; each test changes one thing in a valid file.</summary>
internal static class TestDefinitions
{
    // Benzocaine in two steps: Fischer esterification of 4-nitrobenzoic acid, then hydrogenation of
    // the nitro group. Molecular formulas from memory (as listed in PubChem); stoichiometry
    // NBA + EtOH -> ester + H2O and ArNO2 + 3 H2 -> ArNH2 + 2 H2O is common practice.
    // S1 is written without coefficients on purpose (the loader balances it and notes so).
    public const string Benzocaine = """
        {
          "materials": [
            { "code": "NBA",   "name": "4-nitrobenzoic acid",   "formula": "C7H5NO4" },
            { "code": "ETOH",  "name": "ethanol",               "formula": "C2H6O", "role": "solvent" },
            { "code": "ENB",   "name": "ethyl 4-nitrobenzoate", "formula": "C9H9NO4" },
            { "code": "WATER", "name": "water",                 "formula": "H2O", "role": "water" },
            { "code": "H2",    "name": "hydrogen",              "formula": "H2" },
            { "code": "BZC",   "name": "benzocaine",            "formula": "C9H11NO2" }
          ],
          "recipes": [
            {
              "code": "BZC-900", "version": 1, "name": "benzocaine, test route",
              "steps": [
                {
                  "code": "S1", "name": "esterification",
                  "reaction": "NBA + ETOH -> ENB + WATER",
                  "product": "ENB",
                  "yieldPct": { "min": 85, "max": 96 },
                  "balanceTolerancePct": 2.0,
                  "equivalents": { "ETOH": { "min": 8.0, "max": 14.0 } }
                },
                {
                  "code": "S2", "name": "nitro reduction",
                  "reaction": "ENB + 3 H2 -> BZC + 2 WATER",
                  "product": "BZC",
                  "yieldPct": { "min": 88, "max": 98 },
                  "balanceTolerancePct": 1.5,
                  "equivalents": { "H2": { "min": 3.0, "max": 3.6 } }
                }
              ]
            }
          ]
        }
        """;

    /// <summary>Replaces exactly one occurrence, so a test cannot silently run on the unchanged file.</summary>
    public static string Change(this string json, string from, string to)
    {
        var first = json.IndexOf(from, StringComparison.Ordinal);
        if (first < 0 || json.IndexOf(from, first + 1, StringComparison.Ordinal) >= 0)
        {
            throw new ArgumentException($"'{from}' must occur exactly once in the test file.", nameof(from));
        }

        return string.Concat(json.AsSpan(0, first), to, json.AsSpan(first + from.Length));
    }

    /// <summary>A one-recipe, one-step file over the given materials (JSON array items).</summary>
    public static string OneStep(string materials, string reaction, string product, string extra = "") => $$"""
        {
          "materials": [
            {{materials}}
          ],
          "recipes": [
            {
              "code": "T-1", "version": 1, "name": "test recipe",
              "steps": [
                {
                  "code": "S1", "name": "the step",
                  "reaction": "{{reaction}}",
                  "product": "{{product}}",
                  "yieldPct": { "min": 80, "max": 99 },
                  "balanceTolerancePct": 2.0{{extra}}
                }
              ]
            }
          ]
        }
        """;
}
