namespace BatchReconcile.Chemistry.Metrics;

/// <summary>The kinds of weighed output rows of a step.</summary>
public enum OutputKind
{
    /// <summary>Isolated desired product.</summary>
    Product,

    /// <summary>A stream sent to waste (mother liquor, aqueous layer, residue).</summary>
    Waste,

    /// <summary>Material recovered for reuse.</summary>
    Recovered,

    /// <summary>Mass withdrawn for QC.</summary>
    Sample,
}
