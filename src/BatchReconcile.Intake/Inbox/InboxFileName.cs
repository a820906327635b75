namespace BatchReconcile.Intake.Inbox;

/// <summary>Which names in the inbox may ever be read (the export contract's "Files" rules).</summary>
public static class InboxFileName
{
    /// <summary>
    /// True for a name the service may read once the file is complete. Names starting with '.'
    /// and names ending in <c>.part</c> or <c>.tmp</c> (any case) are an exporter's work in progress
    /// or someone's hidden file, and are never read.
    /// </summary>
    public static bool IsCandidate(string name)
    {
        ArgumentNullException.ThrowIfNull(name);
        if (name.Length == 0 || name.StartsWith('.'))
        {
            return false;
        }

        return !name.EndsWith(".part", StringComparison.OrdinalIgnoreCase)
            && !name.EndsWith(".tmp", StringComparison.OrdinalIgnoreCase);
    }
}
