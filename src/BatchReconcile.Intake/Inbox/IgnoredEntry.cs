namespace BatchReconcile.Intake.Inbox;

/// <summary>What an inbox entry that is never read is.</summary>
public enum IgnoredKind
{
    /// <summary>A symbolic link: moving it would archive the link, not the data, so it is never read.</summary>
    SymbolicLink,

    /// <summary>A folder: the inbox is not searched below its top level.</summary>
    Folder,
}

/// <summary>An entry of the inbox with a readable name that is never read (a symbolic link or a folder).</summary>
public sealed record IgnoredEntry(string Name, IgnoredKind Kind)
{
    /// <summary>"symbolic link" or "folder", as messages say it.</summary>
    public string KindText => Kind == IgnoredKind.SymbolicLink ? "symbolic link" : "folder";
}
