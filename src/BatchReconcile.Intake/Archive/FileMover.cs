using System.Collections.Concurrent;
using System.Globalization;
using System.Text;

namespace BatchReconcile.Intake.Archive;

/// <summary>
/// Moves processed files out of the inbox, byte for byte and never over an existing file: to the
/// dated archive folder after their data is committed, or to quarantine with a report beside them.
/// A name clash gets a suffix: <c>name (2).csv</c>, <c>name (3).csv</c> ...
/// </summary>
/// <remarks>
/// Within one file system the move is a rename. Across file systems the file is copied to a hidden
/// temporary name in the destination, flushed to disk, renamed into place, and only then deleted
/// from the source: a crash in between leaves the file in the inbox (it is processed again and
/// recognised as a duplicate by its hash), never lost.
/// </remarks>
public sealed class FileMover
{
    private const int MaxSuffix = 100_000;
    private static readonly UTF8Encoding Utf8NoBom = new(encoderShouldEmitUTF8Identifier: false);

    private readonly TimeProvider _time;
    private readonly ConcurrentDictionary<(string From, string To), bool> _sameVolume = new();

    /// <summary>Creates a mover for one archive and one quarantine folder.</summary>
    public FileMover(ArchiveLayout archive, string quarantineRoot, TimeProvider time)
    {
        Archive = archive ?? throw new ArgumentNullException(nameof(archive));
        ArgumentException.ThrowIfNullOrWhiteSpace(quarantineRoot);
        QuarantineRoot = Path.GetFullPath(quarantineRoot);
        _time = time ?? throw new ArgumentNullException(nameof(time));
    }

    /// <summary>The archive layout.</summary>
    public ArchiveLayout Archive { get; }

    /// <summary>The quarantine folder (absolute).</summary>
    public string QuarantineRoot { get; }

    /// <summary>Moves a processed file to the archive folder of today's plant-local date.</summary>
    public MovedFile MoveToArchive(string sourcePath) =>
        MoveInto(Path.GetFullPath(sourcePath), Archive.DirectoryFor(_time.GetUtcNow()), forceCopy: false);

    /// <summary>Moves a file to the archive under another name (a hidden second name of the file, archived under the file's own).</summary>
    public MovedFile MoveToArchive(string sourcePath, string name) =>
        MoveInto(Path.GetFullPath(sourcePath), Archive.DirectoryFor(_time.GetUtcNow()), forceCopy: false, name);

    /// <summary>
    /// Writes bytes that were read from an inbox file into today's archive folder under the file's name (a free
    /// name as <see cref="MoveToArchive"/> takes): used when the inbox file changed after it was read, so that the
    /// archive holds what was stored while the new content stays in the inbox as a new arrival.
    /// </summary>
    public MovedFile WriteToArchive(string sourcePath, ReadOnlySpan<byte> content)
    {
        var source = Path.GetFullPath(sourcePath);
        var directory = Archive.DirectoryFor(_time.GetUtcNow());
        Directory.CreateDirectory(directory);
        var name = Path.GetFileName(source);
        for (var n = 1; n <= MaxSuffix; n++)
        {
            var destination = Path.Combine(directory, WithSuffix(name, n));
            if (File.Exists(destination))
            {
                continue;
            }

            var temp = TempNameBeside(destination);
            try
            {
                using (var output = new FileStream(temp, FileMode.CreateNew, FileAccess.Write, FileShare.None))
                {
                    output.Write(content);
                    output.Flush(flushToDisk: true);
                }

                File.Move(temp, destination, overwrite: false);
                return new MovedFile(source, destination, CopiedAcrossVolumes: true);
            }
            catch (IOException) when (File.Exists(destination))
            {
                TryDelete(temp);
            }
        }

        throw new IOException($"No free name for '{name}' in '{directory}' after {MaxSuffix} attempts.");
    }

    /// <summary>
    /// Settles a file whose content is already stored (a duplicate by SHA-256): when the archive already
    /// holds a file of the same name (or a numbered variant of it) with the same size and hash, the file
    /// is removed from the inbox and the archived copy is returned, so that re-delivering or linking an
    /// archived file back does not add <c>name (2).csv</c>. Otherwise (for instance after a crash between
    /// storing and archiving, when the inbox holds the only copy) it is archived as usual.
    /// </summary>
    /// <returns>The archived copy, and whether it was there already (the inbox file was removed).</returns>
    public (MovedFile File, bool AlreadyArchived) MoveDuplicate(string sourcePath, string sha256)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(sha256);
        var source = Path.GetFullPath(sourcePath);
        if (FindArchivedCopy(source, sha256) is { } copy)
        {
            File.Delete(source);
            return (new MovedFile(source, copy, CopiedAcrossVolumes: false), true);
        }

        return (MoveToArchive(source), false);
    }

    private string? FindArchivedCopy(string source, string sha256)
    {
        if (!Directory.Exists(Archive.Root))
        {
            return null;
        }

        var name = Path.GetFileName(source);
        var extension = Path.GetExtension(name);
        var stem = name[..^extension.Length];
        var length = new FileInfo(source).Length;
        var options = new EnumerationOptions { RecurseSubdirectories = true, MatchType = MatchType.Simple, IgnoreInaccessible = true, AttributesToSkip = FileAttributes.ReparsePoint };
        foreach (var candidate in Directory.EnumerateFiles(Archive.Root, stem + "*" + extension, options))
        {
            var candidateName = Path.GetFileName(candidate);
            if (!IsNameOrVariant(candidateName, stem, extension) || new FileInfo(candidate).Length != length)
            {
                continue;
            }

            if (string.Equals(FileHash.Sha256Of(candidate), sha256, StringComparison.OrdinalIgnoreCase))
            {
                return candidate;
            }
        }

        return null;
    }

    // "name.csv" or "name (N).csv", as WithSuffix makes them.
    private static bool IsNameOrVariant(string candidate, string stem, string extension)
    {
        if (!candidate.EndsWith(extension, StringComparison.Ordinal) || !candidate.StartsWith(stem, StringComparison.Ordinal))
        {
            return false;
        }

        var middle = candidate[stem.Length..^extension.Length];
        return middle.Length == 0
            || (middle.StartsWith(" (", StringComparison.Ordinal) && middle.EndsWith(')') && middle.Length > 3
                && middle[2..^1].All(char.IsAsciiDigit));
    }

    /// <summary>
    /// Removes what an interrupted run left behind: the hidden temporaries of
    /// <see cref="WriteAtomically"/> and of cross-volume copies (<c>.NAME.GUID.tmp</c>) in the quarantine and
    /// archive folders (and <paramref name="moreFolders"/>), and the hidden probe folders (<c>.intake-probe-GUID</c>) in those and in
    /// <paramref name="inbox"/>. Only entries untouched for <paramref name="minimumAge"/> are removed, so that
    /// a write in progress by another process is left alone. Call at start-up.
    /// </summary>
    /// <param name="moreFolders">Other folders written with <see cref="WriteAtomically"/> (the digests), searched like the archive.</param>
    /// <returns>The paths removed.</returns>
    public IReadOnlyList<string> RemoveStaleTemporaries(string? inbox, TimeSpan minimumAge, params string[] moreFolders)
    {
        var removed = new List<string>();
        var before = _time.GetUtcNow().UtcDateTime - minimumAge;
        var roots = new[] { QuarantineRoot, Archive.Root, inbox }.Concat(moreFolders).Where(r => r is not null && Directory.Exists(r)).Cast<string>().Distinct();
        foreach (var root in roots)
        {
            var recursive = !string.Equals(root, inbox, StringComparison.Ordinal);
            var options = new EnumerationOptions { RecurseSubdirectories = recursive, IgnoreInaccessible = true, AttributesToSkip = FileAttributes.ReparsePoint, MatchType = MatchType.Simple };
            foreach (var entry in Directory.EnumerateFileSystemEntries(root, ".*", options).ToList())
            {
                var name = Path.GetFileName(entry);
                try
                {
                    if (!recursive && !name.StartsWith(ProbePrefix, StringComparison.Ordinal))
                    {
                        continue; // in the inbox only the probe folders are ours; .part and .tmp files belong to the exporter
                    }

                    if (IsOurTemporary(name) && File.Exists(entry) && File.GetLastWriteTimeUtc(entry) <= before)
                    {
                        File.Delete(entry);
                        removed.Add(entry);
                    }
                    else if (IsOurProbe(name) && Directory.Exists(entry) && Directory.GetLastWriteTimeUtc(entry) <= before
                             && !Directory.EnumerateFileSystemEntries(entry).Any())
                    {
                        Directory.Delete(entry);
                        removed.Add(entry);
                    }
                }
                catch (IOException)
                {
                    // Gone meanwhile or in use: left for the next start.
                }
                catch (UnauthorizedAccessException)
                {
                    // As above.
                }
            }
        }

        return removed;
    }

    private const string ProbePrefix = ".intake-probe-";

    // ".NAME.<32 hex>.tmp", as TempNameBeside makes them.
    private static bool IsOurTemporary(string name) =>
        name.Length > 1 + 1 + 32 + 4 && name[0] == '.' && name.EndsWith(".tmp", StringComparison.Ordinal)
        && name[^37] == '.' && name[^36..^4].All(char.IsAsciiHexDigitLower);

    private static bool IsOurProbe(string name) =>
        name.StartsWith(ProbePrefix, StringComparison.Ordinal) && name.Length == ProbePrefix.Length + 32
        && name[ProbePrefix.Length..].All(char.IsAsciiHexDigitLower);

    /// <summary>
    /// Moves a rejected file to quarantine and writes <paramref name="reportText"/> (UTF-8) beside it as
    /// <c>NAME.report.txt</c>, where NAME is the file's name in quarantine.
    /// </summary>
    public QuarantinedFile MoveToQuarantine(string sourcePath, string reportText)
    {
        ArgumentNullException.ThrowIfNull(reportText);
        var source = Path.GetFullPath(sourcePath);
        Directory.CreateDirectory(QuarantineRoot);
        var copy = !IsSameVolume(source, QuarantineRoot);
        var name = Path.GetFileName(source);
        for (var n = 1; n <= MaxSuffix; n++)
        {
            var destination = Path.Combine(QuarantineRoot, WithSuffix(name, n));
            if (File.Exists(destination))
            {
                continue;
            }

            // Report first: a crash between the two leaves the file in the inbox, and the second attempt
            // takes the same free name and replaces the report, instead of a quarantined file without one.
            var reportPath = destination + ".report.txt";
            WriteAtomically(reportPath, reportText);
            if (TryMove(source, destination, copy))
            {
                return new QuarantinedFile(new MovedFile(source, destination, copy), reportPath);
            }
        }

        throw new IOException($"No free name for '{name}' in '{QuarantineRoot}' after {MaxSuffix} attempts.");
    }

    /// <summary>
    /// Writes a text file so that readers see either nothing or the whole text: a hidden temporary
    /// file in the same folder, flushed to disk, then renamed over the target.
    /// </summary>
    public static void WriteAtomically(string path, string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        var full = Path.GetFullPath(path);
        var temp = TempNameBeside(full);
        try
        {
            using (var stream = new FileStream(temp, FileMode.CreateNew, FileAccess.Write, FileShare.None))
            {
                var bytes = Utf8NoBom.GetBytes(text);
                stream.Write(bytes);
                stream.Flush(flushToDisk: true);
            }

            File.Move(temp, full, overwrite: true);
        }
        catch
        {
            TryDelete(temp);
            throw;
        }
    }

    /// <summary>Moves a file into a folder under a free name; <paramref name="forceCopy"/> exercises the cross-volume path in tests.</summary>
    internal MovedFile MoveInto(string source, string destinationDirectory, bool forceCopy, string? name = null)
    {
        Directory.CreateDirectory(destinationDirectory);
        var copy = forceCopy || !IsSameVolume(source, destinationDirectory);
        name ??= Path.GetFileName(source);
        for (var n = 1; n <= MaxSuffix; n++)
        {
            var destination = Path.Combine(destinationDirectory, WithSuffix(name, n));
            if (!File.Exists(destination) && TryMove(source, destination, copy))
            {
                return new MovedFile(source, destination, copy);
            }
        }

        throw new IOException($"No free name for '{name}' in '{destinationDirectory}' after {MaxSuffix} attempts.");
    }

    /// <summary><c>name.csv</c>, then <c>name (2).csv</c>, <c>name (3).csv</c> ...</summary>
    internal static string WithSuffix(string fileName, int n)
    {
        if (n == 1)
        {
            return fileName;
        }

        var extension = Path.GetExtension(fileName);
        var stem = fileName[..^extension.Length];
        return string.Create(CultureInfo.InvariantCulture, $"{stem} ({n}){extension}");
    }

    // False when the destination name was taken in the meantime; the caller tries the next suffix.
    private static bool TryMove(string source, string destination, bool copy)
    {
        try
        {
            if (copy)
            {
                CopyFlushDelete(source, destination);
            }
            else
            {
                // Without overwrite, .NET on Unix links the new name and unlinks the old one, so an
                // existing destination is never replaced, even by a racing writer.
                File.Move(source, destination, overwrite: false);
            }

            return true;
        }
        catch (IOException) when (File.Exists(destination) && File.Exists(source))
        {
            return false;
        }
    }

    private static void CopyFlushDelete(string source, string destination)
    {
        var temp = TempNameBeside(destination);
        try
        {
            using (var input = new FileStream(source, FileMode.Open, FileAccess.Read, FileShare.Read, 81920, FileOptions.SequentialScan))
            using (var output = new FileStream(temp, FileMode.CreateNew, FileAccess.Write, FileShare.None, 81920))
            {
                input.CopyTo(output);
                output.Flush(flushToDisk: true);
            }

            File.SetLastWriteTimeUtc(temp, File.GetLastWriteTimeUtc(source));
            // Same folder, so a rename; no overwrite keeps a file that took the name meanwhile.
            File.Move(temp, destination, overwrite: false);
        }
        catch
        {
            TryDelete(temp);
            throw;
        }

        File.Delete(source);
    }

    /// <summary>
    /// Whether a rename from the source's folder into <paramref name="destinationDirectory"/> stays on one
    /// file system. File.Move would silently fall back to copy-and-delete without flushing, so this asks
    /// once per pair of folders by renaming an empty hidden folder, which .NET refuses across volumes.
    /// Any failure answers "no": copying is always correct, only slower.
    /// </summary>
    private bool IsSameVolume(string sourceFile, string destinationDirectory)
    {
        var sourceDirectory = Path.GetDirectoryName(sourceFile) ?? throw new ArgumentException($"'{sourceFile}' has no folder.", nameof(sourceFile));
        return _sameVolume.GetOrAdd((sourceDirectory, destinationDirectory), static key =>
        {
            var probeName = ProbePrefix + Guid.NewGuid().ToString("N");
            var from = Path.Combine(key.From, probeName);
            var to = Path.Combine(key.To, probeName);
            try
            {
                Directory.CreateDirectory(from);
                Directory.Move(from, to);
                Directory.Delete(to);
                return true;
            }
            catch (IOException)
            {
                return false;
            }
            catch (UnauthorizedAccessException)
            {
                return false;
            }
            finally
            {
                try
                {
                    if (Directory.Exists(from))
                    {
                        Directory.Delete(from);
                    }
                }
                catch (IOException)
                {
                    // A leftover hidden probe folder is ignored by the inbox; not worth failing the move for.
                }
            }
        });
    }

    private static string TempNameBeside(string path) =>
        Path.Combine(Path.GetDirectoryName(path)!, "." + Path.GetFileName(path) + "." + Guid.NewGuid().ToString("N") + ".tmp");

    private static void TryDelete(string path)
    {
        try
        {
            File.Delete(path);
        }
        catch (IOException)
        {
            // Best effort: the original error matters more than a hidden temporary file left behind.
        }
        catch (UnauthorizedAccessException)
        {
            // As above.
        }
    }
}
