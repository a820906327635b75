namespace BatchReconcile.Records.Definitions;

/// <summary>How urgent a flag is, most urgent first.</summary>
public enum FlagSeverity
{
    Critical,
    Major,
    Minor,
}
