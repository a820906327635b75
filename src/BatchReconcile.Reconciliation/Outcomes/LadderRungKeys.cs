using BatchReconcile.Chemistry.Metrics;

namespace BatchReconcile.Reconciliation.Outcomes;

/// <summary>The stable keys and plain labels of the loss-ladder rungs, in ladder order.</summary>
/// <remarks>The keys are stored and compared across releases; labels may be reworded, keys may not.</remarks>
public static class LadderRungKeys
{
    public const string AuxiliariesNotRecovered = "auxiliaries-not-recovered";
    public const string Recovered = "recovered";
    public const string ExcessReactants = "excess-reactants";
    public const string CoProducts = "co-products";
    public const string ProductInWaste = "yield-loss-product-in-waste";
    public const string ProductInSamples = "yield-loss-product-in-samples";
    public const string UnexplainedYieldLoss = "yield-loss-unexplained";

    /// <summary>Every key in ladder order.</summary>
    public static IReadOnlyList<string> All { get; } =
    [
        AuxiliariesNotRecovered, Recovered, ExcessReactants, CoProducts, ProductInWaste, ProductInSamples, UnexplainedYieldLoss,
    ];

    internal static (string Key, string Label) Of(LossRungKind kind) => kind switch
    {
        LossRungKind.AuxiliariesNotRecovered => (AuxiliariesNotRecovered, "solvents, catalysts and work-up not recovered"),
        LossRungKind.Recovered => (Recovered, "recovered for reuse"),
        LossRungKind.ExcessReactants => (ExcessReactants, "reactants charged in excess"),
        LossRungKind.CoProducts => (CoProducts, "co-products of the equation (atom-economy loss)"),
        LossRungKind.ProductInWaste => (ProductInWaste, "yield loss: product found in waste streams"),
        LossRungKind.ProductInSamples => (ProductInSamples, "yield loss: product taken as samples"),
        LossRungKind.UnexplainedYieldLoss => (UnexplainedYieldLoss, "yield loss: not accounted for"),
        _ => throw new ArgumentOutOfRangeException(nameof(kind), kind, null),
    };
}
