namespace BatchReconcile.Cli;

/// <summary>
/// Who is acting. Names are free text here (there is no login); the audit trail records them as given.
/// A site that needs proven identities would put an identity provider in front of this one seam.
/// </summary>
public static class Reviewer
{
    public static string Name(string? given) =>
        string.IsNullOrWhiteSpace(given) ? Environment.UserName : given.Trim();
}
