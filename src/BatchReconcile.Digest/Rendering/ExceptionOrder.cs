using BatchReconcile.Digest.Model;
using BatchReconcile.Records.Definitions;

namespace BatchReconcile.Digest.Rendering;

/// <summary>The one order of the exception list in every output: severity (critical first), batch, step, flag code.</summary>
public static class ExceptionOrder
{
    public static IReadOnlyList<DigestException> Sort(IEnumerable<DigestException> exceptions) =>
        [.. exceptions
            .OrderBy(e => e.Severity)
            .ThenBy(e => e.BatchId, NaturalOrder.Instance)
            .ThenBy(e => e.Revision)
            .ThenBy(e => e.Step, NaturalOrder.Instance)
            .ThenBy(e => e.Code.ToText(), StringComparer.Ordinal)
            .ThenBy(e => e.Subject ?? string.Empty, StringComparer.Ordinal)
            .ThenBy(e => e.FlagId)];
}
