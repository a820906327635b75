using BatchReconcile.Records.Definitions;

namespace BatchReconcile.Digest.Model;

/// <summary>One flag of the digest's day, as the exception list shows it.</summary>
/// <param name="Measured">The value that broke the limit, in <paramref name="Unit"/>; null when the flag has none (a missing step).</param>
/// <param name="Limit">The limit it broke, in <paramref name="Unit"/>.</param>
/// <param name="Unit">"%", "kg", "equiv" or empty.</param>
/// <param name="Message">The flag's plain sentence.</param>
/// <param name="Subject">What within the step the flag is about (a reagent, a reactant); null for the step itself.</param>
public sealed record DigestException(
    long FlagId,
    FlagSeverity Severity,
    string BatchId,
    int Revision,
    string Recipe,
    string Step,
    FlagCode Code,
    double? Measured,
    double? Limit,
    string Unit,
    string Message,
    ReviewStatus Review,
    string? Subject = null)
{
    public int Revision { get; } = Revision >= 1
        ? Revision
        : throw new ArgumentOutOfRangeException(nameof(Revision), Revision, "Revisions count from 1.");
}
