using System.Diagnostics;

namespace BatchReconcile.Storage.Tests.Support;

/// <summary>
/// The sqlite3 command-line shell, as someone with access to the database file would use it to
/// change rows behind the program's back. CI installs it (Debian package sqlite3).
/// </summary>
internal static class Sqlite3Shell
{
    public static void Run(string databasePath, string sql)
    {
        var shell = Find() ?? throw new InvalidOperationException(
            "The sqlite3 command-line shell is not installed, and the audit tamper tests need it: install it (Debian: apt-get install -y sqlite3).");
        var start = new ProcessStartInfo(shell)
        {
            RedirectStandardInput = true,
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        start.ArgumentList.Add("-bail");
        start.ArgumentList.Add(databasePath);
        using var process = Process.Start(start) ?? throw new InvalidOperationException("sqlite3 did not start.");
        process.StandardInput.Write(sql);
        process.StandardInput.Close();
        var error = process.StandardError.ReadToEnd();
        process.StandardOutput.ReadToEnd();
        if (!process.WaitForExit(TimeSpan.FromSeconds(30)))
        {
            process.Kill();
            throw new TimeoutException("sqlite3 did not finish within 30 s.");
        }

        if (process.ExitCode != 0 || error.Length > 0)
        {
            throw new InvalidOperationException($"sqlite3 failed (exit {process.ExitCode}): {error}");
        }
    }

    private static string? Find() =>
        (Environment.GetEnvironmentVariable("PATH") ?? string.Empty)
            .Split(Path.PathSeparator, StringSplitOptions.RemoveEmptyEntries)
            .Select(folder => Path.Combine(folder, "sqlite3"))
            .FirstOrDefault(File.Exists);
}
