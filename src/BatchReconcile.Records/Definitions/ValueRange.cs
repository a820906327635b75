namespace BatchReconcile.Records.Definitions;

/// <summary>An inclusive range of allowed values, e.g. a yield of 88 to 98 %.</summary>
public sealed record ValueRange(double Min, double Max)
{
    public bool Contains(double value) => value >= Min && value <= Max;
}
