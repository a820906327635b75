using System.Text;

namespace BatchReconcile.Intake;

/// <summary>Turns text taken from data (a batch id, a recipe code) into one safe file-name component.</summary>
public static class SafeFileName
{
    /// <summary>Longest result in UTF-8 bytes, well below the usual 255-byte limit so suffixes still fit.</summary>
    public const int MaxBytes = 120;

    private static readonly HashSet<char> Forbidden =
        [.. Path.GetInvalidFileNameChars(), '/', '\\', ':', '*', '?', '"', '<', '>', '|'];

    private static readonly HashSet<string> WindowsDeviceNames = new(StringComparer.OrdinalIgnoreCase)
    {
        "CON", "PRN", "AUX", "NUL",
        "COM1", "COM2", "COM3", "COM4", "COM5", "COM6", "COM7", "COM8", "COM9",
        "LPT1", "LPT2", "LPT3", "LPT4", "LPT5", "LPT6", "LPT7", "LPT8", "LPT9",
    };

    /// <summary>
    /// Replaces path separators, characters Windows refuses and control characters with '_', turns any
    /// run of dots into one (so no "..") and a leading dot into '_' (no hidden files), trims spaces and
    /// trailing dots, and shortens to <see cref="MaxBytes"/>. Never returns an empty name.
    /// </summary>
    public static string From(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        var builder = new StringBuilder(text.Length);
        foreach (var rune in text.Trim().EnumerateRunes())
        {
            var isDot = rune.Value == '.';
            if (isDot && builder.Length > 0 && builder[^1] == '.')
            {
                continue;
            }

            var replace = Rune.IsControl(rune) || (rune.IsBmp && Forbidden.Contains((char)rune.Value));
            if (isDot && builder.Length == 0)
            {
                replace = true;
            }

            if (replace)
            {
                builder.Append('_');
            }
            else
            {
                builder.Append(rune.ToString());
            }
        }

        var name = Shorten(builder.ToString().TrimEnd(' ', '.'));
        if (name.Length == 0)
        {
            return "_";
        }

        var stem = name.Split('.')[0];
        return WindowsDeviceNames.Contains(stem) ? "_" + name : name;
    }

    private static string Shorten(string name)
    {
        if (Encoding.UTF8.GetByteCount(name) <= MaxBytes)
        {
            return name;
        }

        var builder = new StringBuilder();
        var bytes = 0;
        foreach (var rune in name.EnumerateRunes())
        {
            bytes += rune.Utf8SequenceLength;
            if (bytes > MaxBytes)
            {
                break;
            }

            builder.Append(rune.ToString());
        }

        return builder.ToString().TrimEnd(' ', '.');
    }
}
