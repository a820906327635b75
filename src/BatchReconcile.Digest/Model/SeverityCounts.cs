namespace BatchReconcile.Digest.Model;

/// <summary>How many flags of each severity.</summary>
public sealed record SeverityCounts(int Critical, int Major, int Minor)
{
    public int Total => Critical + Major + Minor;
}
