namespace BatchReconcile.Storage.Audit;

/// <summary>A live table value that is not what the audit trail implies (found by <c>audit verify</c>).</summary>
/// <param name="Subject">What differs: <c>flag:17</c> or <c>batch:AP-2611-014</c>.</param>
/// <param name="Field">The column as people know it: state, outcome, deviation reference, reviewer, current revision ...</param>
/// <param name="Live">The value in the live table (null: none).</param>
/// <param name="Trail">The value the trail implies (null: none).</param>
/// <param name="EntryId">The audit entry that implies it; null when no entry does (the value must then be the stored default).</param>
public sealed record LiveStateDifference(string Subject, string Field, string? Live, string? Trail, long? EntryId)
{
    public string Message
    {
        get
        {
            var trail = EntryId is { } id
                ? $"the trail (entry {id.ToString(System.Globalization.CultureInfo.InvariantCulture)}) says {Show(Trail)}"
                : $"the trail implies {Show(Trail)}";
            return $"{Subject.Replace(":", " ", StringComparison.Ordinal)}: {Field} is {Show(Live)} in the live tables but {trail}";
        }
    }

    private static string Show(string? value) => value is null ? "none" : $"'{value}'";
}
