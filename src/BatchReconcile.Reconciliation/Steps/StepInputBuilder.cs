using BatchReconcile.Chemistry.Metrics;
using BatchReconcile.Reconciliation.Settings;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Records.Exports;

namespace BatchReconcile.Reconciliation.Steps;

/// <summary>Turns the rows of one step of a batch record into the inputs of <see cref="StepMetrics"/>.</summary>
/// <remarks>
/// <para>Rows reach this point validated against the process definitions (known materials, finite masses,
/// assays in (0, 100], analysis rows naming an existing stream). A row that breaks that is a bug upstream and throws.</para>
/// <para>How product content of output rows is read, most specific first:</para>
/// <list type="bullet">
/// <item>product row of the step's product: m·a/100, a defaulting to 100 (the contract's default). A product row
/// naming another material is an isolated side stream: it counts in the gross balance, not in m_act.</item>
/// <item>waste row: its own assay when it names the product; else the step's analysis rows for its stream;
/// else none. A waste row naming the product without an assay says nothing about how much product it holds
/// (the contract gives waste no default assay), so it contributes none.</item>
/// <item>sample row: its own assay when it names the product; else the analysis of its stream; else, when it
/// names the product without an assay, all of it (a QC sample drawn from the product, as-is, like a product
/// row's default); else none.</item>
/// <item>recovered rows carry no product content; analysis rows on their streams are not used.</item>
/// </list>
/// <para>Several analysis rows of the product for one stream are replicate determinations: their mean is used
/// (common practice for replicate results).</para>
/// </remarks>
internal static class StepInputBuilder
{
    public static StepInput Build(
        RecipeStep step,
        IReadOnlyList<RecordRow> rows,
        MaterialLookup materials,
        ReconciliationSettings settings)
    {
        var reaction = BuildReaction(step, materials);
        string product = reaction.Product.Code;

        var streamShares = rows
            .Where(r => r.Entry == EntryKind.Analysis && r.Stream is not null && materials.Is(r.Material, product))
            .GroupBy(r => StreamKey(r.Stream!), StringComparer.Ordinal)
            .ToDictionary(
                g => g.Key,
                g => g.Average(r => r.AssayPct ?? throw Bug(step, r, "an analysis row without assay_pct")),
                StringComparer.Ordinal);

        double? StreamShare(RecordRow row) =>
            row.Stream is not null && streamShares.TryGetValue(StreamKey(row.Stream), out var pct) ? pct : null;

        var charges = new List<ChargeRow>();
        var outputs = new List<OutputRow>();
        foreach (var row in rows)
        {
            if (row.Entry == EntryKind.Analysis)
            {
                continue;
            }

            double kg = row.QuantityKg ?? throw Bug(step, row, "a weighed row without a quantity");
            bool namesProduct = materials.Is(row.Material, product);
            switch (row.Entry)
            {
                case EntryKind.Charge:
                    var material = materials.Get(row.Material ?? throw Bug(step, row, "a charge row without a material"));
                    charges.Add(material.IsSolution
                        ? ChargeRow.Solution(material.Code, kg, SolutionContents(material, kg, row.AssayPct, materials))
                        : ChargeRow.Create(material.Code, kg, row.AssayPct ?? 100, RoleOf(material)));
                    break;
                case EntryKind.Product:
                    outputs.Add(namesProduct ? OutputRow.Product(kg, row.AssayPct ?? 100) : OutputRow.Waste(kg));
                    break;
                case EntryKind.Waste:
                    double? wastePct = namesProduct && row.AssayPct is { } own ? own : StreamShare(row);
                    outputs.Add(OutputRow.Waste(kg, ContentOf(kg, wastePct)));
                    break;
                case EntryKind.Sample:
                    double? samplePct = namesProduct && row.AssayPct is { } ownSample ? ownSample
                        : StreamShare(row) ?? (namesProduct ? 100 : null);
                    outputs.Add(OutputRow.Sample(kg, ContentOf(kg, samplePct)));
                    break;
                case EntryKind.Recovered:
                    var recovered = materials.Get(row.Material ?? throw Bug(step, row, "a recovered row without a material"));
                    outputs.Add(OutputRow.Recovered(kg, RoleOf(recovered), recovered.Code));
                    break;
                default:
                    throw Bug(step, row, $"an entry kind the engine does not know ({row.Entry})");
            }
        }

        var balance = BalanceCheckSettings.Create(
            step.BalanceTolerancePct,
            settings.BalanceRelativeUncertainty,
            settings.BalanceAbsoluteUncertaintyKg,
            settings.CoverageFactor);
        return StepInput.Create(reaction, charges, outputs, balance, ReagentMolarMasses(step, reaction, charges, materials));
    }

    /// <summary>The balanced reaction in catalog codes; vented species are the product-side materials marked vented.</summary>
    public static StepReaction BuildReaction(RecipeStep step, MaterialLookup materials)
    {
        string product = materials.Get(step.ProductCode).Code;
        ReactionTerm Term(ReactionSpecies s)
        {
            var m = materials.Get(s.MaterialCode);
            return ReactionTerm.Create(m.Code, s.Coefficient, MaterialLookup.MolarMass(m));
        }

        var productSpecies = step.Reaction.Products.FirstOrDefault(p => materials.Is(p.MaterialCode, product))
            ?? throw new InvalidOperationException($"Step {step.Code}: product {step.ProductCode} is not on the product side of '{step.Reaction.Balanced}'; the definitions loader should have refused it.");
        var vented = step.Reaction.Products
            .Where(p => !materials.Is(p.MaterialCode, product) && materials.Get(p.MaterialCode).Vented)
            .Select(Term);
        return StepReaction.Create(step.Reaction.Reactants.Select(Term), Term(productSpecies), vented);
    }

    /// <summary>
    /// Materials outside the equation whose equivalents are reported: every charged one except solvents and
    /// water (their "equivalents" mean nothing to a reviewer), plus every one the step gives a range for.
    /// </summary>
    private static Dictionary<string, double> ReagentMolarMasses(
        RecipeStep step, StepReaction reaction, List<ChargeRow> charges, MaterialLookup materials)
    {
        var inEquation = reaction.Reactants.Select(r => r.Code).Append(reaction.Product.Code).ToHashSet(StringComparer.Ordinal);
        var wanted = charges
            .SelectMany(c => c.Contents)
            .Where(c => c.Role == AuxiliaryRole.Other)
            .Select(c => c.Material)
            .Concat(step.Equivalents.Keys.Select(k => materials.Get(k).Code))
            .Where(code => !inEquation.Contains(code))
            .Distinct(StringComparer.Ordinal);
        return wanted.ToDictionary(code => code, code => MaterialLookup.MolarMass(materials.Get(code)), StringComparer.Ordinal);
    }

    /// <summary>
    /// What a charge of <paramref name="kg"/> of a solution supplies, component by component (docs/computation.md,
    /// "Solutions"). Without an assay, each component at its nominal share. With one, the assay is the measured mass %
    /// of the main (first) component, and the other components share the rest in their nominal proportions:
    /// w_i = (100 − a)·f_i/(100 − f_main). 36 % hydrochloric acid assayed at 35.0 %: HCl 35.0 %, water 65.0 %.
    /// </summary>
    internal static IEnumerable<ChargeContent> SolutionContents(Material solution, double kg, double? assayPct, MaterialLookup materials)
    {
        double nominalRest = solution.Composition.Skip(1).Sum(c => c.MassPct);
        for (var i = 0; i < solution.Composition.Count; i++)
        {
            var component = solution.Composition[i];
            double pct = assayPct switch
            {
                null => component.MassPct,
                { } a when i == 0 => a,
                { } a => (100 - a) * component.MassPct / nominalRest,
            };
            var material = materials.Get(component.MaterialCode);
            yield return new ChargeContent(material.Code, ContentOf(kg, pct), RoleOf(material));
        }

    }

    private static AuxiliaryRole RoleOf(Material material) => material.Role switch
    {
        MaterialRole.Solvent => AuxiliaryRole.Solvent,
        MaterialRole.Water => AuxiliaryRole.Water,
        _ => AuxiliaryRole.Other,
    };

    // Stream labels are free text typed by operators; case and surrounding blanks do not make another stream.
    private static string StreamKey(string stream) => stream.Trim().ToUpperInvariant();

    private static InvalidOperationException Bug(RecipeStep step, RecordRow row, string what) =>
        new($"Step {step.Code}, line {row.Line}: {what} reached the reconciler; the export reader should have refused it.");

    /// <summary>
    /// The mass of product in a row of <paramref name="kg"/> at <paramref name="pct"/> %; none when no share is known.
    /// </summary>
    /// <remarks>At 100 % the row's own mass, exactly: kg · 100 / 100 can come out one unit in the last place above kg
    /// (0.208 gives 0.20800000000000002), which would make the content exceed the gross mass.</remarks>
    internal static double ContentOf(double kg, double? pct) => pct switch
    {
        null => 0,
        >= 100 => kg,
        { } share => kg * share / 100,
    };
}
