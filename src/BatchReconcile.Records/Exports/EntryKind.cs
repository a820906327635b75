namespace BatchReconcile.Records.Exports;

/// <summary>What a row of a batch-record export says (the <c>entry</c> column).</summary>
public enum EntryKind
{
    /// <summary>Mass put into the step.</summary>
    Charge,

    /// <summary>Isolated desired product.</summary>
    Product,

    /// <summary>An output stream sent to waste.</summary>
    Waste,

    /// <summary>Material recovered for reuse.</summary>
    Recovered,

    /// <summary>Mass withdrawn for QC.</summary>
    Sample,

    /// <summary>Composition of a named stream; adds no mass.</summary>
    Analysis,
}
