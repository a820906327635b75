namespace BatchReconcile.Chemistry.Metrics;

/// <summary>Where the charged mass went: rungs from m_in down to m_act.</summary>
/// <remarks>Σ rungs + m_act = m_in up to floating-point rounding; rungs are signed and never clipped.</remarks>
public sealed record LossLadder
{
    internal LossLadder(double inputKg, double actualProductKg, IReadOnlyList<LossRung> rungs)
    {
        InputKg = inputKg;
        ActualProductKg = actualProductKg;
        Rungs = rungs;
    }

    /// <summary>m_in in kg.</summary>
    public double InputKg { get; }

    /// <summary>m_act in kg, the foot of the ladder.</summary>
    public double ActualProductKg { get; }

    /// <summary>The rungs in <see cref="LossRungKind"/> order, one of each kind.</summary>
    public IReadOnlyList<LossRung> Rungs { get; }

    /// <summary>m_theo − m_act in kg: the three yield-loss rungs together; negative above 100 % yield.</summary>
    public double YieldLossKg => this[LossRungKind.ProductInWaste].Kg
        + this[LossRungKind.ProductInSamples].Kg
        + this[LossRungKind.UnexplainedYieldLoss].Kg;

    public LossRung this[LossRungKind kind] => Rungs.Single(r => r.Kind == kind);

    /// <summary>The same ladder with the per-material parts of the two rungs tied to materials.</summary>
    internal LossLadder WithParts(IReadOnlyList<LadderPart> auxiliariesNotRecovered, IReadOnlyList<LadderPart> excessReactants) =>
        new(InputKg, ActualProductKg, Rungs
            .Select(r => r.Kind switch
            {
                LossRungKind.AuxiliariesNotRecovered => r with { Parts = auxiliariesNotRecovered },
                LossRungKind.ExcessReactants => r with { Parts = excessReactants },
                _ => r,
            })
            .ToArray());

    internal static LossLadder Build(
        double inputKg,
        double auxiliaryKg,
        double recoveredKg,
        double reactantKg,
        double stoichiometricKg,
        double theoreticalKg,
        double actualKg,
        double productInWasteKg,
        double productInSamplesKg)
    {
        LossRung Rung(LossRungKind kind, double kg) => new(kind, kg, SafeRatio.Of(100 * kg, inputKg));

        double yieldLoss = theoreticalKg - actualKg;
        LossRung[] rungs =
        [
            Rung(LossRungKind.AuxiliariesNotRecovered, auxiliaryKg - recoveredKg),
            Rung(LossRungKind.Recovered, recoveredKg),
            Rung(LossRungKind.ExcessReactants, reactantKg - stoichiometricKg),
            Rung(LossRungKind.CoProducts, stoichiometricKg - theoreticalKg),
            Rung(LossRungKind.ProductInWaste, productInWasteKg),
            Rung(LossRungKind.ProductInSamples, productInSamplesKg),
            Rung(LossRungKind.UnexplainedYieldLoss, yieldLoss - productInWasteKg - productInSamplesKg),
        ];
        return new LossLadder(inputKg, actualKg, rungs);
    }
}
