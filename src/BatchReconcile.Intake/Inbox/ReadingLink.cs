using System.Runtime.InteropServices;

namespace BatchReconcile.Intake.Inbox;

/// <summary>
/// A second name (a hard link) for an inbox file while it is read, hidden in the inbox (a leading dot, so the watcher
/// never takes it): the bytes stay reachable under it even when the exporter replaces the file by a rename, so that
/// what is archived is what was hashed and parsed.
/// </summary>
/// <remarks>POSIX <c>link(2)</c>; where it is refused (another file system, no support) there is no link and the
/// caller reads the file under its own name.</remarks>
public static partial class ReadingLink
{
    /// <summary>The prefix of the hidden names; stale ones (a crash while reading) are removed at start.</summary>
    public const string Prefix = ".reading-";

    /// <summary>Makes the hidden name beside <paramref name="path"/>; null when the file system refuses.</summary>
    public static string? Create(string path)
    {
        var folder = Path.GetDirectoryName(Path.GetFullPath(path)) ?? throw new ArgumentException($"'{path}' has no folder.", nameof(path));
        var link = Path.Combine(folder, Prefix + Guid.NewGuid().ToString("N") + "-" + Path.GetFileName(path));
        return OperatingSystem.IsWindows() || Link(path, link) != 0 ? null : link;
    }

    /// <summary>Removes hidden names left by a process that stopped while reading.</summary>
    public static int RemoveStale(string inbox)
    {
        if (!Directory.Exists(inbox))
        {
            return 0;
        }

        var removed = 0;
        foreach (var stale in Directory.EnumerateFiles(inbox, Prefix + "*"))
        {
            try
            {
                File.Delete(stale);
                removed++;
            }
            catch (IOException)
            {
                // Gone already, or in use by another instance: left for the next start.
            }
        }

        return removed;
    }

    [LibraryImport("libc", EntryPoint = "link", SetLastError = true, StringMarshalling = StringMarshalling.Utf8)]
    private static partial int Link(string existing, string created);
}
