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
            var probeName = ".intake-probe-" + Guid.NewGuid().ToString("N");
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
