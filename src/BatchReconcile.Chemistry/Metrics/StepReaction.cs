namespace BatchReconcile.Chemistry.Metrics;

/// <summary>The balanced equation of one step, reduced to what the metrics need.</summary>
public sealed record StepReaction
{
    private StepReaction(IReadOnlyList<ReactionTerm> reactants, ReactionTerm product, IReadOnlyList<ReactionTerm> vented)
    {
        Reactants = reactants;
        Product = product;
        Vented = vented;
        ReactantMassPerExtent = reactants.Sum(r => r.MassPerExtent);
    }

    /// <summary>Reactants in equation order; the order breaks ties for the limiting reactant.</summary>
    public IReadOnlyList<ReactionTerm> Reactants { get; }

    /// <summary>The desired product P.</summary>
    public ReactionTerm Product { get; }

    /// <summary>Product-side species that leave the vessel as gas and are never weighed (CO2, isobutylene, N2 ...).</summary>
    /// <remarks>
    /// Only product-side gases can be estimated from the extent of reaction. A reactant fed in excess and
    /// purged (hydrogen) is a charge row; its unconsumed part is not estimated and shows as a balance gap.
    /// </remarks>
    public IReadOnlyList<ReactionTerm> Vented { get; }

    /// <summary>Σ ν_r·M_r in g/mol.</summary>
    public double ReactantMassPerExtent { get; }

    /// <summary>AE = 100·ν_P·M_P / Σ(ν_r·M_r) (Trost, Science 1991).</summary>
    public double AtomEconomyPct => 100 * Product.MassPerExtent / ReactantMassPerExtent;

    /// <exception cref="ArgumentException">No reactants, a code used twice, or the product or a vented gas also listed as a reactant.</exception>
    public static StepReaction Create(IEnumerable<ReactionTerm> reactants, ReactionTerm product, IEnumerable<ReactionTerm>? vented = null)
    {
        ArgumentNullException.ThrowIfNull(reactants);
        ArgumentNullException.ThrowIfNull(product);
        var reactantList = reactants.ToArray();
        var ventedList = (vented ?? []).ToArray();
        if (reactantList.Length == 0)
        {
            throw new ArgumentException("A step reaction needs at least one reactant.", nameof(reactants));
        }

        var seen = new HashSet<string>(StringComparer.Ordinal);
        foreach (var term in reactantList.Append(product).Concat(ventedList))
        {
            ArgumentNullException.ThrowIfNull(term);
            if (!seen.Add(term.Code))
            {
                throw new ArgumentException($"Species '{term.Code}' appears more than once in the step reaction.", nameof(reactants));
            }
        }

        return new StepReaction(reactantList, product, ventedList);
    }
}
