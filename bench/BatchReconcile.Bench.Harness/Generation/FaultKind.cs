namespace BatchReconcile.Bench.Harness.Generation;

/// <summary>What is wrong with a generated batch, on purpose.</summary>
internal enum FaultKind
{
    None,

    /// <summary>About a fifth of the last step's product ends in its mother liquor: yield-low, the balance still closes.</summary>
    LowYield,

    /// <summary>A waste stream of the last step is short by 8 % of the charged mass (spilt, never weighed): balance-gap.</summary>
    Gap,

    /// <summary>Exported with decimal commas: the file breaks the export contract and is quarantined.</summary>
    Malformed,
}
